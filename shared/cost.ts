// Ingredient costs of a scaled batch: each overall line, the batch, a piece and a kilogram of
// dough, from the catalog's `cost_per_kg` (and its `cost_date`). Pure; no I/O.
//
// Conventions:
// - Costs are computed on the overall formula (pre-ferments and soakers included: their
//   ingredients are overall lines). A levain's seed culture is not priced separately: its flour
//   and water count as the formula's flour and water (docs/arithmetic.md).
// - The batch is the mixed dough, so the loss allowance is paid for: cost per piece = batch / pieces.
// - cost per kg of dough = batch / mixed dough × 1000.
// - A line whose ingredient has no price is never counted as zero: its cost is null, its name is
//   listed in `missing`, and the totals are marked incomplete (`complete: false`; they are then
//   the sum of the priced lines only, a lower bound).
// - Amounts are plain numbers in the catalog's currency, unrounded; `formatMoney` rounds for
//   display (2 decimals) and adds the currency the caller chose, if any.
import { lookupIngredient, type Catalog } from './model.ts';
import { sum, type ScaleResult } from './scale.ts';

export interface CostLine {
  ingredient: string;
  grams: number;
  /** Price per kg from the catalog; null when the catalog gives none. */
  costPerKg: number | null;
  /** The date of that price, when the catalog gives one (yyyy-mm-dd). */
  costDate: string | null;
  /** grams / 1000 × costPerKg; null when the price is missing. */
  cost: number | null;
  /** Share of the priced total in percent; null when the price is missing or the total is 0. */
  share: number | null;
}

export interface CostResult {
  formula: string;
  title: string;
  /** The currency written after or before amounts; "" for a plain number. */
  currency: string;
  pieces: number | null;
  pieceGrams: number | null;
  loss: number;
  mixedDough: number;
  dividedDough: number;
  lines: CostLine[];
  /** Sum of the priced lines. When `complete` is false this is a lower bound, not the cost. */
  total: number;
  /** Total / pieces; null when the batch was not scaled by pieces. */
  perPiece: number | null;
  /** Total per kg of mixed dough. */
  perKgDough: number;
  /** True when every line has a price. */
  complete: boolean;
  /** Ingredients without a price, in formula order. */
  missing: string[];
  /** Oldest and newest price dates among the priced lines (null when none is dated). */
  pricesFrom: string | null;
  pricesTo: string | null;
  /** Priced lines whose price has no date. */
  undated: string[];
}

/** The name the API contract (shared/api.ts) uses for a batch's costs. */
export type CostSummary = CostResult;

export interface CostOptions {
  /** Currency symbol or code for display; default "" (a plain number). */
  currency?: string;
}

/** Costs of a batch that has already been scaled. */
export function computeCost(scaled: ScaleResult, catalog: Catalog, options: CostOptions = {}): CostResult {
  // One line per ingredient name: a name that appears as flour and as ingredient is one purchase.
  const grams = new Map<string, number>();
  for (const l of scaled.overall) grams.set(l.ingredient, (grams.get(l.ingredient) ?? 0) + l.grams);

  const partial = [...grams].map(([ingredient, g]) => {
    const item = lookupIngredient(catalog, ingredient);
    const price = item.costPerKg ?? null;
    return {
      ingredient,
      grams: g,
      costPerKg: price,
      costDate: price === null ? null : (item.costDate ?? null),
      cost: price === null ? null : (g / 1000) * price,
    };
  });
  const priced = partial.filter((l): l is typeof l & { cost: number } => l.cost !== null);
  const total = sum(priced.map((l) => l.cost));
  const lines: CostLine[] = partial.map((l) => ({
    ...l,
    share: l.cost === null || !(total > 0) ? null : (l.cost / total) * 100,
  }));
  const missing = partial.filter((l) => l.cost === null).map((l) => l.ingredient);
  const dates = priced.map((l) => l.costDate).filter((d): d is string => d !== null).sort();

  return {
    formula: scaled.formula,
    title: scaled.title,
    currency: options.currency ?? '',
    pieces: scaled.pieces,
    pieceGrams: scaled.pieceGrams,
    loss: scaled.loss,
    mixedDough: scaled.mixedDough,
    dividedDough: scaled.dividedDough,
    lines,
    total,
    perPiece: scaled.pieces === null ? null : total / scaled.pieces,
    perKgDough: scaled.mixedDough > 0 ? (total / scaled.mixedDough) * 1000 : 0,
    complete: missing.length === 0,
    missing,
    pricesFrom: dates[0] ?? null,
    pricesTo: dates[dates.length - 1] ?? null,
    undated: priced.filter((l) => l.costDate === null).map((l) => l.ingredient),
  };
}

/**
 * An amount for display: 2 decimals, with the currency when one is set. A symbol (one character
 * that is not a letter, such as € $ £) goes before the amount, a code or word ("EUR") after it.
 */
export function formatMoney(amount: number, currency = ''): string {
  const fixed = (Math.round(amount * 100) / 100).toFixed(2);
  const text = fixed === '-0.00' ? '0.00' : fixed;
  const c = currency.trim();
  if (c === '') return text;
  if ([...c].length === 1 && !/\p{L}/u.test(c)) return text.startsWith('-') ? `-${c}${text.slice(1)}` : `${c}${text}`;
  return `${text} ${c}`;
}
