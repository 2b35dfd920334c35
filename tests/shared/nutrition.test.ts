import { readFileSync } from 'node:fs';
import { describe, expect, it } from 'vitest';
import { checkFileText } from '#shared/check/check-file';
import { finishAmounts } from '#shared/finishes';
import { ingredientStatement } from '#shared/label';
import { normalizeCatalog, normalizeFormula, type Catalog, type Formula } from '#shared/model';
import {
  energyOf, euText, nutritionDeclaration, roundEu, roundUsCalories, roundUsFat, roundUsGrams, roundUsSodium, SODIUM_IN_SALT, usServing,
  type NutritionDeclaration,
} from '#shared/nutrition';
import { parseCatalogText, parseFormulaText } from '#shared/parse';
import { bakeLossOf } from '#shared/product';
import type { CatalogFile, FormulaFile } from '#shared/schema/shapes';

const EU_GUIDANCE =
  'European Commission, Guidance document for competent authorities for the control of compliance with EU legislation on ' +
  'nutrition labelling: setting of tolerances for nutrient values declared on a label (December 2012), section 5, rounding';

describe(`roundEu: ${EU_GUIDANCE}`, () => {
  // EU_GUIDANCE rounding table: energy to 1 kJ/kcal; fat, carbohydrate, sugars, protein, fibre:
  // ≥ 10 g to 1 g, < 10 g and > 0.5 g to 0.1 g, ≤ 0.5 g "0 g" or "<0.5 g"; saturates: ≥ 10 g to 1 g,
  // < 10 g and > 0.1 g to 0.1 g, ≤ 0.1 g "0 g" or "<0.1 g"; salt: ≥ 1 g to 0.1 g, < 1 g and > 0.0125 g
  // to 0.01 g, ≤ 0.0125 g "0 g" or "<0.01 g".
  it.each([
    ['energyKj', 1099.5, 1100, '1100 kJ'],
    ['energyKcal', 260.46, 260, '260 kcal'],
    ['fat', 12.5, 13, '13 g'],
    ['fat', 10, 10, '10 g'],
    ['fat', 9.96, 10, '10 g'],
    ['fat', 4.902, 4.9, '4.9 g'],
    ['fat', 2.45, 2.5, '2.5 g'],
    ['fat', 0.51, 0.5, '0.5 g'],
    ['fat', 0.5, 0, '<0.5 g'],
    ['sugars', 0.196, 0, '<0.5 g'],
    ['protein', 0, 0, '0 g'],
    ['saturates', 10.4, 10, '10 g'],
    ['saturates', 0.7124, 0.7, '0.7 g'],
    ['saturates', 0.11, 0.1, '0.1 g'],
    ['saturates', 0.1, 0, '<0.1 g'],
    ['salt', 1.2888, 1.3, '1.3 g'],
    ['salt', 0.786, 0.79, '0.79 g'],
    ['salt', 0.013, 0.01, '0.01 g'],
    ['salt', 0.0125, 0, '<0.01 g'],
  ] as const)('rounds %s %s to %s ("%s")', (key, x, rounded, text) => {
    expect(roundEu(key, x)).toBe(rounded);
    expect(euText(key, x)).toBe(text);
  });
});

describe('US rounding by 21 CFR 101.9(c)', () => {
  it.each([
    // (c)(1): < 5 cal as 0; ≤ 50 cal to 5; > 50 cal to 10
    [4.9, 0], [5, 5], [47.4, 45], [47.5, 50], [50, 50], [134.5, 130], [135, 140],
  ])('calories %s → %s ((c)(1))', (x, r) => expect(roundUsCalories(x)).toBe(r));
  it.each([
    // (c)(2) and (c)(2)(i): fat and saturated fat < 0.5 g as 0; < 5 g to 0.5 g; ≥ 5 g to 1 g
    [0.49, 0], [0.5, 0.5], [2.5, 2.5], [2.74, 2.5], [2.75, 3], [4.9, 5], [5.4, 5], [5.5, 6],
  ])('fat %s g → %s g ((c)(2))', (x, r) => expect(roundUsFat(x)).toBe(r));
  it.each([
    // (c)(4): sodium < 5 mg as 0; 5 to 140 mg to 5 mg; > 140 mg to 10 mg
    [4.9, 0], [5, 5], [137.4, 135], [140, 140], [262.9, 260], [265, 270],
  ])('sodium %s mg → %s mg ((c)(4))', (x, r) => expect(roundUsSodium(x)).toBe(r));
  it.each([
    // (c)(6), (c)(6)(i)-(iii), (c)(7): carbohydrate, fibre, sugars, protein < 0.5 g as 0, else to 1 g
    [0.49, 0], [0.5, 1], [0.8333, 1], [23.5, 24], [24.49, 24],
  ])('grams %s → %s ((c)(6), (c)(7))', (x, r) => expect(roundUsGrams(x)).toBe(r));
});

describe('energyOf', () => {
  it('uses the Regulation (EU) No 1169/2011 Annex XIV factors under EU rules', () => {
    // Annex XIV: fat 37 kJ / 9 kcal, carbohydrate 17 / 4, protein 17 / 4, fibre 8 / 2 per gram.
    // 10 g fat, 20 g carbohydrate, 5 g fibre, 8 g protein: 370 + 340 + 40 + 136 = 886 kJ; 90 + 80 + 10 + 32 = 212 kcal (hand-worked)
    expect(energyOf({ fat: 10, carbohydrate: 20, fibre: 5, protein: 8 }, 'eu')).toEqual({ kj: 886, kcal: 212 });
  });
  it('uses 4, 4 and 9 calories per gram of protein, total carbohydrate and fat under US rules (21 CFR 101.9(c)(1)(i)(B))', () => {
    // 10 g fat, 25 g total carbohydrate (fibre included), 8 g protein: 90 + 100 + 32 = 222 kcal (hand-worked)
    expect(energyOf({ fat: 10, carbohydrate: 25, fibre: 5, protein: 8 }, 'us').kcal).toBe(222);
  });
});

describe('SODIUM_IN_SALT', () => {
  it('is the mass fraction of sodium in NaCl from the standard atomic weights', () => {
    // IUPAC standard atomic weights: Na 22.98976928, Cl 35.453 (abridged 35.45): 22.990 / 58.443 = 0.39337
    expect(SODIUM_IN_SALT).toBeCloseTo(0.39337, 5);
  });
});

describe('usServing (21 CFR 101.9(b)(2), reference amount 50 g for breads and rolls, 21 CFR 101.12(b) Table 2)', () => {
  it.each([
    [20, 3, 1, '3 pieces (60 g)'], // ≤ 50 % of 50 g: the whole pieces closest to 50 g ((b)(2)(i)(A))
    [30, 2, 1, '2 pieces (60 g)'], // 50-67 %: one or two; two is nearer 50 g ((b)(2)(i)(B))
    [75, 1, 1, '1 piece (75 g)'], // 67-200 %: one piece ((b)(2)(i)(C))
    [765, 1, 15, '1/15 of a piece (51 g)'], // a large piece: the fraction nearest 50 g; 15 = 5 × 3 ((b)(2)(ii))
  ])('a %s g piece: %s piece(s) at 1/%s: %s', (grams, pieces, fraction, text) => {
    const s = usServing(grams);
    expect([s.pieces, s.fraction, s.text]).toEqual([pieces, fraction, text]);
  });
});

// A catalog with round values, so the whole declaration can be worked by hand.
const handCatalog: Catalog = normalizeCatalog({
  'bread flour': {
    kind: 'flour', allergens: ['wheat'], label: 'wheat flour',
    nutrients: { fat: 1.5, saturates: 0.25, carbohydrate: 72, sugars: 0.3, fibre: 2.5, protein: 12, sodium_mg: 2, source: 'test values' },
  },
  water: { kind: 'water' },
  'fine salt': { kind: 'salt', label: 'salt' },
  'olive oil': {
    kind: 'fat', label: 'olive oil',
    nutrients: { fat: 100, saturates: 14, carbohydrate: 0, sugars: 0, fibre: 0, protein: 0, sodium_mg: 0, source: 'test values' },
  },
  rosemary: { kind: 'inclusion' },
} satisfies CatalogFile);

const handFormula = (extra: Partial<FormulaFile> = {}): Formula =>
  normalizeFormula({
    id: 'oil-loaf', title: 'Oil loaf', status: 'active', category: 'lean',
    yield: { pieces: 1, piece: '850 g' }, bake_loss: '10 %',
    flour: { 'bread flour': 100 }, ingredients: { water: 62, 'fine salt': 2, 'olive oil': 6 },
    ...extra,
  });

describe('nutritionDeclaration: a whole formula worked by hand', () => {
  // flour 100 + water 62 + salt 2 + oil 6 = 170 %. One 850 g piece: flour 500 g, water 310 g, salt 10 g, oil 30 g.
  // Bake loss 10 % = 85 g of water: 765 g as sold.
  // Per piece: fat 500 × 1.5 % + 30 = 37.5 g; saturates 1.25 + 4.2 = 5.45 g; total carbohydrate 360 g;
  // sugars 1.5 g; fibre 12.5 g; protein 60 g; sodium 10 mg + 10 g × 0.39337 = 3943.7 mg; salt × 2.5 = 9.859 g.
  // EU carbohydrate 360 − 12.5 = 347.5 g. Energy (Annex XIV): 37.5 × 37 + 347.5 × 17 + 12.5 × 8 + 60 × 17 = 8415 kJ;
  // 37.5 × 9 + 347.5 × 4 + 12.5 × 2 + 60 × 4 = 1992.5 kcal. Per 100 g: divide by 7.65.
  const eu = nutritionDeclaration(handFormula(), handCatalog, { rules: 'eu' });
  const d = (eu as { declaration: NutritionDeclaration }).declaration;

  it('sums the ingredients per piece and per 100 g of the baked product', () => {
    expect(eu.ok).toBe(true);
    expect(d.piece.bakedGrams).toBeCloseTo(765, 9);
    const salt = ((10 + 10_000 * SODIUM_IN_SALT) * 2.5) / 1000;
    const perPiece = { energyKj: 8415, energyKcal: 1992.5, fat: 37.5, saturates: 5.45, carbohydrate: 347.5, sugars: 1.5, fibre: 12.5, protein: 60, salt };
    for (const [k, v] of Object.entries(perPiece)) {
      expect(d.perPiece[k as keyof typeof perPiece], k).toBeCloseTo(v, 9);
      expect(d.per100g[k as keyof typeof perPiece], k).toBeCloseTo(v / 7.65, 9);
    }
    expect(d.per100g.energyKj).toBeCloseTo(1100, 9); // 8415 / 7.65
  });

  it('rounds per 100 g as the EU guidance says', () => {
    // 1100 kJ, 260.46 kcal, fat 4.902, saturates 0.7124, carbohydrate 45.42, sugars 0.196, fibre 1.634, protein 7.843, salt 1.289
    expect(d.rounded).toEqual({ energyKj: 1100, energyKcal: 260, fat: 4.9, saturates: 0.7, carbohydrate: 45, sugars: 0, fibre: 1.6, protein: 7.8, salt: 1.3 });
    expect(d.lines.map((l) => `${l.label}: ${l.value}`)).toEqual([
      'Energy: 1100 kJ / 260 kcal', 'Fat: 4.9 g', 'of which saturates: 0.7 g', 'Carbohydrate: 45 g', 'of which sugars: <0.5 g',
      'Fibre: 1.6 g', 'Protein: 7.8 g', 'Salt: 1.3 g',
    ]);
  });

  it('gives US Nutrition Facts per serving with percent Daily Values', () => {
    const us = nutritionDeclaration(handFormula(), handCatalog, { rules: 'us' });
    if (!us.ok) throw new Error(us.message);
    const s = us.declaration.serving!;
    // 765 g piece: 1/15 (51 g). Per serving: fat 2.5 g, saturates 0.363 g, sodium 262.9 mg, carbohydrate 24 g,
    // fibre 0.833 g, sugars 0.1 g, protein 4 g; calories (37.5 × 9 + 360 × 4 + 60 × 4) / 15 = 134.5.
    expect(s.grams).toBeCloseTo(51, 9);
    expect(s.perServing.energyKcal).toBeCloseTo(134.5, 9);
    expect(s.declared).toEqual({ calories: 130, fat: 2.5, saturates: 0, sodiumMg: 260, carbohydrate: 24, fibre: 1, sugars: 0, addedSugars: 0, protein: 4 });
    // 21 CFR 101.9(c)(9) DRVs: fat 78 g, saturated fat 20 g, sodium 2300 mg, carbohydrate 275 g, fibre 28 g, added sugars 50 g.
    // 2.5/78 = 3.2 %, 260/2300 = 11.3 %, 24/275 = 8.7 %, 1/28 = 3.6 % (hand-worked, from the declared amounts)
    expect(s.dailyValuePercent).toEqual({ fat: 3, saturates: 0, sodiumMg: 11, carbohydrate: 9, fibre: 4, addedSugars: 0 });
  });

  it('gives no declaration, naming what is missing, when an ingredient has no values', () => {
    const r = nutritionDeclaration(handFormula({ ingredients: { water: 62, 'fine salt': 2, 'olive oil': 6, rosemary: 0.5 } }), handCatalog, { rules: 'eu' });
    expect(r.ok).toBe(false);
    if (!r.ok) {
      expect(r.missing).toEqual(['rosemary']);
      expect(r.message).toMatch(/no nutrients for "rosemary"/);
    }
  });

  it('counts the finishes on each piece: tray oil adds to the piece as sold', () => {
    const f = handFormula({ finishes: [{ ingredient: 'olive oil', per_piece: '35 g', use: 'tray' }] });
    const r = nutritionDeclaration(f, handCatalog, { rules: 'eu' });
    if (!r.ok) throw new Error(r.message);
    expect(r.declaration.piece.bakedGrams).toBeCloseTo(800, 9); // 765 + 35
    expect(r.declaration.perPiece.fat).toBeCloseTo(72.5, 9); // 37.5 + 35
  });
});

describe('bakeLossOf', () => {
  it('takes a given figure first, then the formula\'s, then the category default (common practice)', () => {
    expect(bakeLossOf(handFormula(), 15)).toMatchObject({ percent: 15, source: 'given' });
    expect(bakeLossOf(handFormula())).toMatchObject({ percent: 10, source: 'formula' });
    expect(bakeLossOf({ category: 'rolls' })).toMatchObject({ percent: 16, source: 'category default' });
    expect(bakeLossOf({ category: 'flatbread' }).note).toMatch(/common practice/);
  });
});

describe('ingredientStatement after the bake', () => {
  it('ranks added water by its weight in the finished product for a wet dough (EU), by the weight added (US)', () => {
    // Regulation (EU) No 1169/2011 Annex VII Part A point 1: added water is listed by its weight in the finished
    // product, worked out as the finished product less the other ingredients used.
    // flour 100, water 75, whole milk 50, salt 2 = 227 %; bake loss 12 % = 27.24: water 75 − 27.24 = 47.76 < milk 50 (hand-worked)
    const catalog = normalizeCatalog({ ...handCatalogFile(), 'whole milk': { kind: 'dairy', allergens: ['milk'], label: 'whole milk' } });
    const f = normalizeFormula({
      id: 'wet', title: 'Wet loaf', status: 'active', category: 'lean', yield: { pieces: 1, piece: '1135 g' }, bake_loss: '12 %',
      flour: { 'bread flour': 100 }, ingredients: { water: 75, 'whole milk': 50, 'fine salt': 2 },
    });
    const eu = ingredientStatement(f, catalog, { rules: 'eu' });
    expect(eu.main.map((e) => e.label)).toEqual(['wheat flour', 'whole milk', 'water']);
    // one 1135 g piece = 5 × 227: baked 1135 × 0.88 = 998.8 g; water 375 − 136.2 = 238.8 g = 23.91 %
    expect(eu.main[2].share).toBeCloseTo((238.8 / 998.8) * 100, 9);
    expect(ingredientStatement(f, catalog, { rules: 'eu', bakeLoss: 0 }).main.map((e) => e.label)).toEqual(['wheat flour', 'water', 'whole milk']);
    expect(ingredientStatement(f, catalog, { rules: 'us' }).main.map((e) => e.label)).toEqual(['wheat flour', 'water', 'whole milk']);
  });
});

function handCatalogFile(): CatalogFile {
  return {
    'bread flour': { kind: 'flour', allergens: ['wheat'], label: 'wheat flour' },
    water: { kind: 'water' },
    'fine salt': { kind: 'salt', label: 'salt' },
  };
}

describe('the demo milk buns', () => {
  const read = (p: string) => readFileSync(new URL(`../../formulas/${p}`, import.meta.url), 'utf8');
  const catalog = (() => {
    const c = parseCatalogText(read('ingredients.yaml'), 'ingredients.yaml');
    if (!c.ok) throw new Error('demo catalog');
    return c.value;
  })();
  const buns = (() => {
    const f = parseFormulaText(read('tidewater-milk-buns.yaml'), 'tidewater-milk-buns.yaml');
    if (!f.ok) throw new Error('demo buns');
    return f.value;
  })();

  it('declare the quantity of milk, named in the title, as used per 100 g of the baked bun (EU)', () => {
    // Regulation (EU) No 1169/2011 Art. 22(1)(a) (named in the name of the food), Annex VIII point 4(a)
    // (a product that loses moisture: the quantity used, related to the finished product).
    // flour 100, milk 45, egg 20, butter 15, sugar 10, salt 1.8, yeast 3.5 = 195.3 %. One 80 g bun: milk 80 × 45 / 195.3 = 18.433 g;
    // baked 80 × 0.9 + 3 g egg wash = 75 g; 18.433 / 75 = 24.58 % → "25 %" (hand-worked)
    const s = ingredientStatement(buns, catalog, { rules: 'eu' });
    const milk = s.main.find((e) => e.ingredients.includes('whole milk'))!;
    expect(milk.quid).toBeCloseTo(((80 * 45) / 195.3 / 75) * 100, 9);
    expect(s.text).toContain('whole MILK (25 %)');
    // butter is not named by "milk buns" though it is made from milk; US rules have no QUID
    expect(s.main.filter((e) => e.quid !== null).map((e) => e.label)).toEqual(['whole milk']);
    expect(ingredientStatement(buns, catalog, { rules: 'us' }).text).not.toMatch(/%\)/);
  });

  it('count the egg wash in the statement and the allergens', () => {
    const s = ingredientStatement(buns, catalog, { rules: 'eu' });
    const egg = s.main.find((e) => e.ingredients.includes('whole egg'))!;
    // egg 80 × 20 / 195.3 + 3 g wash = 11.193 g of 75 g (hand-worked)
    expect(egg.share).toBeCloseTo((((80 * 20) / 195.3 + 3) / 75) * 100, 9);
    expect(s.allergens.codes).toContain('eggs');
  });

  it('have a nutrition declaration from the catalog', () => {
    const r = nutritionDeclaration(buns, catalog, { rules: 'eu' });
    expect(r.ok).toBe(true);
  });
});

describe('finishAmounts', () => {
  it('gives each finish for N pieces', () => {
    const f = handFormula({ finishes: [{ ingredient: 'olive oil', per_piece: '35 g', use: 'tray' }, { ingredient: 'fine salt', per_piece: '2.5 g', use: 'topping', note: 'flakes' }] });
    expect(finishAmounts(f, 24)).toEqual([
      { ingredient: 'olive oil', use: 'tray', perPiece: 35, grams: 840 },
      { ingredient: 'fine salt', use: 'topping', perPiece: 2.5, grams: 60, note: 'flakes' },
    ]);
    expect(() => finishAmounts(f, 1.5)).toThrow(RangeError);
  });
});

describe('checks of finishes, bake loss and nutrients', () => {
  const catalogText = `bread flour: { kind: flour, nutrients: { fat: 1.5, saturates: 3, carbohydrate: 72, sugars: 0.3, fibre: 2.5, protein: 12, sodium_mg: 2, source: test } }
water: { kind: water }
fine salt: { kind: salt }
`;
  it('reports saturates above fat at the value', () => {
    const r = checkFileText({ kind: 'catalog', file: 'ingredients.yaml', text: catalogText });
    expect(r.findings.map((f) => `${f.line}:${f.col} ${f.severity} ${f.message}`)).toEqual([
      expect.stringMatching(/^1:\d+ error "bread flour" has 3 g saturates in 1.5 g fat/),
    ]);
  });

  it('reports an unknown finish and an impossible bake loss where they are written', () => {
    const c = parseCatalogText(catalogText.replace('saturates: 3', 'saturates: 0.2'), 'ingredients.yaml');
    if (!c.ok) throw new Error('catalog');
    const text = `id: loaf
title: Loaf
status: active
category: lean
yield: { pieces: 10, piece: 500 g }
bake_loss: 100 %
flour:
  bread flour: 100
ingredients:
  water: 70
  fine salt: 2
finishes:
  - { ingredient: sesame seed, per_piece: 2 g, use: topping }
`;
    const r = checkFileText({ kind: 'formula', file: 'loaf.yaml', text, catalog: c.value });
    const lines = r.findings.map((f) => `${f.line} ${f.severity} ${f.message}`);
    expect(lines).toContainEqual(expect.stringMatching(/^6 error bake_loss is 100 %/));
    expect(lines).toContainEqual(expect.stringMatching(/^13 error unknown ingredient "sesame seed" in finish 1/));
  });
});
