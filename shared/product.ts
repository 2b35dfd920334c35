// The product as sold, one piece at a time: the dough's ingredients as used, the finishes on and
// under it, and the water lost in the oven. The ingredient statement (label.ts) and the nutrition
// declaration (nutrition.ts) both rank and sum from it. Pure; no I/O.
//
// Weights as used. The overall formula, with the pre-ferments' and soakers' ingredients merged into
// it (they are overall lines already). A levain's seed culture counts as flour and water
// (docs/arithmetic.md); when the
// build has no line of the flour the culture is fed with, the seed's flour is moved from the
// build's flour to that flour. Per piece: the formula's piece weight of dough (the loss before
// dividing is scrap, not product), plus each finish in full (tray oil and dusting flour are taken
// to stay on the piece: the larger figure, which a label may not understate).
//
// Bake loss. The weight a piece loses in the oven is water (Regulation (EU) No 1169/2011 Annex VII
// Part A point 1 ranks added water by what is left of it in the finished product). The formula's
// `bake_loss` when it gives one; otherwise a default by category, common practice: small pieces
// and crusty hearth breads lose the most, tin and rye loaves and enriched doughs the least.
import type { Catalog, Formula } from './model.ts';
import { lookupIngredient } from './model.ts';
import { finishAmounts, type FinishAmount } from './finishes.ts';
import { scaleFormula, sum } from './scale.ts';

/** Percent of the dough's weight lost in the oven, by category (common practice). */
export const BAKE_LOSS_BY_CATEGORY: Readonly<Record<string, number>> = {
  lean: 13,
  sourdough: 14,
  rye: 10,
  enriched: 10,
  oil: 12,
  rolls: 16,
};
/** For a category not listed above (common practice). */
export const BAKE_LOSS_OTHERWISE = 12;

export interface BakeLoss {
  percent: number;
  source: 'given' | 'formula' | 'category default';
  /** How the figure was chosen, for notes and screens. */
  note: string;
}

/** The bake loss in use: `given` (a command-line or screen choice), else the formula's, else the category's default. */
export function bakeLossOf(formula: Pick<Formula, 'bakeLoss' | 'category'>, given?: number): BakeLoss {
  if (given !== undefined) return { percent: given, source: 'given', note: `bake loss ${given} % (given)` };
  if (formula.bakeLoss !== undefined) return { percent: formula.bakeLoss, source: 'formula', note: `bake loss ${formula.bakeLoss} % (the formula's bake_loss)` };
  const byCategory = Object.hasOwn(BAKE_LOSS_BY_CATEGORY, formula.category) ? BAKE_LOSS_BY_CATEGORY[formula.category] : undefined;
  const percent = byCategory ?? BAKE_LOSS_OTHERWISE;
  return {
    percent,
    source: 'category default',
    note: `bake loss ${percent} %: the default for ${byCategory === undefined ? 'a category without its own default' : `category "${formula.category}"`} (common practice); weigh a batch before and after baking and write bake_loss in the formula`,
  };
}

export class ProductError extends Error {
  constructor(message: string) {
    super(message);
    this.name = 'ProductError';
  }
}

export interface ProductPiece {
  /** Dough in one piece, grams. */
  doughGrams: number;
  /** The dough's ingredients as used, grams per piece, in the formula's order. */
  dough: { ingredient: string; grams: number }[];
  /** Finishes on one piece. */
  finishes: FinishAmount[];
  bakeLoss: BakeLoss;
  /** Water lost in the oven, grams per piece. */
  lostGrams: number;
  /** One piece as sold: dough less the bake loss, plus finishes. */
  bakedGrams: number;
}

/** One piece of the product (the formula's piece weight unless `pieceGrams` is given). Throws ScaleError or ProductError. */
export function productPiece(formula: Formula, catalog: Catalog, options: { bakeLoss?: number; pieceGrams?: number } = {}): ProductPiece {
  const bakeLoss = bakeLossOf(formula, options.bakeLoss);
  if (!(bakeLoss.percent >= 0 && bakeLoss.percent < 100)) throw new ProductError(`bake loss must be from 0 % to below 100 %; got ${bakeLoss.percent} %`);
  const doughGrams = options.pieceGrams ?? formula.yield.pieceGrams;
  if (!(doughGrams > 0)) throw new ProductError(`the piece weight must be above 0 g; got ${doughGrams} g`);
  const used = weightsAsUsed(formula, catalog);
  const mixed = sum([...used.values()]);
  if (!(mixed > 0)) throw new ProductError(`${formula.id} has no ingredients to weigh`);
  const dough = [...used].map(([ingredient, g]) => ({ ingredient, grams: (g * doughGrams) / mixed }));
  const finishes = finishAmounts(formula, 1);
  const lostGrams = (doughGrams * bakeLoss.percent) / 100;
  return { doughGrams, dough, finishes, bakeLoss, lostGrams, bakedGrams: doughGrams - lostGrams + sum(finishes.map((f) => f.grams)) };
}

/** Grams of each ingredient as used, per 1000 g of flour, with seed flours the formula does not otherwise use. */
function weightsAsUsed(formula: Formula, catalog: Catalog): Map<string, number> {
  const scaled = scaleFormula(formula, catalog, { by: 'flour', grams: 1000 });
  const grams = new Map<string, number>();
  for (const l of scaled.overall) grams.set(l.ingredient, (grams.get(l.ingredient) ?? 0) + l.grams);
  for (const p of scaled.preferments) {
    for (const l of p.ingredients) {
      if (!l.seed) continue;
      const item = lookupIngredient(catalog, l.ingredient);
      if (!item.fedWith || p.ingredients.some((x) => !x.seed && x.ingredient === item.fedWith)) continue;
      // scale.ts counted the seed's flour in the build's first flour line; move it to the flour it really is.
      const flourLine = p.ingredients.find((x) => !x.seed && lookupIngredient(catalog, x.ingredient).kind === 'flour');
      if (!flourLine) continue;
      const h = item.hydration ?? 100;
      const seedFlour = (l.grams * 100) / (100 + h);
      grams.set(flourLine.ingredient, (grams.get(flourLine.ingredient) ?? 0) - seedFlour);
      grams.set(item.fedWith, (grams.get(item.fedWith) ?? 0) + seedFlour);
    }
  }
  return grams;
}
