// The boundary for one route: a loader's or a page's error shows here, inside the shell.
import { useNavigate, useRouteError } from 'react-router';
import { ErrorView } from '../components/error-view.tsx';

export function RouteErrorBoundary() {
  const error = useRouteError();
  const navigate = useNavigate();
  return <ErrorView error={error} onRetry={() => void navigate('.', { replace: true })} />;
}

export function RootErrorBoundary() {
  const error = useRouteError();
  return (
    <main id="main" className="mx-auto max-w-5xl px-4 py-6">
      <ErrorView error={error} onRetry={() => window.location.reload()} />
    </main>
  );
}
