import { useState } from 'react';
import type { Jurisdiction } from '#shared/allergens';
import type { IngredientStatement, Segment } from '#shared/label';
import type { NutritionDeclaration } from '#shared/nutrition';
import { nutritionHeadings } from '#shared/nutrition-print';
import type { ProductLabel } from '#shared/product-label';

const MARKETS: { rules: Jurisdiction; word: string }[] = [
  { rules: 'eu', word: 'EU' },
  { rules: 'us', word: 'US' },
];

/** The label for one market at a time: the ingredient statement with its quantities, then the nutrition table. */
export function LabelPanel({ label }: { label: ProductLabel }) {
  const [rules, setRules] = useState<Jurisdiction>('eu');
  const market = label[rules];
  return (
    <div className="space-y-3 print:space-y-1" data-testid="label" data-rules={rules}>
      <div role="group" aria-label="Labelling rules" className="inline-flex rounded-xl border border-line p-1 print:hidden">
        {MARKETS.map((m) => (
          <button
            key={m.rules}
            type="button"
            aria-pressed={rules === m.rules}
            onClick={() => setRules(m.rules)}
            className={`min-h-12 min-w-16 rounded-lg px-4 font-semibold ${rules === m.rules ? 'bg-crust text-on-crust' : 'text-crust'}`}
          >
            {m.word}
          </button>
        ))}
      </div>
      <p className="hidden font-semibold print:block">{rules === 'eu' ? 'EU rules' : 'US rules'}</p>
      {market.problem && <p className="rounded-lg bg-honey-soft px-3 py-2 text-honey">{market.problem}</p>}
      {market.statement && <Statement s={market.statement} />}
      {market.nutrition &&
        (market.nutrition.ok ? (
          <NutritionTable d={market.nutrition.declaration} />
        ) : (
          <p className="rounded-lg bg-honey-soft px-3 py-2 text-honey" data-testid="nutrition-missing">
            No nutrition declaration: {market.nutrition.message}.
          </p>
        ))}
      <details className="print:hidden">
        <summary className="inline-flex min-h-12 cursor-pointer items-center font-semibold text-crust">How it is worked out</summary>
        <ul className="list-disc pl-6 text-muted">
          {[...(market.statement?.notes ?? []), ...(market.nutrition?.ok ? market.nutrition.declaration.notes : [])].map((n) => (
            <li key={n}>{n}</li>
          ))}
        </ul>
        {market.nutrition?.ok && (
          <ul className="mt-2 list-disc pl-6 text-sm text-muted">
            {market.nutrition.declaration.sources.map((s) => (
              <li key={s.ingredient}>
                <span className="font-semibold">{s.ingredient}</span>: {s.source}
              </li>
            ))}
          </ul>
        )}
      </details>
      <p className="text-sm text-muted print:text-[7.5pt]">
        {market.statement?.caution} {market.nutrition?.ok ? market.nutrition.declaration.caution : ''}
      </p>
    </div>
  );
}

function Segments({ segments }: { segments: Segment[] }) {
  return (
    <>
      {segments.map((g, i) => (g.strong ? <strong key={i}>{g.text}</strong> : <span key={i}>{g.text}</span>))}
    </>
  );
}

function Statement({ s }: { s: IngredientStatement }) {
  const list = (es: IngredientStatement['main']) =>
    es.map((e, i) => (
      <span key={e.ingredients.join('+')}>
        {i > 0 && ', '}
        <Segments segments={e.segments} />
      </span>
    ));
  return (
    <div className="space-y-1 print:text-[9pt]" data-testid="ingredient-statement">
      <p>
        <span className="font-semibold">Ingredients: </span>
        {list(s.main)}
        {s.minor.length > 0 && (s.minorPhrase ? <>{s.main.length > 0 && '. '}{s.minorPhrase} </> : s.main.length > 0 && ', ')}
        {list(s.minor)}.
      </p>
      {s.contains && s.contains.length > 0 && (
        <p>
          <span className="font-semibold">Contains: </span>
          <strong>{s.contains.join(', ')}</strong>.
        </p>
      )}
      {s.mayContain.length > 0 && (
        <p>
          <span className="font-semibold">May contain: </span>
          <strong>{s.mayContain.join(', ')}</strong>.
        </p>
      )}
    </div>
  );
}

function NutritionTable({ d }: { d: NutritionDeclaration }) {
  const [title, a, b] = nutritionHeadings(d);
  return (
    <table className="w-full text-base print:text-[9pt]" data-testid="nutrition">
      <caption className="text-left font-semibold">{title}</caption>
      <thead>
        <tr className="border-b-2 border-ink">
          <th scope="col" className="sr-only">Nutrient</th>
          <th scope="col" className="py-1 text-right text-sm font-semibold">{a}</th>
          <th scope="col" className="py-1 text-right text-sm font-semibold">{b}</th>
        </tr>
      </thead>
      <tbody>
        {d.lines.map((l) => (
          <tr key={l.key} className="border-b border-dashed border-line">
            <th scope="row" className={`py-1 text-left ${l.sub ? 'pl-5 font-normal' : 'font-semibold'}`}>
              {l.label}
            </th>
            <td className="figure py-1 text-right">{l.value}</td>
            <td className="figure py-1 text-right text-muted">{d.rules === 'eu' ? l.perPiece : l.dailyValue === undefined ? '' : `${l.dailyValue} %`}</td>
          </tr>
        ))}
      </tbody>
      {d.rules === 'us' && (
        <tfoot>
          <tr>
            <td colSpan={3} className="pt-1 text-sm text-muted">
              * The % Daily Value tells how much a nutrient in a serving contributes to a daily diet; 2,000 calories a day is used for general nutrition advice.
            </td>
          </tr>
        </tfoot>
      )}
    </table>
  );
}
