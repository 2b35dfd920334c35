import { useEffect, useState } from 'react';

/**
 * False for the first render, true from the next frame on: a page can put what the bench needs
 * first (the tables) on screen at once and add the parts further down a frame later. On a slow
 * tablet that halves the wait for the first weights.
 */
export function useAfterFirstPaint(): boolean {
  const [ready, setReady] = useState(false);
  useEffect(() => {
    const frame = requestAnimationFrame(() => setTimeout(() => setReady(true), 0));
    return () => cancelAnimationFrame(frame);
  }, []);
  return ready;
}
