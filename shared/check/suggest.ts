// The nearest known name for a typo ("bred flour" → "bread flour"). Pure.

/** Optimal string alignment distance (Levenshtein plus swapped neighbours), case-insensitive. */
export function editDistance(a: string, b: string): number {
  const s = a.toLowerCase();
  const t = b.toLowerCase();
  if (s === t) return 0;
  if (s.length === 0) return t.length;
  if (t.length === 0) return s.length;
  const rows = s.length + 1;
  const cols = t.length + 1;
  const d: number[] = new Array(rows * cols).fill(0);
  for (let i = 0; i < rows; i++) d[i * cols] = i;
  for (let j = 0; j < cols; j++) d[j] = j;
  for (let i = 1; i < rows; i++) {
    for (let j = 1; j < cols; j++) {
      const cost = s[i - 1] === t[j - 1] ? 0 : 1;
      let v = Math.min(d[(i - 1) * cols + j] + 1, d[i * cols + j - 1] + 1, d[(i - 1) * cols + j - 1] + cost);
      if (i > 1 && j > 1 && s[i - 1] === t[j - 2] && s[i - 2] === t[j - 1]) v = Math.min(v, d[(i - 2) * cols + j - 2] + 1);
      d[i * cols + j] = v;
    }
  }
  return d[rows * cols - 1];
}

/**
 * The closest of `known` to `name`, when it is close enough to be a typo: within a third of
 * the name's length (at least 2 edits), or the same words in another order or case.
 */
export function nearestName(name: string, known: Iterable<string>): string | undefined {
  const words = (s: string) => s.toLowerCase().split(/[\s_-]+/).filter(Boolean).sort().join(' ');
  let best: string | undefined;
  let bestDistance = Infinity;
  for (const k of known) {
    if (words(k) === words(name)) return k;
    const d = editDistance(name, k);
    if (d < bestDistance || (d === bestDistance && best !== undefined && k < best)) {
      best = k;
      bestDistance = d;
    }
  }
  if (best === undefined) return undefined;
  const limit = Math.max(2, Math.floor(name.length / 3));
  return bestDistance <= limit ? best : undefined;
}

/** ' (did you mean "x"?)' or ''. */
export function didYouMean(name: string, known: Iterable<string>): string {
  const n = nearestName(name, known);
  return n === undefined ? '' : `; did you mean "${n}"?`;
}
