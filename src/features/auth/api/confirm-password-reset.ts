import { useMutation } from '@tanstack/react-query';
import { apiRequest } from '../../../lib/api-client.ts';

export function confirmPasswordReset(input: { token: string; password: string }): Promise<unknown> {
  return apiRequest<unknown>('/api/password-reset/confirm', { method: 'POST', body: input });
}

export function useConfirmPasswordReset() {
  return useMutation({ mutationFn: confirmPasswordReset });
}
