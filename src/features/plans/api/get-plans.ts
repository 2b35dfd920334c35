import { queryOptions, useQuery } from '@tanstack/react-query';
import type { PlanListResponse } from '#shared/api';
import { apiRequest } from '../../../lib/api-client.ts';

export function getPlans(signal?: AbortSignal): Promise<PlanListResponse> {
  return apiRequest<PlanListResponse>('/api/plans', { signal });
}

export function getPlansQueryOptions() {
  return queryOptions({ queryKey: ['plans'], queryFn: ({ signal }) => getPlans(signal) });
}

export function usePlans() {
  return useQuery(getPlansQueryOptions());
}
