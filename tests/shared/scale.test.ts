// Scaling every shape of formula against values worked by hand or published, source beside each.
import { describe, expect, it } from 'vitest';
import { resolveTarget, ScaleError, scaleFormula, sum, totalPercent, type ScaleResult } from '#shared/scale';
import { convertMass, roundGrams, toGrams } from '#shared/units';
import type { Catalog } from '#shared/model';
import { fixtureCatalog, fixtureFormula, formula } from './scale-fixtures.ts';

const catalog = fixtureCatalog();

const overall = (r: ScaleResult, name: string) => r.overall.find((l) => l.ingredient === name)?.grams;
const final = (r: ScaleResult, name: string) => r.finalDough.find((l) => l.ingredient === name)?.grams;
const build = (r: ScaleResult, name: string) => {
  const b = [...r.preferments, ...r.soakers].find((x) => x.name === name);
  if (!b) throw new Error(`no build ${name}`);
  return b;
};
const line = (r: ScaleResult, buildName: string, ingredient: string) => {
  const l = build(r, buildName).ingredients.find((x) => x.ingredient === ingredient);
  if (!l) throw new Error(`no line ${ingredient} in ${buildName}`);
  return l;
};

/** Relative closeness for unrounded grams. */
function near(actual: number | undefined, expected: number, rel = 1e-12): void {
  expect(actual).toBeDefined();
  expect(Math.abs((actual as number) - expected)).toBeLessThanOrEqual(Math.max(1e-9, Math.abs(expected) * rel));
}

describe('scaleFormula: straight dough', () => {
  it('scales a 168 % lean formula to 1000 g of dough', () => {
    const r = scaleFormula(fixtureFormula('lean-straight'), catalog, { by: 'mix', grams: 1000 });
    expect(r.totalPercent).toBe(168); // common practice lean dough 100/65/2/1, hand-worked from the baker's percent definition (Gisslen, Professional Baking)
    expect(roundGrams(r.flour, { coarse: 0.01, fine: 0.01, fineBelow: 0 })).toBe(595.24); // hand-worked: 1000 / 1.68 = 595.24 g
    expect(roundGrams(overall(r, 'water')!, { coarse: 0.01, fine: 0.01, fineBelow: 0 })).toBe(386.9); // hand-worked: 0.65 × 595.24 = 386.90 g
    expect(roundGrams(overall(r, 'fine salt')!, { coarse: 0.01, fine: 0.01, fineBelow: 0 })).toBe(11.9); // hand-worked: 11.90 g
    expect(roundGrams(overall(r, 'instant yeast')!, { coarse: 0.01, fine: 0.01, fineBelow: 0 })).toBe(5.95); // hand-worked: 5.95 g
  });

  it('gives exactly 1000 / 650 / 20 / 10 g for 1680 g of dough', () => {
    const r = scaleFormula(fixtureFormula('lean-straight'), catalog, { by: 'mix', grams: 1680 });
    near(r.flour, 1000); // same dough, hand-worked: 1680 g → 1000 g flour
    near(overall(r, 'water'), 650); // same
    near(overall(r, 'fine salt'), 20); // same
    near(overall(r, 'instant yeast'), 10); // same
    expect(r.hydration).toBeCloseTo(65, 12); // water / flour
    expect(r.prefermentedFlour).toBe(0);
    expect(r.finalDough.map((l) => l.ingredient)).toEqual(['bread flour', 'water', 'fine salt', 'instant yeast']);
  });

  it('scales the worksheet baguette: 73 × 390 g at 170 %', () => {
    const r = scaleFormula(fixtureFormula('worksheet-baguette'), catalog, { by: 'pieces', pieces: 73 });
    expect(r.dividedDough).toBe(28470); // "Baker's Percentage Worksheet" (culinary-school handout "Baker's Math", example 1): 73 × 390 g = 28 470 g
    expect(r.totalPercent).toBe(170); // same worksheet: 170 %
    expect(roundGrams(r.flour)).toBe(16747); // same worksheet: 16 747 g
    expect(overall(r, 'water')).toBeCloseTo(11220.53, 2); // same worksheet: 11 220.49 g from its rounded flour; 11 220.53 g from 28 470 / 1.7 × 0.67
    expect(overall(r, 'fine salt')).toBeCloseTo(334.94, 2); // same worksheet: 334.94 g
    expect(overall(r, 'fresh yeast')).toBeCloseTo(167.47, 2); // same worksheet: 167.47 g
    near(sum(r.overall.map((l) => l.grams)), 28470); // same worksheet: the parts add back to 28 470 g
  });

  it('applies the loss allowance: mixed dough = divided dough / (1 − loss)', () => {
    const f = { ...fixtureFormula('lean-straight'), loss: 2 };
    const r = scaleFormula(f, catalog, { by: 'pieces', pieces: 10, pieceGrams: 490 });
    expect(r.dividedDough).toBe(4900); // 10 × 490 g, by hand
    near(r.mixedDough, 5000); // 4900 / 0.98 = 5000, by hand
    near(r.flour, 5000 / 1.68); // by hand
    expect(r.loss).toBe(2);
  });

  it('applies no loss when scaled by mixed dough or by flour', () => {
    const f = { ...fixtureFormula('lean-straight'), loss: 5 };
    const byMix = scaleFormula(f, catalog, { by: 'mix', grams: 1680 });
    expect(byMix.loss).toBe(0);
    expect(byMix.dividedDough).toBe(1680);
    const byFlour = scaleFormula(f, catalog, { by: 'flour', grams: 1000 });
    near(byFlour.mixedDough, 1680); // 1000 g × 168 %, by hand
    expect(byFlour.loss).toBe(0);
  });

  it('scales the pizza formula to 40 lb of flour in exact pounds and ounces', () => {
    const r = scaleFormula(fixtureFormula('pizza-lb'), catalog, { by: 'flour', grams: toGrams(40, 'lb') });
    expect(r.totalPercent).toBeCloseTo(166.25, 12); // handout "How to Work with a Formula Expressed in Baker's Percent" ("Figuring Percentages"): 166.25 %
    const oz = (name: string) => convertMass(overall(r, name)!, 'g', 'oz');
    expect(oz('fine salt')).toBeCloseTo(11.2, 9); // same handout: salt 11.2 oz
    expect(oz('sugar')).toBeCloseTo(12.8, 9); // same handout: sugar 12.8 oz
    expect(oz('compressed yeast')).toBeCloseTo(9.6, 9); // same handout: compressed yeast 9.6 oz
    expect(oz('olive oil')).toBeCloseTo(19.2, 9); // same handout: olive oil 1 lb 3.2 oz
    expect(oz('water')).toBeCloseTo(371.2, 9); // same handout: water 23 lb 3.2 oz
  });

  it('divides by the full 162.125 %, not a rounded 1.62', () => {
    const f = formula({
      flour: [{ ingredient: 'bread flour', percent: 100 }],
      ingredients: [
        { ingredient: 'water', percent: 58 },
        { ingredient: 'fine salt', percent: 1.75 },
        { ingredient: 'sugar', percent: 2 },
        { ingredient: 'instant yeast', percent: 0.375 },
      ],
    });
    expect(totalPercent(f)).toBeCloseTo(162.125, 12); // the same handout's companion slides ("Baker's Math"), instant yeast 0.375 %, no oil: 162.125 %
    const r = scaleFormula(f, catalog, { by: 'mix', grams: 10000 });
    near(r.flour, 10000 / 1.62125); // same slides: flour = dough / 1.62125
  });
});

describe('scaleFormula: one pre-ferment', () => {
  const r = scaleFormula(fixtureFormula('poolish-loaf'), catalog, { by: 'mix', grams: 1000 });

  it('builds the poolish from its share of the flour', () => {
    expect(r.totalPercent).toBe(170.5); // hand-worked example in the total formula / poolish / final dough layout (not from a publication): 170.5 %
    expect(roundGrams(r.flour)).toBe(587); // hand-worked: 1000 / 1.705 = 586.51 → 587
    expect(roundGrams(line(r, 'poolish', 'all-purpose flour').grams)).toBe(194); // hand-worked: 0.33 × 586.51 = 193.55 → 194
    expect(roundGrams(line(r, 'poolish', 'water').grams)).toBe(194); // hand-worked: poolish water 194
    // Rounded, the poolish is 194 + 194 = 388 g; unrounded it is 2.001 × 193.55 = 387.29 g (hand-worked).
    expect(build(r, 'poolish').grams).toBeCloseTo(2.001 * 0.33 * (1000 / 1.705), 9);
    expect(line(r, 'poolish', 'instant yeast').grams).toBeCloseTo(0.19, 2); // hand-worked: 0.1 % of 194 g = 0.19 g
    expect(build(r, 'poolish').hydration).toBeCloseTo(100, 12);
    expect(r.prefermentedFlour).toBeCloseTo(33, 12);
  });

  it('takes the poolish out of the overall formula for the final dough', () => {
    expect(roundGrams(final(r, 'all-purpose flour')!)).toBe(393); // hand-worked: 587 − 194 = 393
    // Rounded, 398 − 194 = 204 g of water; unrounded it is 0.35·F = 205.28 g (hand-worked).
    near(final(r, 'water'), 0.35 * (1000 / 1.705));
    // Panform's convention: the pre-ferment's yeast IS taken out of the overall yeast (the book does not).
    near(final(r, 'instant yeast'), (0.005 - 0.33 * 0.001) * (1000 / 1.705));
    near(final(r, 'poolish'), build(r, 'poolish').grams);
    expect(r.finalDough.at(-1)).toMatchObject({ ingredient: 'poolish', source: 'preferment' });
    near(sum(r.finalDough.map((l) => l.grams)), 1000); // hand-worked: final dough adds to 1000 g
    expect(r.finalDoughHydration).toBeCloseTo((0.35 / 0.67) * 100, 10); // by hand: 0.35F water / 0.67F flour
  });
});

describe('scaleFormula: two pre-ferments', () => {
  const r = scaleFormula(fixtureFormula('two-preferments'), catalog, { by: 'pieces', pieces: 10 });
  const F = 5000 / 0.98 / 1.724; // by hand: 10 × 500 g, 2 % loss, 172.4 %

  it('scales each pre-ferment from its own share', () => {
    near(r.mixedDough, 5000 / 0.98);
    near(r.flour, F);
    near(line(r, 'poolish', 'water').grams, 0.2 * F); // by hand: poolish 20 % at 100 %
    near(line(r, 'biga', 'water').grams, 0.09 * F); // by hand: biga 15 % at 60 %
    near(line(r, 'biga', 'instant yeast').grams, 0.0003 * F); // by hand: 0.2 % of 0.15F
    expect(r.prefermentedFlour).toBeCloseTo(35, 12); // 20 % + 15 %
    expect(build(r, 'biga').hydration).toBeCloseTo(60, 12);
  });

  it('leaves the rest for the final dough, with each pre-ferment as one line', () => {
    near(final(r, 'bread flour'), 0.65 * F); // by hand: 1 − 0.2 − 0.15
    near(final(r, 'water'), 0.41 * F); // by hand: 0.70 − 0.20 − 0.09
    near(final(r, 'instant yeast'), 0.0035 * F); // by hand: 0.004 − 0.0002 − 0.0003
    expect(r.finalDough.filter((l) => l.source === 'preferment').map((l) => l.ingredient)).toEqual(['poolish', 'biga']);
    expect(r.finalDoughHydration).toBeCloseTo((0.41 / 0.65) * 100, 10); // 63.08 %, by hand
  });
});

describe('scaleFormula: biga with two flours', () => {
  const r = scaleFormula(fixtureFormula('biga-two-flours'), catalog, { by: 'pieces', pieces: 4 });
  const F = 3000 / 1.752; // by hand: 4 × 750 g at 175.2 %

  it('takes each flour out of its own overall line', () => {
    near(r.flour, F);
    near(line(r, 'biga', 'bread flour').grams, 0.4 * F); // by hand: 80 % of 0.5F
    near(line(r, 'biga', 'whole wheat flour').grams, 0.1 * F); // by hand: 20 % of 0.5F
    near(final(r, 'bread flour'), 0.3 * F); // by hand: 0.7F − 0.4F
    near(final(r, 'whole wheat flour'), 0.2 * F); // by hand: 0.3F − 0.1F
    near(final(r, 'water'), 0.445 * F); // by hand: 0.72F − 0.275F
    near(final(r, 'fresh yeast'), 0.008 * F); // by hand: 0.01F − 0.002F
    expect(build(r, 'biga').hydration).toBeCloseTo(55, 12);
    expect(r.prefermentedFlour).toBeCloseTo(50, 12);
  });
});

describe('scaleFormula: soaker', () => {
  const r = scaleFormula(fixtureFormula('rye-soaker'), catalog, { by: 'pieces', pieces: 6 });
  const F = 6000 / 2.135; // by hand: 6 × 1 kg at 213.5 %

  it('weighs the soaker in percent of the total flour and takes it out of the final dough', () => {
    near(line(r, 'seed soak', 'cracked rye').grams, 0.2 * F); // by hand
    near(line(r, 'seed soak', 'water').grams, 0.3 * F); // by hand
    near(build(r, 'seed soak').grams, 0.6 * F); // by hand: 20 + 10 + 30 %
    near(final(r, 'water'), 0.5 * F); // by hand: 0.8F − 0.3F
    expect(final(r, 'cracked rye')).toBeUndefined(); // all of it is in the soaker
    expect(r.finalDough.find((l) => l.ingredient === 'seed soak')?.source).toBe('soaker');
    expect(r.prefermentedFlour).toBe(0); // a soaker is not fermented
    expect(r.hydration).toBeCloseTo(80, 12);
  });
});

describe('scaleFormula: enriched dough and effective hydration', () => {
  it('counts the water inside egg, butter and milk', () => {
    const r = scaleFormula(fixtureFormula('enriched'), catalog, { by: 'flour', grams: 1000 });
    near(overall(r, 'whole egg'), 500);
    expect(r.hydration).toBe(0); // no water line
    near(r.effectiveWater, 558.58); // USDA SR28 water: egg NDB 01123 76.15 %, unsalted butter 01145 17.94 %, whole milk 01077 88.13 %: 380.75 + 89.70 + 88.13 g
    expect(r.effectiveHydration).toBeCloseTo(55.858, 9); // USDA SR28 (same NDB numbers): 558.58 / 1000 = 55.858 %
  });

  it('adds the water line to the water inside other ingredients', () => {
    const f = formula({
      flour: [{ ingredient: 'bread flour', percent: 100 }],
      ingredients: [
        { ingredient: 'water', percent: 20 },
        { ingredient: 'whole milk', percent: 40 },
      ],
    });
    const r = scaleFormula(f, catalog, { by: 'flour', grams: 1000 });
    expect(r.hydration).toBeCloseTo(20, 12);
    expect(r.effectiveHydration).toBeCloseTo(20 + 40 * 0.8813, 10); // SR28 NDB 01077 whole milk 88.13 % water
  });

  it('does not count the flour\'s own moisture', () => {
    const withMoisture: Catalog = { ...catalog, 'bread flour': { ...catalog['bread flour'], water: 14 } };
    const r = scaleFormula(fixtureFormula('lean-straight'), withMoisture, { by: 'flour', grams: 1000 });
    expect(r.effectiveHydration).toBeCloseTo(65, 12);
  });
});

describe('scaleFormula: levain seeded with a mature culture', () => {
  const r = scaleFormula(fixtureFormula('levain-seed'), catalog, { by: 'pieces', pieces: 2 });
  const F = 1800 / 1.77; // by hand: 2 × 900 g at 177 %
  const P = 0.2 * F; // the levain's flour, seed flour included

  it('counts the seed\'s flour and water as the build\'s and weighs only the rest fresh', () => {
    near(line(r, 'levain', 'mature culture').grams, 0.2 * P); // 20 % of the build's flour
    expect(line(r, 'levain', 'mature culture').seed).toBe(true);
    near(line(r, 'levain', 'bread flour').grams, P); // flour in the build, seed's included
    near(line(r, 'levain', 'bread flour').weigh, P - 0.1 * P); // by hand: a 100 % culture is half flour
    near(line(r, 'levain', 'water').weigh, P - 0.1 * P); // and half water
    near(build(r, 'levain').grams, 2 * P); // fresh flour + fresh water + seed
    near(sum(build(r, 'levain').ingredients.map((l) => l.weigh)), 2 * P);
  });

  it('takes the whole build, seed included, out of the formula\'s flour and water', () => {
    near(final(r, 'bread flour'), 0.9 * F - P);
    near(final(r, 'water'), 0.75 * F - P);
    near(final(r, 'whole wheat flour'), 0.1 * F);
    expect(r.hydration).toBeCloseTo(75, 12); // the seed's water is part of the 75 %
    expect(r.prefermentedFlour).toBeCloseTo(20, 12);
    near(sum(r.finalDough.map((l) => l.grams)), 1800);
  });

  it('takes a stiff seed\'s flour out of the flour it is fed with', () => {
    const f = formula({
      flour: [
        { ingredient: 'bread flour', percent: 80 },
        { ingredient: 'whole wheat flour', percent: 20 },
      ],
      ingredients: [{ ingredient: 'water', percent: 70 }],
      preferments: [
        {
          name: 'stiff levain',
          kind: 'levain',
          share: 25,
          ingredients: [
            { ingredient: 'bread flour', percent: 80 },
            { ingredient: 'whole wheat flour', percent: 20 },
            { ingredient: 'water', percent: 60 },
            { ingredient: 'stiff culture', percent: 15 },
          ],
        },
      ],
    });
    const s = scaleFormula(f, catalog, { by: 'flour', grams: 1000 });
    const Q = 250; // 25 % of 1000 g
    // stiff culture: 50 % hydration, fed with whole wheat flour: 15 % of Q is 2/3 flour, 1/3 water (by hand)
    near(line(s, 'stiff levain', 'whole wheat flour').weigh, 0.2 * Q - 0.1 * Q);
    near(line(s, 'stiff levain', 'bread flour').weigh, 0.8 * Q);
    near(line(s, 'stiff levain', 'water').weigh, 0.6 * Q - 0.05 * Q);
  });

  it('refuses a seed that brings more flour than the build has', () => {
    const f = formula({
      flour: [{ ingredient: 'bread flour', percent: 100 }],
      ingredients: [{ ingredient: 'water', percent: 70 }],
      preferments: [
        {
          name: 'levain',
          kind: 'levain',
          share: 10,
          ingredients: [
            { ingredient: 'bread flour', percent: 100 },
            { ingredient: 'water', percent: 50 },
            { ingredient: 'mature culture', percent: 150 },
          ],
        },
      ],
    });
    expect(() => scaleFormula(f, catalog, { by: 'flour', grams: 1000 })).toThrow(/seed in "levain" brings 75\.0 g of water, more than the build's water \(50\.0 g\)/);
  });

  it('refuses a seed that is also listed in the overall formula', () => {
    const f = fixtureFormula('levain-seed');
    f.ingredients.push({ ingredient: 'mature culture', percent: 4 });
    expect(() => scaleFormula(f, catalog, { by: 'flour', grams: 1000 })).toThrow(/also in the overall formula/);
  });
});

describe('scaleFormula: what cannot be scaled', () => {
  it('names the ingredient and both amounts when the builds take more than the formula has', () => {
    const f = formula({
      flour: [{ ingredient: 'bread flour', percent: 100 }],
      ingredients: [{ ingredient: 'water', percent: 60 }],
      preferments: [{ name: 'poolish', kind: 'poolish', share: 80, ingredients: [{ ingredient: 'bread flour', percent: 100 }, { ingredient: 'water', percent: 100 }] }],
    });
    expect(() => scaleFormula(f, catalog, { by: 'flour', grams: 1000 })).toThrow(
      'inline: pre-ferments and soakers take 800.0 g of water, but the formula has only 600.0 g',
    );
  });

  it('refuses a build ingredient that is not in the overall formula', () => {
    const f = formula({
      flour: [{ ingredient: 'bread flour', percent: 100 }],
      ingredients: [{ ingredient: 'water', percent: 60 }],
      soakers: [{ name: 'soak', ingredients: [{ ingredient: 'sunflower seeds', percent: 5 }] }],
    });
    expect(() => scaleFormula(f, catalog, { by: 'flour', grams: 1000 })).toThrow(/"sunflower seeds" is in a pre-ferment or soaker but not in the overall formula/);
  });

  it('suggests the catalog when an unknown build ingredient may be a seed', () => {
    const f = formula({
      flour: [{ ingredient: 'bread flour', percent: 100 }],
      ingredients: [{ ingredient: 'water', percent: 70 }],
      preferments: [{ name: 'levain', kind: 'levain', share: 10, ingredients: [{ ingredient: 'bread flour', percent: 100 }, { ingredient: 'water', percent: 100 }, { ingredient: 'old starter', percent: 20 }] }],
    });
    expect(() => scaleFormula(f, catalog, { by: 'flour', grams: 1000 })).toThrow(/"old starter" is in a pre-ferment or soaker but not in the overall formula; if it is a levain's seed, list it in the catalog with kind culture/);
  });

  it.each([
    [{ by: 'pieces', pieces: 0 }, /pieces must be a whole number of at least 1; got 0/],
    [{ by: 'pieces', pieces: 2.5 }, /whole number/],
    [{ by: 'pieces', pieces: 3, pieceGrams: -5 }, /piece weight must be above 0 g/],
    [{ by: 'mix', grams: 0 }, /mixed dough weight must be above 0 g/],
    [{ by: 'mix', grams: Number.POSITIVE_INFINITY }, /mixed dough weight must be above 0 g/],
    [{ by: 'flour', grams: -1 }, /flour weight must be above 0 g/],
  ] as const)('refuses the target %o', (target, message) => {
    expect(() => resolveTarget(fixtureFormula('lean-straight'), target)).toThrow(ScaleError);
    expect(() => resolveTarget(fixtureFormula('lean-straight'), target)).toThrow(message);
  });

  it('refuses a loss of 100 % or more', () => {
    const f = { ...fixtureFormula('lean-straight'), loss: 100 };
    expect(() => resolveTarget(f, { by: 'pieces', pieces: 1 })).toThrow(/loss must be from 0 % to below 100 %/);
  });
});

describe('sum', () => {
  it('adds many small weights without drift', () => {
    const xs = Array.from({ length: 10000 }, () => 0.1);
    expect(sum(xs)).toBe(1000);
  });
});
