// Property tests of the baker's arithmetic over thousands of generated formulas of every shape:
// whatever the formula and the batch, the parts add up to the whole, scaling is reversible, the
// final dough plus the builds give back the overall formula, and the percentages do not depend on
// the batch size, by pieces (at the formula's or another piece weight), by mixed dough or by flour.
// Run count: PANFORM_FUZZ_RUNS (npm run test:large runs 20 000).
import fc from 'fast-check';
import { describe, expect, it } from 'vitest';
import { parseCatalogText, parseFormulaText } from '#shared/parse';
import { scaleFormula, sum, type ScaleResult } from '#shared/scale';
import type { Catalog, Formula } from '#shared/model';
import { catalogText, formulaArb, fuzzRuns, fuzzTimeout } from './generators.ts';

const RUNS = fuzzRuns(1000);

function readCatalog(): Catalog {
  const parsed = parseCatalogText(catalogText, 'fuzz/ingredients.yaml');
  if (!parsed.ok) throw new Error(`the fuzz catalog is invalid: ${parsed.findings.map((f) => f.message).join('; ')}`);
  return parsed.value;
}
const catalog = readCatalog();

function parse(text: string): Formula {
  const parsed = parseFormulaText(text, 'fuzz/formula.yaml');
  if (!parsed.ok) throw new Error(`a generated formula was refused:\n${text}\n${parsed.findings.map((f) => `${f.line}:${f.col} ${f.message}`).join('\n')}`);
  return parsed.value;
}

/** Equal to a relative tolerance far below a tenth of a gram on any batch a bakery makes. */
function close(actual: number, expected: number, scale = Math.abs(expected)): boolean {
  return Math.abs(actual - expected) <= 1e-9 * Math.max(1, scale);
}

function expectClose(actual: number, expected: number, what: string, scale?: number): void {
  if (!close(actual, expected, scale)) throw new Error(`${what}: ${actual} != ${expected}`);
}

/** Grams of each ingredient taken into the pre-ferment and soaker builds (seed cultures excluded). */
function takenByBuilds(r: ScaleResult): Map<string, number> {
  const taken = new Map<string, number>();
  for (const b of [...r.preferments, ...r.soakers]) {
    for (const l of b.ingredients) if (!l.seed) taken.set(l.ingredient, (taken.get(l.ingredient) ?? 0) + l.grams);
  }
  return taken;
}

const batchArb = fc.record({
  mix: fc.integer({ min: 100, max: 200_000 }),
  k: fc.constantFrom(0.25, 0.5, 1.5, 2, 3, 7, 10, 0.1, 1 / 3),
});

describe('scaleFormula on generated formulas', () => {
  it('parses every generated formula file without a finding', { timeout: fuzzTimeout(RUNS) }, () => {
    fc.assert(
      fc.property(formulaArb, (g) => {
        const parsed = parseFormulaText(g.text, 'fuzz/formula.yaml');
        expect(parsed.findings).toEqual([]);
        expect(parsed.ok).toBe(true);
      }),
      { numRuns: RUNS },
    );
  });

  it('makes the overall lines, the final dough and the pieces add up to the mixed and divided dough', { timeout: fuzzTimeout(RUNS) }, () => {
    fc.assert(
      fc.property(formulaArb, fc.integer({ min: 1, max: 2000 }), fc.option(fc.integer({ min: 20, max: 2000 })), (g, pieces, pieceGrams) => {
        const f = parse(g.text);
        // The formula's own piece weight, or another one (as `--piece` gives).
        const r = scaleFormula(f, catalog, pieceGrams === null ? { by: 'pieces', pieces } : { by: 'pieces', pieces, pieceGrams });
        const M = r.mixedDough;
        expectClose(sum(r.overall.map((l) => l.grams)), M, 'overall lines vs mixed dough');
        expectClose(sum(r.finalDough.map((l) => l.grams)), M, 'final dough lines vs mixed dough');
        expectClose(r.dividedDough, pieces * (pieceGrams ?? f.yield.pieceGrams), 'divided dough vs pieces × piece');
        expectClose(M * (1 - f.loss / 100), r.dividedDough, 'mixed dough less the loss vs divided dough');
        expectClose(sum(r.overall.filter((l) => l.kind === 'flour').map((l) => l.grams)), r.flour, 'flour lines vs total flour');
        for (const b of r.preferments) {
          // What is weighed into a build (fresh flour and water less the seed's part, plus the seed) is the build.
          expectClose(sum(b.ingredients.map((l) => l.weigh)), b.grams, `weighed lines of ${b.name}`, M);
          for (const l of b.ingredients) expect(l.weigh).toBeGreaterThanOrEqual(-1e-9 * M);
        }
        for (const l of r.finalDough) expect(l.grams).toBeGreaterThanOrEqual(0);
      }),
      { numRuns: RUNS },
    );
  });

  it('returns the original weights when a batch is scaled by k and then by 1/k', { timeout: fuzzTimeout(RUNS) }, () => {
    fc.assert(
      fc.property(formulaArb, batchArb, (g, { mix, k }) => {
        const f = parse(g.text);
        const a = scaleFormula(f, catalog, { by: 'mix', grams: mix });
        const up = scaleFormula(f, catalog, { by: 'mix', grams: a.mixedDough * k });
        const back = scaleFormula(f, catalog, { by: 'mix', grams: up.mixedDough / k });
        expectClose(back.flour, a.flour, 'flour');
        a.overall.forEach((l, i) => {
          expectClose(up.overall[i].grams, l.grams * k, `${l.ingredient} scaled by k`, a.mixedDough * k);
          expectClose(back.overall[i].grams, l.grams, `${l.ingredient} after k and 1/k`, a.mixedDough);
        });
        a.finalDough.forEach((l, i) => expectClose(back.finalDough[i].grams, l.grams, `final ${l.ingredient}`, a.mixedDough));
        a.preferments.forEach((p, i) =>
          p.ingredients.forEach((l, j) => expectClose(back.preferments[i].ingredients[j].weigh, l.weigh, `${p.name} ${l.ingredient}`, a.mixedDough)),
        );
        // The flour target gives the same batch as the mix target it came from.
        const byFlour = scaleFormula(f, catalog, { by: 'flour', grams: a.flour });
        expectClose(byFlour.mixedDough, a.mixedDough, 'mixed dough from the flour target');
      }),
      { numRuns: RUNS },
    );
  });

  it('gives back the overall formula, ingredient by ingredient, from the final dough plus the builds', { timeout: fuzzTimeout(RUNS) }, () => {
    fc.assert(
      fc.property(formulaArb, fc.integer({ min: 100, max: 200_000 }), (g, mix) => {
        const f = parse(g.text);
        const r = scaleFormula(f, catalog, { by: 'mix', grams: mix });
        const taken = takenByBuilds(r);
        const final = new Map(r.finalDough.filter((l) => l.source === 'ingredient').map((l) => [l.ingredient, l.grams]));
        const overall = new Map<string, number>();
        for (const l of r.overall) overall.set(l.ingredient, (overall.get(l.ingredient) ?? 0) + l.grams);
        for (const [ingredient, grams] of overall) {
          expectClose((final.get(ingredient) ?? 0) + (taken.get(ingredient) ?? 0), grams, `${ingredient}: final dough + builds`, r.mixedDough);
        }
        for (const name of taken.keys()) expect(overall.has(name)).toBe(true);
        // Each pre-ferment and soaker appears once in the final dough, with the build's whole weight.
        for (const b of [...r.preferments, ...r.soakers]) {
          const line = r.finalDough.find((l) => l.source !== 'ingredient' && l.ingredient === b.name);
          expect(line?.grams).toBe(b.grams);
        }
      }),
      { numRuns: RUNS },
    );
  });

  it('keeps hydration, effective hydration and pre-fermented flour the same at every batch size', { timeout: fuzzTimeout(RUNS) }, () => {
    fc.assert(
      fc.property(formulaArb, batchArb, fc.integer({ min: 1, max: 500 }), (g, { mix, k }, pieces) => {
        const f = parse(g.text);
        const a = scaleFormula(f, catalog, { by: 'mix', grams: mix });
        const b = scaleFormula(f, catalog, { by: 'mix', grams: mix * k });
        const c = scaleFormula(f, catalog, { by: 'pieces', pieces });
        for (const other of [b, c]) {
          expectClose(other.hydration, a.hydration, 'hydration', 100);
          expectClose(other.effectiveHydration, a.effectiveHydration, 'effective hydration', 100);
          expectClose(other.prefermentedFlour, a.prefermentedFlour, 'pre-fermented flour', 100);
          expectClose(other.finalDoughHydration, a.finalDoughHydration, 'final dough hydration', 100);
          expectClose(other.totalPercent, a.totalPercent, 'total %', 100);
        }
        // Hydration from the file's own percentages: water lines over 100 % flour.
        const waterPercent = sum(f.ingredients.filter((l) => l.ingredient === 'water').map((l) => l.percent));
        expectClose(a.hydration, waterPercent, 'hydration vs the water percentage', 100);
      }),
      { numRuns: RUNS },
    );
  });
});
