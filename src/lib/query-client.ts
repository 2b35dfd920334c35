import { QueryCache, QueryClient } from '@tanstack/react-query';
import { statusOf } from './api-client.ts';

export function createQueryClient(): QueryClient {
  const client: QueryClient = new QueryClient({
    queryCache: new QueryCache({
      // The session ended under us (signed out elsewhere, server restarted): forget who we
      // thought was signed in, so the next page's guard asks the server again.
      onError: (error, query) => {
        if (statusOf(error) === 401 && query.queryKey[0] !== 'me') client.removeQueries({ queryKey: ['me'] });
      },
    }),
    defaultOptions: {
      queries: {
        staleTime: 30_000,
        refetchOnWindowFocus: false,
        // A 4xx will answer the same again; only a network or server hiccup is worth one retry.
        retry: (failures, error) => {
          const status = statusOf(error);
          if (status !== null && status < 500) return false;
          return failures < 1;
        },
      },
    },
  });
  return client;
}
