import { Component, type ErrorInfo, type ReactNode } from 'react';
import { getErrorMessage } from '../lib/errors.ts';
import { errorStatus, statusViews } from './error-view.tsx';

interface Props {
  /** What to show instead of the children; gets the error and a reset. */
  fallback: (error: unknown, reset: () => void) => ReactNode;
  children: ReactNode;
  /** Reset when any of these change (e.g. the route's params). */
  resetKeys?: unknown[];
}

interface State {
  error: unknown;
  hasError: boolean;
  keys: unknown[] | undefined;
}

export class ErrorBoundary extends Component<Props, State> {
  override state: State = { error: null, hasError: false, keys: this.props.resetKeys };

  static getDerivedStateFromError(error: unknown): Partial<State> {
    return { error, hasError: true };
  }

  static getDerivedStateFromProps(props: Props, state: State): Partial<State> | null {
    const a = props.resetKeys ?? [];
    const b = state.keys ?? [];
    if (a.length !== b.length || a.some((k, i) => !Object.is(k, b[i]))) {
      return { keys: props.resetKeys, hasError: false, error: null };
    }
    return null;
  }

  override componentDidCatch(_error: unknown, _info: ErrorInfo): void {
    // The fallback shows the message; React already reports the error in development.
  }

  reset = (): void => this.setState({ hasError: false, error: null });

  override render(): ReactNode {
    if (this.state.hasError) return this.props.fallback(this.state.error, this.reset);
    return this.props.children;
  }
}

/** A boundary around one panel: the rest of the page keeps working when this part fails. */
export function PanelBoundary({ title, children, resetKeys }: { title: string; children: ReactNode; resetKeys?: unknown[] }) {
  return (
    <ErrorBoundary resetKeys={resetKeys} fallback={(error, reset) => <PanelError title={title} error={error} onRetry={reset} />}>
      {children}
    </ErrorBoundary>
  );
}

export function PanelError({ title, error, onRetry }: { title: string; error: unknown; onRetry?: () => void }) {
  const status = errorStatus(error);
  const View = status === 401 ? statusViews[401] : undefined;
  if (View) return <View />;
  return (
    <div role="alert" className="rounded-xl border-2 border-dashed border-ember bg-ember-soft p-4">
      <p className="font-semibold text-ember">{title}: could not be shown.</p>
      <p className="mt-1">{getErrorMessage(error)}</p>
      {onRetry && (
        <button
          type="button"
          onClick={onRetry}
          className="mt-3 min-h-12 rounded-xl border-2 border-ember px-4 font-semibold text-ember hover:bg-card print:hidden"
        >
          Try again
        </button>
      )}
    </div>
  );
}
