// This device's clock, read again every half minute (the bake-day page's "now").
import { useEffect, useState } from 'react';

export function useClock(everyMs = 30_000): Date {
  const [now, setNow] = useState(() => new Date());
  useEffect(() => {
    const id = setInterval(() => setNow(new Date()), everyMs);
    return () => clearInterval(id);
  }, [everyMs]);
  return now;
}
