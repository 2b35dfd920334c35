// The accounts page's queries and changes (admins only: GET/POST /api/users, PATCH/DELETE
// /api/users/:id, POST /api/users/:id/password-reset, GET /api/audit).
import { queryOptions, useMutation, useQuery, useQueryClient } from '@tanstack/react-query';
import type { AccountListResponse, AccountSummary, AuditListResponse, NewAccount } from '#shared/api';
import type { Role } from '#shared/permissions';
import { apiRequest } from '../../../lib/api-client.ts';

export const getAccountsQueryOptions = () =>
  queryOptions({ queryKey: ['users'], queryFn: ({ signal }) => apiRequest<AccountListResponse>('/api/users', { signal }) });

export const getAuditQueryOptions = () =>
  queryOptions({ queryKey: ['audit'], queryFn: ({ signal }) => apiRequest<AuditListResponse>('/api/audit', { signal }) });

export const useAccounts = () => useQuery(getAccountsQueryOptions());
export const useAudit = () => useQuery(getAuditQueryOptions());

/** After any change: the list and the audit are read again. */
function useAccountMutation<T, R>(mutationFn: (input: T) => Promise<R>) {
  const queryClient = useQueryClient();
  return useMutation({
    mutationFn,
    onSettled: () => Promise.all([queryClient.invalidateQueries({ queryKey: ['users'] }), queryClient.invalidateQueries({ queryKey: ['audit'] })]),
  });
}

export const useAddAccount = () =>
  useAccountMutation((input: NewAccount) => apiRequest<{ user: AccountSummary }>('/api/users', { method: 'POST', body: input }));

export const useChangeRole = () =>
  useAccountMutation(({ id, role }: { id: number; role: Role }) => apiRequest<{ user: AccountSummary }>(`/api/users/${id}`, { method: 'PATCH', body: { role } }));

export const useRemoveAccount = () => useAccountMutation((id: number) => apiRequest<void>(`/api/users/${id}`, { method: 'DELETE' }));

export const useSendResetLink = () =>
  useAccountMutation((id: number) => apiRequest<{ message: string }>(`/api/users/${id}/password-reset`, { method: 'POST' }));
