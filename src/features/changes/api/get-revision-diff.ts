import { queryOptions, useQuery } from '@tanstack/react-query';
import type { RevisionDiffResponse } from '#shared/api';
import { apiRequest, withQuery } from '../../../lib/api-client.ts';

export function getRevisionDiff(id: string, from: number, to: number, signal?: AbortSignal): Promise<RevisionDiffResponse> {
  return apiRequest<RevisionDiffResponse>(withQuery(`/api/formulas/${encodeURIComponent(id)}/diff`, { from, to }), { signal });
}

export function getRevisionDiffQueryOptions(id: string, from: number, to: number) {
  return queryOptions({
    queryKey: ['revisions', id, 'diff', from, to],
    queryFn: ({ signal }) => getRevisionDiff(id, from, to, signal),
    staleTime: Infinity, // two loaded revisions never change
  });
}

export function useRevisionDiff(id: string, from: number | null, to: number | null) {
  return useQuery({ ...getRevisionDiffQueryOptions(id, from ?? 0, to ?? 0), enabled: from !== null && to !== null && from !== to });
}
