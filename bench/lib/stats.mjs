// Small statistics for the bench: medians of repeated runs, percentiles, formatting.

export function median(xs) {
  if (xs.length === 0) return NaN;
  const s = [...xs].sort((a, b) => a - b);
  const m = Math.floor(s.length / 2);
  return s.length % 2 ? s[m] : (s[m - 1] + s[m]) / 2;
}

/** Nearest-rank percentile (p in 0..100). */
export function percentile(xs, p) {
  if (xs.length === 0) return NaN;
  const s = [...xs].sort((a, b) => a - b);
  const rank = Math.max(1, Math.ceil((p / 100) * s.length));
  return s[rank - 1];
}

export const ms = (x) => `${x.toFixed(x < 10 ? 1 : 0)} ms`;
export const seconds = (x) => `${(x / 1000).toFixed(2)} s`;
export const ratio = (x) => `${x.toFixed(2)}×`;
export const kb = (bytes) => `${(bytes / 1024).toFixed(1)} KB`;
export const mb = (bytes) => `${(bytes / 1024 / 1024).toFixed(0)} MB`;
export const rps = (x) => `${Math.round(x).toLocaleString('en-US')} req/s`;
