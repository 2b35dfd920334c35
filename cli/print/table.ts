// Terminal tables for the CLI (cli-table3), shared by the commands that print weights: plain
// text without colour so the output pastes into a message or a log unchanged.
import Table from 'cli-table3';

export type Align = 'left' | 'right';

export interface TableSpec {
  /** A line printed above the table. */
  title?: string;
  /** Column headings; none for a table of facts. */
  head?: string[];
  rows: string[][];
  /** Per column; numbers are best right-aligned. Default: first column left, the rest right. */
  align?: Align[];
  /** A last row set off by a rule, e.g. totals. */
  footer?: string[];
}

export function renderTable(spec: TableSpec): string {
  const columns = spec.head?.length ?? spec.rows[0]?.length ?? spec.footer?.length ?? 1;
  const align = spec.align ?? Array.from({ length: columns }, (_, i): Align => (i === 0 ? 'left' : 'right'));
  const table = new Table({
    head: spec.head ?? [],
    colAligns: align,
    style: { head: [], border: [], 'padding-left': 1, 'padding-right': 1, compact: true },
  });
  for (const r of spec.rows) table.push(r);
  if (spec.footer) table.push(spec.footer);
  let lines = table.toString().split('\n');
  if (spec.footer && spec.rows.length > 0) {
    // Rule above the footer, drawn like the table's top border with the inner joints.
    const rule = lines[0].replace('┌', '├').replace(/┬/g, '┼').replace('┐', '┤');
    lines = [...lines.slice(0, -2), rule, ...lines.slice(-2)];
  }
  const body = lines.join('\n');
  return spec.title ? `${spec.title}\n${body}` : body;
}

/** A two-column table of labels and values (derived figures, conditions). */
export function renderFacts(title: string, facts: readonly (readonly [string, string])[]): string {
  return renderTable({ title, rows: facts.map(([k, v]) => [k, v]), align: ['left', 'right'] });
}
