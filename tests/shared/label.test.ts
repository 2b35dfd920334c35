import { describe, expect, it } from 'vitest';
import { emphasise, ingredientStatement, LabelError, type IngredientStatement } from '#shared/label';
import type { Catalog } from '#shared/model';
import { fixtureCatalog, makeFormula } from '../fixtures/labels/catalog.ts';

const catalog = fixtureCatalog();
const labels = (es: IngredientStatement['main']) => es.map((e) => e.label);

describe('ingredientStatement: order', () => {
  // An enriched dough, flour 100 / whole milk 30 / butter 25 / whole egg 20 / sugar 12 / water 10 /
  // salt 2 / instant yeast 1.5 = 200.5 %. Shares of the mixed dough (hand-worked, percent / 200.5):
  // flour 49.88, milk 14.96, butter 12.47, egg 9.98, sugar 5.99, water 4.99, salt 1.00, yeast 0.75.
  const enriched = makeFormula(
    { 'bread flour': 100 },
    { 'whole milk': 30, 'whole egg': 20, butter: 25, sugar: 12, 'fine salt': 2, 'instant yeast': 1.5, water: 10 },
  );

  it('lists ingredients in descending order of weight in the mixed dough', () => {
    // 21 CFR 101.4(a)(1); Regulation (EU) No 1169/2011 Art. 18(1): descending order of weight
    const s = ingredientStatement(enriched, catalog, { rules: 'us' });
    expect(labels([...s.main, ...s.minor])).toEqual([
      'wheat flour', 'whole milk', 'butter', 'pasteurised whole egg', 'sugar', 'water', 'salt', 'yeast',
    ]);
    expect(s.main[0].share).toBeCloseTo((100 / 200.5) * 100, 9); // 49.875 % (hand-worked)
  });

  it('leaves out added water of no more than 5 % under EU rules, and keeps it when asked', () => {
    // Annex VII Part A: added water ≤ 5 % of the finished product need not be listed (as summarised by the University of Reading food-law pages)
    const s = ingredientStatement(enriched, catalog, { rules: 'eu' });
    expect(labels([...s.main, ...s.minor])).not.toContain('water');
    expect(s.omitted).toEqual([expect.objectContaining({ ingredient: 'water' })]);
    expect(s.omitted[0].share).toBeCloseTo((10 / 200.5) * 100, 9); // 4.988 % (hand-worked)
    const kept = ingredientStatement(enriched, catalog, { rules: 'eu', omitMinorWater: false });
    expect(labels(kept.main)).toContain('water');
  });

  it.each([
    // flour 100, water 10, milk 60, sugar 20, butter 10 = 200 %: water 5.0 % exactly (hand-worked)
    [10, 59.8 + 0.2, true],
    // water 10.2, milk 59.8 = 200 %: water 5.1 % (hand-worked)
    [10.2, 59.8, false],
  ])('treats added water at %s of 200 % as omissible: %s (EU, "no more than 5 %")', (water, milk, omitted) => {
    const f = makeFormula({ 'bread flour': 100 }, { water, 'whole milk': milk, sugar: 20, butter: 10 });
    const s = ingredientStatement(f, catalog, { rules: 'eu' });
    expect(s.omitted.length > 0).toBe(omitted);
  });

  it('merges the pre-ferment into the overall formula', () => {
    // poolish 30 % of the flour at 100 % hydration: its flour and water are part of the overall lines
    const f = makeFormula({ 'bread flour': 100 }, { water: 75, 'fine salt': 2, 'instant yeast': 0.3 }, {
      preferments: [{ name: 'poolish', kind: 'poolish', share: '30 %', ingredients: { 'bread flour': 100, water: 100, 'instant yeast': 0.1 } }],
    });
    const s = ingredientStatement(f, catalog, { rules: 'eu' });
    expect(labels([...s.main, ...s.minor])).toEqual(['wheat flour', 'water', 'salt', 'yeast']);
    expect(s.main[0].share).toBeCloseTo((100 / 177.3) * 100, 9); // 56.40 % (hand-worked)
  });

  it('merges lines that have the same name on the statement', () => {
    const f = makeFormula({ 'bread flour': 60, 'type 65 flour': 40 }, { water: 70, 'fine salt': 2 });
    const s = ingredientStatement(f, catalog, { rules: 'eu' });
    expect(s.main[0]).toMatchObject({ label: 'wheat flour', ingredients: ['bread flour', 'type 65 flour'] });
    expect(s.main[0].share).toBeCloseTo((100 / 172) * 100, 9);
  });

  it('lists the flour a seed culture is fed with when the formula has no other', () => {
    // F = 1000 g: levain flour 200 g, rye culture 20 % = 40 g at 100 % hydration = 20 g rye flour + 20 g water.
    // Mixed dough 1728 g: wheat flour 980, water 700, rye flour 20, salt 18, yeast 10 (hand-worked).
    const f = makeFormula({ 'bread flour': 100 }, { water: 70, 'fine salt': 1.8, 'instant yeast': 1 }, {
      preferments: [{ name: 'levain', kind: 'levain', share: '20 %', ingredients: { 'bread flour': 100, water: 100, 'rye culture': 20 } }],
    });
    const s = ingredientStatement(f, catalog, { rules: 'eu' });
    expect(labels([...s.main, ...s.minor])).toEqual(['wheat flour', 'water', 'rye flour', 'salt', 'yeast']);
    expect(s.main[0].share).toBeCloseTo((980 / 1728) * 100, 9);
    expect(s.minor[0].share).toBeCloseTo((20 / 1728) * 100, 9);
    expect(s.text).toContain('RYE flour');
  });

  it('counts a seed culture\'s flour as the flour it is fed with when the build uses another', () => {
    // F = 1000 g: bread flour 800, rye flour 200, water 700, salt 18 = 1718 g mixed. The levain (20 % = 200 g of
    // bread flour) is seeded with 40 g of rye culture at 100 %: 20 g of its flour is rye, so wheat 780 g, rye 220 g (hand-worked).
    const f = makeFormula({ 'bread flour': 80, 'rye flour': 20 }, { water: 70, 'fine salt': 1.8 }, {
      preferments: [{ name: 'levain', kind: 'levain', share: '20 %', ingredients: { 'bread flour': 100, water: 100, 'rye culture': 20 } }],
    });
    const s = ingredientStatement(f, catalog, { rules: 'eu' });
    expect(labels(s.main)).toEqual(['wheat flour', 'water', 'rye flour']);
    expect(s.main[0].share).toBeCloseTo((780 / 1718) * 100, 9);
    expect(s.main[2].share).toBeCloseTo((220 / 1718) * 100, 9);
  });

  it('ranks water by what is left after the bake loss under EU rules, and by the weight added under US rules', () => {
    // F = 1000 g: flour 1000, water 300, whole milk 280, butter 100, salt 20 = 1700 g mixed.
    // Bake loss 10 % = 170 g, taken as water: water 130 g of 1530 g baked = 8.50 %; milk 280 / 1530 = 18.30 % (hand-worked)
    const f = makeFormula({ 'bread flour': 100 }, { water: 30, 'whole milk': 28, butter: 10, 'fine salt': 2 });
    expect(labels(ingredientStatement(f, catalog, { rules: 'eu' }).main)).toEqual(['wheat flour', 'water', 'whole milk', 'butter']);
    const baked = ingredientStatement(f, catalog, { rules: 'eu', bakeLoss: 10 });
    expect(labels(baked.main)).toEqual(['wheat flour', 'whole milk', 'water', 'butter']);
    expect(baked.main[2].share).toBeCloseTo((130 / 1530) * 100, 9);
    expect(baked.main[1].share).toBeCloseTo((280 / 1530) * 100, 9);
    expect(baked.basis).toBe('baked weight');
    expect(labels(ingredientStatement(f, catalog, { rules: 'us', bakeLoss: 10 }).main)).toEqual(['wheat flour', 'water', 'whole milk', 'butter']);
  });
});

describe('ingredientStatement: the 2 % rules', () => {
  const at = (salt: number, water: number) => makeFormula({ 'bread flour': 100 }, { water, 'fine salt': salt, sugar: 6 });

  it('moves salt at exactly 2.0 % to the end group under US rules but keeps it in weight order under EU rules', () => {
    // flour 100, water 90, salt 4, sugar 6 = 200 %: salt 2.0 % (hand-worked).
    // US 21 CFR 101.4(a)(2) "2 percent or less"; EU Annex VII "less than 2 %" (the boundary: 2.0 % moves under US rules, stays under EU rules)
    const f = at(4, 90);
    const us = ingredientStatement(f, catalog, { rules: 'us' });
    expect(labels(us.minor)).toEqual(['salt']);
    expect(us.minorPhrase).toBe('Contains 2% or less of:');
    expect(us.text).toContain('Contains 2% or less of: salt.');
    const eu = ingredientStatement(f, catalog, { rules: 'eu' });
    expect(labels(eu.main)).toEqual(['wheat flour', 'water', 'sugar', 'salt']);
    expect(eu.minor).toEqual([]);
  });

  it('lets salt at 1.99 % move under both rules', () => {
    // flour 100, water 90.02, salt 3.98, sugar 6 = 200 %: salt 1.99 % (hand-worked); below 2 % under both 21 CFR 101.4(a)(2) and EU Annex VII
    const f = at(3.98, 90.02);
    expect(labels(ingredientStatement(f, catalog, { rules: 'us' }).minor)).toEqual(['salt']);
    expect(labels(ingredientStatement(f, catalog, { rules: 'eu' }).minor)).toEqual(['salt']);
  });

  // flour 100, water 91.8, sugar 3.2, salt 3, instant yeast 2 = 200 %: sugar 1.6 %, salt 1.5 %, yeast 1.0 % (hand-worked)
  const small = makeFormula({ 'bread flour': 100 }, { water: 91.8, sugar: 3.2, 'fine salt': 3, 'instant yeast': 2 });

  it.each([
    // 21 CFR 101.4(a)(2): threshold 2, 1.5, 1 or 0.5 percent; no ingredient under the phrase above it
    [2, ['sugar', 'salt', 'yeast'], 'Contains 2% or less of:'],
    [1.5, ['salt', 'yeast'], 'Contains 1.5% or less of:'], // sugar at 1.6 % must not sit under "1.5 percent or less"
    [1, ['yeast'], 'Contains 1% or less of:'],
    [0.5, [], null],
  ] as const)('with the US threshold %s puts %j under the phrase %j', (threshold, minor, phrase) => {
    const s = ingredientStatement(small, catalog, { rules: 'us', threshold });
    expect(labels(s.minor)).toEqual(minor);
    expect(s.minorPhrase).toBe(phrase);
    for (const e of s.minor) expect(e.share).toBeLessThanOrEqual(threshold + 1e-9);
    if (threshold === 1.5) expect(labels(s.main)).toContain('sugar');
  });

  it('keeps every ingredient in weight order when grouping is turned off', () => {
    const s = ingredientStatement(small, catalog, { rules: 'us', groupMinor: false });
    expect(s.minor).toEqual([]);
    expect(s.minorPhrase).toBeNull();
  });

  it('refuses a US threshold the rule does not allow', () => {
    expect(() => ingredientStatement(small, catalog, { rules: 'us', threshold: 3 as never })).toThrow(LabelError);
  });

  it('refuses a bake loss outside 0 to below 100 %', () => {
    expect(() => ingredientStatement(small, catalog, { rules: 'eu', bakeLoss: 100 })).toThrow(LabelError);
  });
});

describe('ingredientStatement: allergens and compound ingredients', () => {
  it('emphasises allergens in UPPER CASE in text and with <strong> in HTML, and adds the US "Contains:" statement', () => {
    const f = makeFormula({ 'bread flour': 100 }, { 'whole milk': 30, 'whole egg': 20, butter: 25, sugar: 12, 'fine salt': 2, 'instant yeast': 1.5, water: 10 });
    const us = ingredientStatement(f, catalog, { rules: 'us' });
    expect(us.text).toBe(
      'Ingredients: WHEAT flour, whole MILK, butter (MILK), pasteurised whole EGG, sugar, water. Contains 2% or less of: salt, yeast.\n' +
        'Contains: MILK, EGG, WHEAT.\n',
    );
    expect(us.contains).toEqual(['milk', 'egg', 'wheat']);
    expect(us.html).toContain('<strong>wheat</strong> flour, whole <strong>milk</strong>, butter (<strong>milk</strong>)');
    expect(us.html).toContain('<p class="contains"><span class="heading">Contains:</span> <strong>milk</strong>, <strong>egg</strong>, <strong>wheat</strong>.</p>');
    const eu = ingredientStatement(f, catalog, { rules: 'eu' });
    expect(eu.text).toBe('Ingredients: WHEAT flour, whole MILK, butter (MILK), pasteurised whole EGG, sugar, salt, yeast.\n');
    expect(eu.contains).toBeNull();
  });

  it('emphasises rye and mussels under EU rules only, crustaceans and sesame under both', () => {
    // Regulation (EU) No 1169/2011 Annex II and FALCPA/FASTER Act: rye and molluscs EU only; crustaceans and sesame both
    const f = makeFormula({ 'bread flour': 70, 'rye flour': 30 }, { water: 70, 'smoked mussels': 10, 'shrimp paste': 4, 'sesame seeds': 5, 'fine salt': 2 });
    const eu = ingredientStatement(f, catalog, { rules: 'eu' });
    expect(eu.text).toContain('RYE flour');
    expect(eu.text).toContain('smoked MUSSELS');
    expect(eu.text).toContain('SHRIMP paste');
    expect(eu.text).toContain('SESAME seeds');
    const us = ingredientStatement(f, catalog, { rules: 'us' });
    expect(us.text).toContain('rye flour');
    expect(us.text).toContain('smoked mussels');
    expect(us.text).toContain('SHRIMP paste');
    expect(us.text).toContain('SESAME seeds');
    expect(us.contains).toEqual(['crustacean shellfish', 'wheat', 'sesame']);
  });

  it('declares spelt as spelt under EU rules and as wheat under US rules', () => {
    // EU Annex II names the cereal; US: spelt is a wheat (Triticum), from memory (FDA allergen guidance)
    const f = makeFormula({ 'spelt flour': 100 }, { water: 65, 'fine salt': 2 });
    expect(ingredientStatement(f, catalog, { rules: 'eu' }).text).toContain('SPELT flour');
    const us = ingredientStatement(f, catalog, { rules: 'us' });
    expect(us.text).toContain('spelt flour (WHEAT)');
    expect(us.contains).toEqual(['wheat']);
  });

  it('names the nut in the US "Contains:" statement and under EU rules', () => {
    const f = makeFormula({ 'bread flour': 100 }, { water: 65, hazelnuts: 15, 'walnut pieces': 10, 'fine salt': 2 });
    expect(ingredientStatement(f, catalog, { rules: 'us' }).contains).toEqual(['hazelnuts', 'walnuts', 'wheat']);
    expect(ingredientStatement(f, catalog, { rules: 'eu' }).text).toContain('roasted HAZELNUTS, WALNUT pieces');
  });

  it('lists a compound ingredient with its components in brackets, allergens emphasised inside', () => {
    const f = makeFormula({ 'bread flour': 100 }, { water: 65, 'dark chocolate chips': 20, 'seed mix': 8, 'fine salt': 2 });
    const s = ingredientStatement(f, catalog, { rules: 'eu' });
    expect(s.text).toBe(
      'Ingredients: WHEAT flour, water, dark chocolate chips (cocoa mass, sugar, cocoa butter, emulsifier (SOYA lecithin)), ' +
        'seed mix (sunflower seeds, SESAME seeds, linseed), salt.\n',
    );
    expect(s.main[2].components.map((c) => c.label)).toEqual(['cocoa mass', 'sugar', 'cocoa butter', 'emulsifier (soya lecithin)']);
  });

  it('emphasises a compound\'s allergen in an unlisted component\'s name, or names it in brackets', () => {
    const c: Catalog = {
      ...catalog,
      'spice mix': { name: 'spice mix', kind: 'other', water: 0, allergens: ['mustard', 'celery'], components: ['caraway', 'mustard seed'] },
    };
    const f = makeFormula({ 'bread flour': 100 }, { water: 65, 'spice mix': 3 });
    const s = ingredientStatement(f, c, { rules: 'eu' });
    expect(s.text).toContain('spice mix (CELERY) (caraway, MUSTARD seed)');
    expect(s.unlisted).toEqual(['caraway', 'mustard seed']);
  });

  it('prints "may contain" names under each rule', () => {
    const f = makeFormula({ 'bread flour': 100 }, { water: 65, 'fine salt': 2 }, { may_contain: ['sesame', 'hazelnuts', 'lupin'] });
    expect(ingredientStatement(f, catalog, { rules: 'eu' }).mayContain).toEqual(['hazelnuts', 'sesame seeds', 'lupin']);
    const us = ingredientStatement(f, catalog, { rules: 'us' });
    expect(us.mayContain).toEqual(['hazelnuts', 'sesame']);
    expect(us.text).toContain('May contain: HAZELNUTS, SESAME.');
  });

  it('escapes names in HTML and states the caution', () => {
    const c: Catalog = { ...catalog, 'house spice': { name: 'house spice', kind: 'other', water: 0, allergens: [], label: 'salt & "pepper" <mix>' } };
    const f = makeFormula({ 'bread flour': 100 }, { water: 65, 'house spice': 3 });
    const s = ingredientStatement(f, c, { rules: 'eu' });
    expect(s.html).toContain('salt &amp; &quot;pepper&quot; &lt;mix&gt;');
    expect(s.html).toContain('does not replace, the bakery&#39;s own labelling review under local law');
    expect(s.caution).toMatch(/supports, and does not replace/);
  });
});

describe('emphasise', () => {
  it.each([
    ['buckwheat flour', ['wheat'], 'buckwheat flour', false], // whole words only
    ['oat flakes', ['oats'], '[oat] flakes', true],
    ['soybean oil', ['soybeans'], '[soybean] oil', true],
    ['wholemeal spelt flour', ['spelt'], 'wholemeal [spelt] flour', true],
    ['Brazil nuts', ['brazil-nuts'], '[Brazil nuts]', true],
  ] as const)('emphasises %j for %j as %j', (text, codes, expected, found) => {
    const r = emphasise(text, [...codes], 'eu');
    expect(r.segments.map((s) => (s.strong ? `[${s.text}]` : s.text)).join('')).toBe(expected);
    expect(r.found.size > 0).toBe(found);
  });
});
