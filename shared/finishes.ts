// Finishes: what goes on or under each piece (seeds on top, egg wash, tray oil, dusting flour),
// written in the formula per piece. Pure; no I/O.
import type { Finish, Formula } from './model.ts';
import type { FinishUse } from './schema/shapes.ts';

export interface FinishAmount {
  ingredient: string;
  use: FinishUse;
  /** Grams on each piece, as the formula gives it. */
  perPiece: number;
  /** Grams for all the pieces. */
  grams: number;
  note?: string;
}

/** The finishes for `pieces` pieces of a formula, in the formula's order: what the pick list weighs out. */
export function finishAmounts(formula: Pick<Formula, 'finishes'>, pieces: number): FinishAmount[] {
  if (!(Number.isInteger(pieces) && pieces >= 0)) throw new RangeError(`pieces must be a whole number, 0 or more; got ${pieces}`);
  return formula.finishes.map((f: Finish) => ({
    ingredient: f.ingredient,
    use: f.use,
    perPiece: f.perPieceGrams,
    grams: f.perPieceGrams * pieces,
    ...(f.note === undefined ? {} : { note: f.note }),
  }));
}

export const FINISH_USE_WORDS: Record<FinishUse, string> = {
  topping: 'on top',
  wash: 'brushed on',
  tray: 'under, in the tray or tin',
  dusting: 'dusted on',
};
