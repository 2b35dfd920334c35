// Every query shows a loading state and an error state: this is the one way to do it.
import type { UseQueryResult } from '@tanstack/react-query';
import type { ReactNode } from 'react';
import { ErrorView } from './error-view.tsx';
import { PanelError } from './error-boundary.tsx';
import { Loading } from './spinner.tsx';

export function QueryState<T>({
  query,
  children,
  label,
  inline = false,
}: {
  query: UseQueryResult<T>;
  children: (data: T) => ReactNode;
  label?: string;
  /** true: a panel-sized error; false: a page-sized one with the status map. */
  inline?: boolean;
}) {
  if (query.isPending) return <Loading label={label} />;
  if (query.isError) {
    return inline ? (
      <PanelError title={label ?? 'This part'} error={query.error} onRetry={() => void query.refetch()} />
    ) : (
      <ErrorView error={query.error} onRetry={() => void query.refetch()} />
    );
  }
  return <>{children(query.data)}</>;
}
