import { queryOptions, useQuery } from '@tanstack/react-query';
import { apiRequest } from '../../../lib/api-client.ts';

/** Whether a reset link still works (unused, not expired); changes nothing. */
export function checkResetLink(token: string, signal?: AbortSignal): Promise<{ valid: true }> {
  return apiRequest<{ valid: true }>('/api/password-reset/check', { method: 'POST', body: { token }, signal });
}

export function getResetLinkQueryOptions(token: string) {
  return queryOptions({ queryKey: ['reset-link', token], queryFn: ({ signal }) => checkResetLink(token, signal), retry: false, staleTime: Infinity });
}

export function useResetLink(token: string) {
  return useQuery(getResetLinkQueryOptions(token));
}
