import { queryOptions, useQuery } from '@tanstack/react-query';
import type { PlanDetail } from '#shared/api';
import { apiRequest } from '../../../lib/api-client.ts';

export function getPlan(date: string, signal?: AbortSignal): Promise<PlanDetail> {
  return apiRequest<PlanDetail>(`/api/plans/${encodeURIComponent(date)}`, { signal });
}

export function getPlanQueryOptions(date: string) {
  return queryOptions({ queryKey: ['plans', 'detail', date], queryFn: ({ signal }) => getPlan(date, signal) });
}

export function usePlan(date: string) {
  return useQuery(getPlanQueryOptions(date));
}
