import { queryOptions, useQuery } from '@tanstack/react-query';
import type { RevisionListResponse } from '#shared/api';
import { apiRequest } from '../../../lib/api-client.ts';

export function getRevisions(id: string, signal?: AbortSignal): Promise<RevisionListResponse> {
  return apiRequest<RevisionListResponse>(`/api/formulas/${encodeURIComponent(id)}/revisions`, { signal });
}

export function getRevisionsQueryOptions(id: string) {
  return queryOptions({ queryKey: ['revisions', id], queryFn: ({ signal }) => getRevisions(id, signal) });
}

export function useRevisions(id: string) {
  return useQuery(getRevisionsQueryOptions(id));
}
