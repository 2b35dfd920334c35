// Properties of scaling that hold for any sensible formula: the parts add up to the whole, and
// the final dough plus the builds give back the overall formula, ingredient by ingredient.
import fc from 'fast-check';
import { describe, expect, it } from 'vitest';
import { scaleFormula, sum, type ScaleTarget } from '#shared/scale';
import type { Formula, Preferment, Soaker } from '#shared/model';
import { fixtureCatalog, formula } from './scale-fixtures.ts';

const catalog = fixtureCatalog();
const RUNS = Number(process.env.PANFORM_FUZZ_RUNS ?? 300);

const pct = (min: number, max: number) => fc.double({ min, max, noNaN: true, noDefaultInfinity: true });

/** Formulas whose builds always fit inside the overall formula (shares ≤ 50 %, poolish-to-biga hydration). */
const arbFormula: fc.Arbitrary<Formula> = fc
  .record({
    firstFlour: pct(50, 100),
    water: pct(55, 90),
    salt: pct(1.5, 2.5),
    yeast: pct(0.5, 2),
    seeds: pct(0, 15),
    loss: pct(0, 5),
    builds: fc.array(fc.record({ share: pct(1, 25), hydration: pct(50, 100), yeast: pct(0, 0.5), seed: fc.boolean() }), { maxLength: 2 }),
    soak: fc.boolean(),
  })
  .map((g) => {
    const flour = g.firstFlour >= 100
      ? [{ ingredient: 'bread flour', percent: 100 }]
      : [{ ingredient: 'bread flour', percent: g.firstFlour }, { ingredient: 'rye flour', percent: 100 - g.firstFlour }];
    const preferments: Preferment[] = g.builds.map((b, i) => ({
      name: `build ${i + 1}`,
      kind: b.seed ? 'levain' : 'poolish',
      share: b.share,
      ingredients: [
        { ingredient: 'bread flour', percent: 100 },
        { ingredient: 'water', percent: b.hydration },
        ...(b.seed ? [{ ingredient: 'mature culture', percent: 20 }] : [{ ingredient: 'instant yeast', percent: b.yeast }]),
      ],
    }));
    const soakers: Soaker[] = g.soak && g.seeds > 0
      ? [{ name: 'soak', ingredients: [{ ingredient: 'sunflower seeds', percent: g.seeds }, { ingredient: 'water', percent: Math.min(g.seeds, 5) }] }]
      : [];
    return formula({
      loss: g.loss,
      flour,
      ingredients: [
        { ingredient: 'water', percent: g.water },
        { ingredient: 'fine salt', percent: g.salt },
        { ingredient: 'instant yeast', percent: g.yeast },
        ...(g.seeds > 0 ? [{ ingredient: 'sunflower seeds', percent: g.seeds }] : []),
      ],
      preferments,
      soakers,
    });
  });

const arbTarget: fc.Arbitrary<ScaleTarget> = fc.oneof(
  fc.record({ by: fc.constant('pieces' as const), pieces: fc.integer({ min: 1, max: 500 }), pieceGrams: pct(20, 2000) }),
  fc.record({ by: fc.constant('mix' as const), grams: pct(100, 200000) }),
  fc.record({ by: fc.constant('flour' as const), grams: pct(100, 100000) }),
);

const close = (a: number, b: number) => Math.abs(a - b) <= 1e-9 * Math.max(1, Math.abs(b));

describe('scaleFormula properties', () => {
  it('makes the overall lines add up to the mixed dough', () => {
    fc.assert(
      fc.property(arbFormula, arbTarget, (f, t) => {
        const r = scaleFormula(f, catalog, t);
        expect(close(sum(r.overall.map((l) => l.grams)), r.mixedDough)).toBe(true);
        expect(close(r.mixedDough, r.flour * (r.totalPercent / 100))).toBe(true);
      }),
      { numRuns: RUNS },
    );
  });

  it('makes the final dough, with each build as one line, add up to the mixed dough', () => {
    fc.assert(
      fc.property(arbFormula, arbTarget, (f, t) => {
        const r = scaleFormula(f, catalog, t);
        expect(close(sum(r.finalDough.map((l) => l.grams)), r.mixedDough)).toBe(true);
      }),
      { numRuns: RUNS },
    );
  });

  it('gives back the overall formula from the final dough plus the builds, ingredient by ingredient', () => {
    fc.assert(
      fc.property(arbFormula, arbTarget, (f, t) => {
        const r = scaleFormula(f, catalog, t);
        for (const o of r.overall) {
          const inFinal = r.finalDough.find((l) => l.source === 'ingredient' && l.ingredient === o.ingredient)?.grams ?? 0;
          const inBuilds = sum(
            [...r.preferments, ...r.soakers].flatMap((b) => b.ingredients.filter((l) => !l.seed && l.ingredient === o.ingredient).map((l) => l.grams)),
          );
          expect(close(inFinal + inBuilds, o.grams)).toBe(true);
        }
      }),
      { numRuns: RUNS },
    );
  });

  it('weighs each build to its own total, seed included', () => {
    fc.assert(
      fc.property(arbFormula, arbTarget, (f, t) => {
        const r = scaleFormula(f, catalog, t);
        for (const b of r.preferments) {
          expect(close(sum(b.ingredients.map((l) => l.weigh)), b.grams)).toBe(true);
          for (const l of b.ingredients) expect(l.weigh).toBeGreaterThanOrEqual(0);
        }
      }),
      { numRuns: RUNS },
    );
  });

  it('scales linearly: twice the flour gives twice every weight', () => {
    fc.assert(
      fc.property(arbFormula, pct(100, 50000), (f, grams) => {
        const a = scaleFormula(f, catalog, { by: 'flour', grams });
        const b = scaleFormula(f, catalog, { by: 'flour', grams: 2 * grams });
        a.finalDough.forEach((l, i) => expect(close(2 * l.grams, b.finalDough[i].grams)).toBe(true));
        expect(close(a.hydration, b.hydration)).toBe(true);
      }),
      { numRuns: RUNS },
    );
  });
});
