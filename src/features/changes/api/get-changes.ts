import { queryOptions, useQuery } from '@tanstack/react-query';
import type { ChangeListResponse } from '#shared/api';
import { apiRequest } from '../../../lib/api-client.ts';

export function getChanges(signal?: AbortSignal): Promise<ChangeListResponse> {
  return apiRequest<ChangeListResponse>('/api/changes', { signal });
}

export function getChangesQueryOptions() {
  return queryOptions({ queryKey: ['changes'], queryFn: ({ signal }) => getChanges(signal) });
}

export function useChanges() {
  return useQuery(getChangesQueryOptions());
}
