import { queryOptions, useQuery } from '@tanstack/react-query';
import type { Me } from '#shared/api';
import { apiRequest } from '../../../lib/api-client.ts';

export function getMe(signal?: AbortSignal): Promise<Me> {
  return apiRequest<Me>('/api/me', { signal });
}

export function getMeQueryOptions() {
  return queryOptions({ queryKey: ['me'], queryFn: ({ signal }) => getMe(signal), staleTime: 5 * 60_000 });
}

export function useMe() {
  return useQuery(getMeQueryOptions());
}
