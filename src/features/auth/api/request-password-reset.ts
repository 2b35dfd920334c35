import { useMutation } from '@tanstack/react-query';
import { apiRequest } from '../../../lib/api-client.ts';

export function requestPasswordReset(input: { email: string }): Promise<unknown> {
  return apiRequest<unknown>('/api/password-reset', { method: 'POST', body: input });
}

export function useRequestPasswordReset() {
  return useMutation({ mutationFn: requestPasswordReset });
}
