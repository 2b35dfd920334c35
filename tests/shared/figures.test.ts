import { describe, expect, it } from 'vitest';
import { FIGURE_KEYS, pickFigures, sameFigures } from '#shared/figures';
import type { FormulaFigures } from '#shared/api';

const figures: FormulaFigures = {
  totalPercent: 180.5, hydration: 70, effectiveHydration: 71.2, prefermentedFlour: 20, finalDoughHydration: 68,
  flour: 1000, mixedDough: 1805, dividedDough: 1778, pieces: 2, pieceGrams: 889,
};

describe('pickFigures', () => {
  it('keeps every figure and drops anything else the stored JSON holds', () => {
    expect(pickFigures({ ...figures, stray: 1 })).toEqual(figures);
    expect(Object.keys(pickFigures(figures))).toEqual([...FIGURE_KEYS]);
  });

  it('reads a missing count as null and a missing weight as 0', () => {
    expect(pickFigures({})).toMatchObject({ pieces: null, pieceGrams: null, flour: 0, hydration: 0 });
  });
});

describe('sameFigures', () => {
  it.each([
    [figures, true],
    [{ ...figures, hydration: 70.1 }, false],
    [null, false],
    [JSON.parse(JSON.stringify(figures)), true],
  ])('compares stored figures %#', (stored, same) => {
    expect(sameFigures(stored, figures)).toBe(same);
  });

  it('agrees with pickFigures: what the load stores is what the list shows', () => {
    expect(sameFigures(pickFigures(figures), figures)).toBe(true);
  });
});
