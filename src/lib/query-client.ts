import { QueryClient } from '@tanstack/react-query';
import { statusOf } from './api-client.ts';

export function createQueryClient(): QueryClient {
  return new QueryClient({
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
}
