import { useMutation, useQueryClient } from '@tanstack/react-query';
import type { Me } from '#shared/api';
import { apiRequest } from '../../../lib/api-client.ts';
import { getMeQueryOptions } from './get-me.ts';

export interface SignInInput {
  email: string;
  password: string;
}

export function signIn(input: SignInInput): Promise<Me> {
  return apiRequest<Me>('/api/session', { method: 'POST', body: input });
}

export function useSignIn() {
  const queryClient = useQueryClient();
  return useMutation({
    mutationFn: signIn,
    onSuccess: (me) => {
      // A new person: nothing cached for the previous one may show.
      queryClient.clear();
      queryClient.setQueryData(getMeQueryOptions().queryKey, me);
    },
  });
}
