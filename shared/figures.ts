// The figures a formula is known by (hydration, pre-fermented flour, batch weights), from a
// scaled batch. Used wherever a formula is listed or compared. Pure.
import type { Catalog, Formula } from './model.ts';
import { scaleFormula, type ScaleResult } from './scale.ts';

/** The figures of a formula's batch, as the API, the database and diffs carry them. */
export interface FormulaFigures {
  totalPercent: number;
  hydration: number;
  effectiveHydration: number;
  prefermentedFlour: number;
  finalDoughHydration: number;
  flour: number;
  mixedDough: number;
  dividedDough: number;
  pieces: number | null;
  pieceGrams: number | null;
}

/** Every figure, in the order they are listed. */
export const FIGURE_KEYS: readonly (keyof FormulaFigures)[] = [
  'totalPercent', 'hydration', 'effectiveHydration', 'prefermentedFlour', 'finalDoughHydration',
  'flour', 'mixedDough', 'dividedDough', 'pieces', 'pieceGrams',
];

/** Only the known figures from stored JSON, whatever else it holds; a missing count is null, a missing weight 0. */
export function pickFigures(stored: unknown): FormulaFigures {
  const src = (stored ?? {}) as Record<string, unknown>;
  const out = {} as Record<keyof FormulaFigures, number | null>;
  for (const k of FIGURE_KEYS) out[k] = typeof src[k] === 'number' ? (src[k] as number) : k === 'pieces' || k === 'pieceGrams' ? null : 0;
  return out as unknown as FormulaFigures;
}

/** Whether stored figures (any JSON) are exactly these. */
export function sameFigures(stored: unknown, figures: FormulaFigures): boolean {
  if (!stored || typeof stored !== 'object') return false;
  const x = stored as Record<string, unknown>;
  return FIGURE_KEYS.every((k) => x[k] === figures[k]);
}

export function figuresOf(r: ScaleResult): FormulaFigures {
  return {
    totalPercent: r.totalPercent,
    hydration: r.hydration,
    effectiveHydration: r.effectiveHydration,
    prefermentedFlour: r.prefermentedFlour,
    finalDoughHydration: r.finalDoughHydration,
    flour: r.flour,
    mixedDough: r.mixedDough,
    dividedDough: r.dividedDough,
    pieces: r.pieces,
    pieceGrams: r.pieceGrams,
  };
}

/** Figures of a formula's reference batch (its own yield). Throws ScaleError when it cannot be scaled. */
export function referenceFigures(formula: Formula, catalog: Catalog): FormulaFigures {
  return figuresOf(scaleFormula(formula, catalog, { by: 'pieces', pieces: formula.yield.pieces }));
}
