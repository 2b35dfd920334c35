import { Link } from 'react-router';
import type { FormulaSummary } from '#shared/api';
import { Badge, statusTone, statusWord } from '../../../components/panel.tsx';
import { percent } from '../../../lib/format.ts';
import { useUnits } from '../../../lib/units.ts';

export function FormulaList({ formulas, hrefOf, busy }: { formulas: FormulaSummary[]; hrefOf: (id: string) => string; busy: boolean }) {
  const { weight, pieceWeight } = useUnits();
  if (formulas.length === 0) {
    return (
      <p className="rounded-2xl border-2 border-dashed border-line p-6 text-center text-lg text-muted">
        No formula matches. Try fewer letters or clear a filter.
      </p>
    );
  }
  return (
    <ul aria-label="Formulas" aria-busy={busy} className={`grid gap-3 lg:grid-cols-2 ${busy ? 'opacity-70' : ''}`}>
      {formulas.map((f) => (
        <li key={f.id}>
          <Link
            to={hrefOf(f.id)}
            data-formula={f.id}
            className="group block h-full rounded-2xl border border-line bg-card p-4 shadow-[0_2px_0_var(--color-line)] hover:border-crust"
          >
            <div className="flex flex-wrap items-baseline justify-between gap-2">
              <h2 className="text-2xl font-semibold group-hover:text-crust">{f.title}</h2>
              {f.status !== 'active' && <Badge tone={statusTone(f.status)}>{statusWord(f.status)}</Badge>}
            </div>
            <p className="mt-0.5 text-muted">
              {f.category}
              {f.tags.length > 0 && <> · {f.tags.join(', ')}</>}
            </p>
            <dl className="mt-3 grid grid-cols-3 gap-2 border-t border-dashed border-line pt-3">
              <Figure
                term="Hydration"
                value={percent(f.figures.hydration)}
                hint={
                  f.figures.effectiveHydration - f.figures.hydration >= 0.5 ? `${percent(f.figures.effectiveHydration)} counting all water` : undefined
                }
              />
              <Figure term="Pre-fermented flour" value={percent(f.figures.prefermentedFlour)} />
              <Figure
                term="Written batch"
                value={
                  f.figures.pieces !== null && f.figures.pieceGrams !== null
                    ? `${f.figures.pieces} × ${pieceWeight(f.figures.pieceGrams)}`
                    : weight(f.figures.mixedDough)
                }
              />
            </dl>
          </Link>
        </li>
      ))}
    </ul>
  );
}

function Figure({ term, value, hint }: { term: string; value: string; hint?: string }) {
  return (
    <div>
      <dt className="text-sm leading-tight text-muted">{term}</dt>
      <dd className="figure text-lg font-bold">{value}</dd>
      {hint && <dd className="text-sm leading-tight text-muted">{hint}</dd>}
    </div>
  );
}
