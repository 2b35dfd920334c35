import { useQueryClient } from '@tanstack/react-query';
import { useEffect, useSyncExternalStore } from 'react';
import { refreshAfterRecords } from './api/hide-record.ts';
import { getDeviceOutbox, type OutboxState } from './outbox.ts';

const EMPTY: OutboxState = { items: [], sending: false, problem: null };

/** What waits on this device to be sent (all bake days). */
export function useOutbox(): OutboxState {
  const outbox = getDeviceOutbox();
  return useSyncExternalStore(outbox.subscribe, outbox.getState, () => EMPTY);
}

/** Starts this device's outbox (sends what an earlier page left) and refreshes the lists as records arrive. Once, in the app shell. */
export function useOutboxSender(enabled: boolean): void {
  const queryClient = useQueryClient();
  useEffect(() => {
    if (!enabled) return;
    const outbox = getDeviceOutbox();
    const listener = (p: { date: string }) => void refreshAfterRecords(queryClient, p.date);
    outbox.onStored.add(listener);
    void outbox.flush();
    return () => {
      outbox.onStored.delete(listener);
    };
  }, [enabled, queryClient]);
}
