// Ordering names the same way on every machine: one collator with a fixed locale (English), not
// the process's locale (String.prototype.localeCompare without one would let the office PC and
// the bench tablet print lines in different orders). Accented letters sort with their base
// letter ("água" beside "apple", not after "z"); case breaks ties, capitals first.
// Made on first use: building a collator loads ICU's collation data (about 12 ms), which a
// command that sorts nothing does not need.
let collator: Intl.Collator | undefined;

/** The order of names in every list, table and sheet. */
export function compareText(a: string, b: string): number {
  // Most comparisons in a sort are ties on a key (same oven, same kind): no need to ask ICU.
  if (a === b) return 0;
  collator ??= new Intl.Collator('en', { caseFirst: 'upper' });
  return collator.compare(a, b);
}

/**
 * Code-unit order, for keys and "YYYY-MM-DDTHH:MM" times (which it sorts by time), not for the
 * names people read (compareText).
 */
export function compareCodeUnits(a: string, b: string): number {
  return a < b ? -1 : a > b ? 1 : 0;
}

/**
 * Each distinct text's place in `compareText` order (texts that compare equal share one): a long
 * sort on a name then compares two numbers, asking ICU once per name instead of once per pair.
 */
export function textRanks(texts: Iterable<string>): Map<string, number> {
  const distinct = [...new Set(texts)].sort(compareText);
  const ranks = new Map<string, number>();
  distinct.forEach((t, i) => ranks.set(t, i > 0 && compareText(distinct[i - 1], t) === 0 ? ranks.get(distinct[i - 1])! : i));
  return ranks;
}
