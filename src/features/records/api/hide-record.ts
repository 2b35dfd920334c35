import { useMutation, useQueryClient } from '@tanstack/react-query';
import { apiRequest } from '../../../lib/api-client.ts';
import type { BenchRecord } from './types.ts';

/** An owner hides a wrong record: kept and marked, out of lists, the CSV and the friction. */
export function useHideRecord(date: string) {
  const queryClient = useQueryClient();
  return useMutation({
    mutationFn: ({ id, reason }: { id: number; reason: string }) => apiRequest<{ record: BenchRecord }>(`/api/records/${id}/hide`, { method: 'POST', body: { reason } }),
    onSuccess: () => refreshAfterRecords(queryClient, date),
  });
}

/** What a stored or hidden record changes: the day's records, the friction learned, the sheet's proposals. */
export function refreshAfterRecords(queryClient: import('@tanstack/react-query').QueryClient, date: string): Promise<void> {
  return Promise.all([
    queryClient.invalidateQueries({ queryKey: ['records', date] }),
    queryClient.invalidateQueries({ queryKey: ['friction'] }),
    queryClient.invalidateQueries({ queryKey: ['plans', 'detail', date] }),
  ]).then(() => undefined);
}
