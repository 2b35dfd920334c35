import { FINISH_USE_WORDS, finishAmounts } from '#shared/finishes';
import type { Formula } from '#shared/model';
import { useUnits } from '../../../lib/units.ts';

/** What goes on or under the pieces: per piece, and for the pieces on screen. */
export function FinishesTable({ formula, pieces }: { formula: Formula; pieces: number }) {
  const { grams, pieceWeight } = useUnits();
  const rows = finishAmounts(formula, pieces);
  return (
    <table className="mt-3 w-full text-base print:text-[9pt]" data-testid="finishes">
      <caption className="text-left font-semibold">Finishes</caption>
      <thead>
        <tr className="border-b border-line text-sm text-muted">
          <th scope="col" className="py-1 text-left font-normal">Ingredient</th>
          <th scope="col" className="py-1 text-right font-normal">Each piece</th>
          <th scope="col" className="py-1 text-right font-normal">{pieces} pieces</th>
        </tr>
      </thead>
      <tbody>
        {rows.map((f) => (
          <tr key={`${f.use}-${f.ingredient}`} className="border-b border-dashed border-line">
            <th scope="row" className="py-1 text-left font-normal">
              {f.ingredient} <span className="text-muted">· {FINISH_USE_WORDS[f.use]}{f.note ? `; ${f.note}` : ''}</span>
            </th>
            <td className="figure py-1 pl-3 text-right">{pieceWeight(f.perPiece)}</td>
            <td className="figure py-1 pl-4 text-right font-bold">{grams(f.grams)}</td>
          </tr>
        ))}
      </tbody>
    </table>
  );
}
