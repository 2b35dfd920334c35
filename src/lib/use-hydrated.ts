import { useSyncExternalStore } from 'react';

const noSubscription = () => () => {};

/**
 * False in the server's first render and while the browser takes that page over, true from then
 * on: controls that need the viewer's code stay disabled until it has started, so a tap before
 * then is not lost.
 */
export function useHydrated(): boolean {
  return useSyncExternalStore(
    noSubscription,
    () => true,
    () => false,
  );
}
