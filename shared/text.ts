// Ordering names the same way on every machine. String.prototype.localeCompare follows the
// process's locale (a sheet printed on the office PC and on the bench tablet could list lines in
// different orders) and starts ICU's collator, which costs more than reading a formula.

/** Case-insensitive order by UTF-16 code units, then case as the tie-break: "apple" < "Bread" < "bread". */
export function compareText(a: string, b: string): number {
  const la = a.toLowerCase();
  const lb = b.toLowerCase();
  if (la !== lb) return la < lb ? -1 : 1;
  return a < b ? -1 : a > b ? 1 : 0;
}
