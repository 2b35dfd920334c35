// Providers and the app-wide error boundary: the outermost layer of error handling.
import { QueryClientProvider } from '@tanstack/react-query';
import { useState } from 'react';
import { RouterProvider } from 'react-router/dom';
import { ErrorBoundary } from '../components/error-boundary.tsx';
import { GenericErrorView } from '../components/error-view.tsx';
import { createQueryClient } from '../lib/query-client.ts';
import { createAppRouter } from './router.tsx';

export function App() {
  const [queryClient] = useState(createQueryClient);
  const [router] = useState(() => createAppRouter(queryClient));
  return (
    <ErrorBoundary
      fallback={(error) => (
        <main className="p-6">
          <GenericErrorView error={error} onRetry={() => window.location.reload()} />
        </main>
      )}
    >
      <QueryClientProvider client={queryClient}>
        <RouterProvider router={router} />
      </QueryClientProvider>
    </ErrorBoundary>
  );
}
