import type { AllergenSummary } from '#shared/allergens';
import { formatGroups } from '#shared/allergens';

export function AllergensPanel({ summary }: { summary: AllergenSummary }) {
  return (
    <div className="space-y-3 print:space-y-0.5" data-testid="allergens">
      <dl className="grid gap-3 sm:grid-cols-2 print:grid-cols-2 print:gap-1">
        <div className="rounded-xl border-2 border-ember/60 p-3 print:border-0 print:p-0">
          <dt className="text-sm font-semibold uppercase tracking-wider text-muted">Contains · EU (14)</dt>
          <dd className="text-lg font-semibold print:text-[9.5pt]">{summary.eu.length ? formatGroups(summary.eu) : 'none of the 14 listed'}</dd>
        </div>
        <div className="rounded-xl border-2 border-ember/60 p-3 print:border-0 print:p-0">
          <dt className="text-sm font-semibold uppercase tracking-wider text-muted">Contains · US (9 major)</dt>
          <dd className="text-lg font-semibold print:text-[9.5pt]">{summary.us.length ? formatGroups(summary.us) : 'none of the 9 major'}</dd>
        </div>
      </dl>
      {summary.mayContain.codes.length > 0 && (
        <p>
          <span className="font-semibold">May contain: </span>
          {formatGroups(summary.mayContain.eu) || summary.mayContain.codes.join(', ')}
        </p>
      )}
      {summary.sources.length > 0 && (
        <details className="print:hidden">
          <summary className="inline-flex min-h-12 cursor-pointer items-center font-semibold text-crust">Where each comes from</summary>
          <ul className="mt-1 list-disc pl-6">
            {summary.sources.map((s) => (
              <li key={s.code}>
                <span className="font-semibold">{s.code}</span>: {s.ingredients.join(', ')}
              </li>
            ))}
          </ul>
        </details>
      )}
      {summary.notes.length > 0 && (
        <ul className="list-disc pl-6 text-muted print:text-[8pt]">
          {summary.notes.map((n) => (
            <li key={n}>{n}</li>
          ))}
        </ul>
      )}
      <p className="text-sm text-muted print:text-[7.5pt]">{summary.caution}</p>
    </div>
  );
}
