import type { QueryClient } from '@tanstack/react-query';
import type { LoaderFunctionArgs } from 'react-router';
import { PageHeading } from '../../components/panel.tsx';
import { QueryState } from '../../components/query-state.tsx';
import { getChangesQueryOptions, useChanges } from '../../features/changes/api/get-changes.ts';
import { ChangeList } from '../../features/changes/components/change-list.tsx';
import { requirePermission } from '../guards.ts';
import { paths } from '../paths.ts';

export const clientLoader = (queryClient: QueryClient) => async ({ request }: LoaderFunctionArgs) => {
  await requirePermission(queryClient, request, 'read:history');
  void queryClient.prefetchQuery(getChangesQueryOptions());
  return null;
};

export default function ChangesRoute() {
  const query = useChanges();
  return (
    <>
      <PageHeading title="Changes" kicker="What was loaded, newest first" />
      <QueryState query={query} label="Fetching the changes…">
        {(data) => (
          <ChangeList
            changes={data.changes}
            hrefOf={(c) => paths.formulaChanges.getHref(c.formula, c.revision > 1 ? { from: c.revision - 1, to: c.revision } : undefined)}
          />
        )}
      </QueryState>
    </>
  );
}
