import { computeCost, formatMoney } from '#shared/cost';
import type { Catalog } from '#shared/model';
import type { ScaleResult } from '#shared/scale';
import { useUnits } from '../../../lib/units.ts';

/** Ingredient cost of the batch on screen, from the catalog's prices (shown only to roles with read:cost). */
export function CostPanel({ scaled, catalog, currency }: { scaled: ScaleResult; catalog: Catalog; currency: string }) {
  const { grams } = useUnits();
  const cost = computeCost(scaled, catalog, { currency });
  const money = (n: number) => formatMoney(n, cost.currency);
  return (
    <div data-testid="cost" className="space-y-2">
      <dl className="grid grid-cols-3 gap-2">
        <div>
          <dt className="text-sm text-muted">Per piece</dt>
          <dd className="figure text-2xl font-bold text-crust" data-testid="cost-per-piece">{cost.perPiece === null ? '—' : money(cost.perPiece)}</dd>
        </div>
        <div>
          <dt className="text-sm text-muted">Per kg of dough</dt>
          <dd className="figure text-xl font-bold">{money(cost.perKgDough)}</dd>
        </div>
        <div>
          <dt className="text-sm text-muted">This batch</dt>
          <dd className="figure text-xl font-bold">{money(cost.total)}</dd>
        </div>
      </dl>
      {!cost.complete && (
        <p className="rounded-lg bg-honey-soft px-3 py-2 text-honey">
          No price for {cost.missing.join(', ')}: the figures above leave {cost.missing.length === 1 ? 'it' : 'them'} out and are too low.
        </p>
      )}
      <details className="print:hidden">
        <summary className="inline-flex min-h-12 cursor-pointer items-center font-semibold text-crust">Cost of each ingredient</summary>
        <table className="w-full text-base">
          <tbody>
            {cost.lines.map((l) => (
              <tr key={l.ingredient} className="border-b border-dashed border-line">
                <th scope="row" className="py-1 text-left font-normal">
                  {l.ingredient}
                </th>
                <td className="figure py-1 text-right text-muted">{grams(l.grams)}</td>
                <td className="figure py-1 text-right">{l.costPerKg === null ? 'no price' : `${money(l.costPerKg)}/kg`}</td>
                <td className="figure py-1 text-right font-bold">{l.cost === null ? '—' : money(l.cost)}</td>
              </tr>
            ))}
          </tbody>
        </table>
      </details>
      {cost.pricesFrom && (
        <p className="text-sm text-muted">
          Prices dated {cost.pricesFrom === cost.pricesTo ? cost.pricesFrom : `${cost.pricesFrom} to ${cost.pricesTo}`}
          {cost.undated.length > 0 && <>; undated: {cost.undated.join(', ')}</>}.
        </p>
      )}
    </div>
  );
}
