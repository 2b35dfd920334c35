import { queryOptions, useQuery } from '@tanstack/react-query';
import { apiRequest, withQuery } from '../../../lib/api-client.ts';
import type { RecordListResponse } from './types.ts';

export function getRecords(date: string, hidden: boolean, signal?: AbortSignal): Promise<RecordListResponse> {
  return apiRequest<RecordListResponse>(withQuery(`/api/plans/${encodeURIComponent(date)}/records`, { hidden: hidden ? 1 : undefined }), { signal });
}

/** A bake day's records; `hidden`: an admin's list, with the hidden ones (marked). */
export function getRecordsQueryOptions(date: string, hidden = false) {
  return queryOptions({ queryKey: ['records', date, hidden ? 'with-hidden' : 'shown'], queryFn: ({ signal }) => getRecords(date, hidden, signal) });
}

export function useRecords(date: string, options: { hidden?: boolean; enabled?: boolean } = {}) {
  return useQuery({ ...getRecordsQueryOptions(date, options.hidden ?? false), enabled: options.enabled ?? true });
}
