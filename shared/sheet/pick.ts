// The pick list's arithmetic: lines added up by ingredient in the sheet's order (catalog kind,
// then heaviest first), and the night's finishes by formula. Used by build.ts for the whole night
// and by window.ts for one shift. Pure; no I/O.
import { sum } from '../scale.ts';
import { finishAmounts } from '../finishes.ts';
import { lookupIngredient, type Catalog, type Formula } from '../model.ts';
import type { IngredientKind } from '../schema/shapes.ts';
import { INGREDIENT_KINDS } from '../schema/vocabulary.ts';
import { compareText } from '../text.ts';
import type { MixFinish, PickLine, SheetFinish, SheetMix } from './types.ts';

/** Lines added up by ingredient: flour first, then by the catalog's kinds, heaviest first. */
export function pickLines(lines: { ingredient: string; grams: number; kind: IngredientKind }[]): PickLine[] {
  const by = new Map<string, { grams: number[]; kind: IngredientKind }>();
  for (const l of lines) {
    const e = by.get(l.ingredient) ?? { grams: [], kind: l.kind };
    e.grams.push(l.grams);
    by.set(l.ingredient, e);
  }
  const out = [...by].map(([ingredient, e]) => ({ ingredient, grams: sum(e.grams), kind: e.kind }));
  const rank = (k: IngredientKind) => INGREDIENT_KINDS.indexOf(k);
  return out.sort((a, b) => rank(a.kind) - rank(b.kind) || b.grams - a.grams || compareText(a.ingredient, b.ingredient));
}

/** A mix's finishes: the formula's finishes (shared/finishes.ts) for the mix's pieces. */
export function mixFinishes(formula: Formula, pieces: number, catalog: Catalog): MixFinish[] {
  return finishAmounts(formula, pieces).map((f) => ({
    ingredient: f.ingredient,
    kind: lookupIngredient(catalog, f.ingredient).kind,
    use: f.use,
    perPiece: f.perPiece,
    grams: f.grams,
    ...(f.note === undefined ? {} : { note: f.note }),
  }));
}

/** The finishes of the given mixes added up per formula, ingredient and use, in the mixes' order. */
export function sheetFinishes(mixes: SheetMix[]): SheetFinish[] {
  const out = new Map<string, SheetFinish>();
  for (const m of mixes) {
    for (const f of m.finishes) {
      const key = JSON.stringify([m.formula, f.ingredient, f.use, f.perPiece]);
      const e = out.get(key);
      if (e) {
        e.pieces += m.pieces;
        e.grams += f.grams;
      } else out.set(key, { ...f, formula: m.formula, title: m.title, pieces: m.pieces });
    }
  }
  return [...out.values()];
}
