// Providers and the app-wide error boundary: the outermost layer of error handling.
import { QueryClientProvider, type QueryClient } from '@tanstack/react-query';
import { useState, type ReactNode } from 'react';
import { RouterProvider } from 'react-router/dom';
import { ErrorBoundary } from '../components/error-boundary.tsx';
import { GenericErrorView } from '../components/error-view.tsx';
import { createQueryClient } from '../lib/query-client.ts';
import { createAppRouter } from './router.tsx';

/** With `start`, a query client and router made beforehand (a page the server rendered). */
export function App({ start }: { start?: { queryClient: QueryClient; router: ReturnType<typeof createAppRouter> } }) {
  const [queryClient] = useState(() => start?.queryClient ?? createQueryClient());
  const [router] = useState(() => start?.router ?? createAppRouter(queryClient));
  return (
    <AppFrame queryClient={queryClient}>
      <RouterProvider router={router} />
    </AppFrame>
  );
}

/** The providers around the router, the same in the browser and in the server's first render. */
export function AppFrame({ queryClient, children }: { queryClient: QueryClient; children: ReactNode }) {
  return (
    <ErrorBoundary
      fallback={(error) => (
        <main className="p-6">
          <GenericErrorView error={error} onRetry={() => window.location.reload()} />
        </main>
      )}
    >
      <QueryClientProvider client={queryClient}>{children}</QueryClientProvider>
    </ErrorBoundary>
  );
}
