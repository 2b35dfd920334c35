// CSV for the CLI's `--csv`: RFC 4180 quoting, one header row, "\n" line ends.

export function csvCell(v: string | number | boolean | null | undefined): string {
  if (v === null || v === undefined) return '';
  const s = typeof v === 'number' ? (Number.isFinite(v) ? String(v) : '') : String(v);
  return /[",\n\r]/.test(s) ? `"${s.replace(/"/g, '""')}"` : s;
}

export function renderCsv(head: readonly string[], rows: readonly (readonly (string | number | boolean | null | undefined)[])[]): string {
  return [head, ...rows].map((r) => r.map(csvCell).join(',')).join('\n') + '\n';
}
