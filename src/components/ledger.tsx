// Panform's figure tables: words on the left, a ledger column of monospaced figures on the right.
import type { ReactNode } from 'react';

export interface LedgerRow {
  key: string;
  /** The ingredient's name, for finding the row (tests, print). */
  ingredient?: string;
  label: ReactNode;
  /** Baker's percent or another small figure, shown before the weight. */
  percent?: ReactNode;
  weight: ReactNode;
  note?: ReactNode;
  /** A whole build or soaker going in as one line. */
  emphasis?: boolean;
}

export function Ledger({
  caption,
  rows,
  percentHeading = "Baker's %",
  weightHeading = 'Weigh',
  total,
  showPercent = true,
  testId,
}: {
  caption?: ReactNode;
  rows: LedgerRow[];
  percentHeading?: ReactNode;
  weightHeading?: ReactNode;
  total?: { label: ReactNode; percent?: ReactNode; weight: ReactNode };
  showPercent?: boolean;
  testId?: string;
}) {
  return (
    <table className="w-full border-collapse text-base print:text-[9.5pt]" data-testid={testId}>
      {caption && <caption className="mb-1 text-left font-semibold text-muted">{caption}</caption>}
      <thead>
        <tr className="border-b-2 border-ink/70 text-left text-xs uppercase tracking-wider text-muted">
          <th scope="col" className="py-1 pr-2 font-semibold">
            Ingredient
          </th>
          {showPercent && (
            <th scope="col" className="figure w-[5.5rem] py-1 pr-2 text-right font-semibold">
              {percentHeading}
            </th>
          )}
          <th scope="col" className="figure w-[7.5rem] border-l-4 border-double border-line bg-sunk/60 py-1 pr-2 text-right font-semibold print:bg-transparent">
            {weightHeading}
          </th>
        </tr>
      </thead>
      <tbody>
        {rows.map((r) => (
          <tr key={r.key} className="border-b border-dashed border-line align-top" data-ingredient={r.ingredient}>
            <th scope="row" className={`py-1.5 pr-2 text-left font-normal print:py-0.5 ${r.emphasis ? 'font-semibold italic text-crust' : ''}`}>
              {r.label}
              {r.note && <span className="block text-sm text-muted print:inline print:pl-1 print:text-[8pt]">{r.note}</span>}
            </th>
            {showPercent && <td className="figure py-1.5 pr-2 text-right text-muted print:py-0.5">{r.percent}</td>}
            <td className="figure border-l-4 border-double border-line bg-sunk/60 py-1.5 pr-2 text-right font-bold print:bg-transparent print:py-0.5" data-weight>
              {r.weight}
            </td>
          </tr>
        ))}
      </tbody>
      {total && (
        <tfoot>
          <tr className="border-t-4 border-double border-ink/70">
            <th scope="row" className="py-1.5 pr-2 text-left font-semibold print:py-0.5">
              {total.label}
            </th>
            {showPercent && <td className="figure py-1.5 pr-2 text-right font-semibold">{total.percent}</td>}
            <td className="figure border-l-4 border-double border-line bg-sunk/60 py-1.5 pr-2 text-right font-bold print:bg-transparent print:py-0.5">
              {total.weight}
            </td>
          </tr>
        </tfoot>
      )}
    </table>
  );
}

/** A figure with its name above: for the strip of derived figures. */
export function FigureTile({ term, value, hint, className = '' }: { term: ReactNode; value: ReactNode; hint?: ReactNode; className?: string }) {
  return (
    <div className={`${className} rounded-xl border border-line bg-page/60 px-3 py-2 print:rounded-none print:border-0 print:px-0 print:py-0`}>
      <dt className="text-sm leading-tight text-muted print:text-[7.5pt]">{term}</dt>
      <dd className="figure text-xl font-bold print:text-[10pt]">{value}</dd>
      {hint && <dd className="text-sm text-muted print:hidden">{hint}</dd>}
    </div>
  );
}
