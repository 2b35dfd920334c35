// The figures a formula is known by (hydration, pre-fermented flour, batch weights), from a
// scaled batch. Used wherever a formula is listed or compared. Pure.
import type { FormulaFigures } from './api.ts';
import type { Catalog, Formula } from './model.ts';
import { scaleFormula, type ScaleResult } from './scale.ts';

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
