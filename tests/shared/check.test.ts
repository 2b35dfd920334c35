import { readdirSync, readFileSync } from 'node:fs';
import { describe, expect, it } from 'vitest';
import { checkFileText, fileStem, type CheckRequest } from '#shared/check/check-file';
import { editDistance, nearestName } from '#shared/check/suggest';
import { parseCatalogText, type Finding } from '#shared/parse';
import type { Catalog } from '#shared/model';

const FIXTURES = new URL('../fixtures/check/', import.meta.url);
const fixture = (name: string) => readFileSync(new URL(name, FIXTURES), 'utf8');

function fixtureCatalog(): Catalog {
  const c = parseCatalogText(fixture('ingredients.yaml'), 'ingredients.yaml');
  if (!c.ok) throw new Error('the fixture catalog must parse');
  return c.value;
}
const catalog = fixtureCatalog();

function checkFormula(file: string, text: string, cat: Catalog | null = catalog): Finding[] {
  return checkFileText({ kind: 'formula', file, text, catalog: cat }).findings;
}
const lines = (fs: Finding[]) => fs.map((f) => `${f.line}:${f.col} ${f.severity} ${f.message}`);

/** A valid formula; `edit` changes it line by line for one broken case. */
const BASE = `id: loaf
title: Test loaf
status: active
category: lean
yield: { pieces: 10, piece: 500 g }
loss: 2 %
dough_temperature: 25 °C
flour:
  bread flour: 100
ingredients:
  water: 70
  fine salt: 2
  instant yeast: 0.5
`;
const withLines = (extra: string, base = BASE) => base + extra;

describe('checkFileText on each class of broken formula file', () => {
  it.each([
    ['bad-yaml.yaml', ['6:1 error not valid YAML: Flow map in block collection must be sufficiently indented and end with a }']],
    ['duplicate-key.yaml', ['13:3 error duplicate key "water": it appears twice in the same block; keep one']],
    ['empty.yaml', ['1:1 error the file is empty']],
    ['binary.yaml', ['1:1 error this is not a text file (binary content)']],
    [
      'unknown-field.yaml',
      [
        '8:1 error unknown field "hydratoin" in the file (fields here: id, title, status, category, description, tags, yield, loss, bake_loss, dough_temperature, bassinage, flour, ingredients, preferments, soakers, process, finishes, may_contain, notes)',
      ],
    ],
    ['bad-unit.yaml', ['5:29 error yield.piece is "320 grams": unknown unit "grams"; write a weight as a number and g, kg, oz or lb, e.g. "320 g"']],
    ['flours-99.yaml', ["8:1 error the flours sum to 99 %; in baker's percent they must sum to 100 %"]],
    ['negative-amount.yaml', ['12:14 error "fine salt" in ingredients is -2 %; an amount cannot be negative']],
    [
      'unknown-ingredient.yaml',
      [
        '13:3 error unknown ingredient "instant yaest" in ingredients: not in the catalog; did you mean "instant yeast"?',
        // The pre-ferment's yeast then has no overall line to come out of: also true, also reported.
        '21:7 error "instant yeast" is in pre-ferment "poolish" but not in the overall formula; pre-ferments and soakers are taken out of the overall formula, so add it under ingredients',
      ],
    ],
    ['id-mismatch.yaml', ['1:5 error id "good-loaf" must equal the file name "id-mismatch"']],
    [
      'preferment-missing.yaml',
      [
        '20:7 error "instant yeast" is in pre-ferment "poolish" but not in the overall formula; pre-ferments and soakers are taken out of the overall formula, so add it under ingredients',
      ],
    ],
    [
      'preferment-too-much.yaml',
      [
        // Reference batch 10 × 500 g, loss 2 %, total 172.01 %: flour = 5000 / 0.98 / 1.7201 = 2966.1 g;
        // 0.02 % of it is 0.59 g and 0.01 % is 0.30 g (arithmetic of the convention in shared/scale.ts).
        '21:22 error pre-ferment "poolish" takes 0.02 % of "instant yeast" (0.6 g in the reference batch of 10 × 500 g), but the overall formula has only 0.01 % (0.3 g); raise it in the overall formula or take less',
      ],
    ],
    ['loss-100.yaml', ['6:7 error loss is 100 %; it must be below 100 % (it is the share of mixed dough lost before dividing)']],
  ])('%s is reported at its exact line and column', (name, expected) => {
    const text = readFileSync(new URL(name, FIXTURES), 'utf8');
    expect(lines(checkFormula(`tests/fixtures/check/${name}`, text))).toEqual(expected);
  });

  it('finds nothing wrong with the good fixture formula', () => {
    expect(checkFormula('good-loaf.yaml', fixture('good-loaf.yaml'))).toEqual([]);
  });

  it('puts the file path given on every finding', () => {
    const [f] = checkFormula('some/where/loss-100.yaml', fixture('loss-100.yaml'));
    expect(f.file).toBe('some/where/loss-100.yaml');
  });
});

describe('checkFileText on a plan', () => {
  const formulas = new Map([
    ['good-loaf', { status: 'active' }],
    ['old-loaf', { status: 'retired' }],
    ['new-loaf', { status: 'draft' }],
  ]);
  const plan = (text: string, file = 'plans/2026-12-03.yaml') =>
    lines(checkFileText({ kind: 'plan', file, text, formulas, formulasDir: 'formulas/' }).findings);

  it('reports an order naming an unknown formula, with the nearest id', () => {
    expect(plan(fixture('plans/2026-12-03.yaml'))).toEqual([
      '8:16 error order 2 names formula "good-laof", which is not in formulas/; did you mean "good-loaf"?',
    ]);
  });

  const PLAN = `date: 2026-12-03
ready_by: "06:00"
conditions: { room: 22 °C, flour: 20 °C, tap_water: 14 °C }
mixers:
  - { name: spiral, capacity: 50 kg, minimum: 8 kg, friction: 13 °C }
orders:
  - { formula: good-loaf, pieces: 20, mixer: spiral }
`;
  it.each([
    ['a clean plan', PLAN, []],
    ['an unknown mixer', PLAN.replace('mixer: spiral', 'mixer: spiarl'), ['7:46 error order 1 names mixer "spiarl", which is not among this plan\'s mixers; did you mean "spiral"?']],
    ['a retired formula', PLAN.replace('good-loaf', 'old-loaf'), ['7:16 warning order 1 names "old-loaf", which is retired']],
    ['a draft formula', PLAN.replace('good-loaf', 'new-loaf'), ['7:16 warning order 1 names "new-loaf", which is still a draft']],
    ['a date other than the file name', PLAN.replace('date: 2026-12-03', 'date: 2026-12-04'), ['1:7 error date "2026-12-04" must equal the file name "2026-12-03"']],
    ['a date not in the calendar', PLAN.replace('date: 2026-12-03', 'date: 2026-02-30'), ['1:7 error date "2026-02-30" is not a date in the calendar (YYYY-MM-DD)']],
    ['a minimum above the capacity', PLAN.replace('minimum: 8 kg', 'minimum: 60 kg'), ['5:47 error the minimum of mixer "spiral" (60000 g) is above its capacity (50000 g)']],
    [
      'a mixer named twice',
      PLAN.replace('orders:', '  - { name: spiral, capacity: 20 kg, friction: 9 °C }\norders:'),
      ['6:13 error mixer "spiral" is listed twice; give each mixer its own name'],
    ],
    [
      'a scale whose step is not below its maximum',
      PLAN.replace('orders:', 'scales:\n  - { name: bench scale, max: 0.5 g, resolution: 3 kg }\norders:'),
      ['7:50 error scale "bench scale" reads in steps of 3000 g, not below its maximum 0.5 g; swap max and resolution?'],
    ],
    [
      'a scale listed twice',
      PLAN.replace('orders:', 'scales:\n  - { name: s, max: 3 kg, resolution: 1 g }\n  - { name: s, max: 60 kg, resolution: 20 g }\norders:'),
      ['8:13 error scale "s" is listed twice; give each scale its own name'],
    ],
    [
      'two shifts with one name',
      PLAN.replace('orders:', 'bench:\n  - { name: night, from: "00:00", to: "04:00", people: 1 }\n  - { name: night, from: "04:00", to: "08:00", people: 2 }\norders:'),
      ['8:13 error shift "night" is named twice; give each shift its own name (panform sheet --shift picks it by name)'],
    ],
    ['a temperature without its unit', PLAN.replace('room: 22 °C', 'room: 22'), ['3:21 error conditions.room is 22 without a unit; write a temperature as a number and °C or °F, e.g. "25 °C"']],
  ])('reports %s', (_, text, expected) => {
    expect(plan(text)).toEqual(expected);
  });
});

describe('checkFileText on a catalog', () => {
  const cat = (text: string) => lines(checkFileText({ kind: 'catalog', file: 'ingredients.yaml', text }).findings);
  it.each([
    ['the fixture catalog', fixture('ingredients.yaml'), []],
    [
      'a component that is not in the catalog',
      'sesame seeds: { kind: seed, allergens: [sesame] }\nseed mix: { kind: seed, components: [sesame seed], allergens: [sesame] }\n',
      ['2:38 error component "sesame seed" of "seed mix" is not in the catalog; did you mean "sesame seeds"?'],
    ],
    [
      'a compound that does not list an allergen of a component',
      'sesame seeds: { kind: seed, allergens: [sesame] }\nlinseed: { kind: seed }\nseed mix: { kind: seed, components: [linseed, sesame seeds] }\n',
      ['3:1 warning "seed mix" does not list allergen "sesame", which its component "sesame seeds" has; add it to allergens so the catalog reads true'],
    ],
    [
      'compounds that contain each other',
      'a mix: { kind: seed, components: [b mix] }\nb mix: { kind: seed, components: [a mix] }\n',
      ['1:22 error "a mix" contains itself through its components: "a mix" → "b mix" → "a mix"'],
    ],
    [
      'a culture without hydration or fed_with',
      'bread flour: { kind: flour }\nstarter: { kind: culture }\n',
      [
        '2:1 error the culture "starter" needs "fed_with": the flour it is fed with',
        '2:1 error the culture "starter" needs "hydration" (e.g. "hydration: 100 %"): a levain build counts its flour and water by it',
      ],
    ],
    [
      'a culture fed at a ratio that does not keep its hydration',
      'rye flour: { kind: flour }\nrye sour: { kind: culture, hydration: 100 %, fed_with: rye flour, feeding: { ratio: "1:5:4" } }\n',
      ['2:85 warning "rye sour" is fed 1:5:4, water 80 % of the flour, but its hydration is 100 %; fed so, the culture drifts away from the hydration the builds count it at'],
    ],
    [
      'feeding on something that is not a culture',
      'rye flour: { kind: flour, feeding: { keep: 100 g } }\n',
      ['1:27 warning "feeding" is used only for a culture; "rye flour" is of kind flour'],
    ],
    [
      'a culture fed with something that is not a flour',
      'water: { kind: water }\nstarter: { kind: culture, hydration: 100 %, fed_with: water }\n',
      ['2:55 error "starter" is fed with "water", whose kind is water; a culture is fed with a flour'],
    ],
    [
      'an unknown allergen code',
      'bread flour: { kind: flour, allergens: [gluten] }\n',
      [
        '1:41 error unknown allergen code "gluten" in bread flour.allergens; cereals containing gluten are written by grain: wheat, rye, barley, oats, spelt, khorasan (codes: wheat, rye, barley, oats, spelt, khorasan, crustaceans, eggs, fish, peanuts, soybeans, milk, almonds, hazelnuts, walnuts, cashews, pecans, brazil-nuts, pistachios, macadamia, celery, mustard, sesame, sulphites, lupin, molluscs)',
      ],
    ],
    ['a misspelt allergen code', 'whole egg: { kind: egg, allergens: [egg] }\n', [expect.stringMatching(/^1:37 error unknown allergen code "egg" in whole egg.allergens; did you mean "eggs"\?/)]],
    ['a water content above 100 %', 'whole milk: { kind: dairy, water: 120 % }\n', ['1:35 error the water content of "whole milk" is 120 %; it must be from 0 to 100 % of its weight']],
    ['a cost date not in the calendar', 'water: { kind: water, cost_per_kg: 0, cost_date: 2026-13-01 }\n', ['1:50 error cost_date "2026-13-01" is not a date in the calendar (YYYY-MM-DD)']],
    ['a yeast without its type', 'yeast: { kind: yeast }\n', ['1:1 warning the yeast "yeast" has no "yeast" type (fresh, active-dry or instant); it is treated as fresh yeast when converting']],
  ])('reports %s', (_, text, expected) => {
    expect(cat(text)).toEqual(expected);
  });
});

describe('checkFileText on formula arithmetic and units', () => {
  it.each([
    ['a temperature in an unknown unit', BASE.replace('25 °C', '25 degrees'), ['7:20 error dough_temperature is "25 degrees": unknown unit "degrees"; write a temperature as a number and °C or °F, e.g. "25 °C"']],
    ['a weight without its unit', BASE.replace('piece: 500 g', 'piece: 500'), ['5:29 error yield.piece is 500 without a unit; write a weight as a number and g, kg, oz or lb, e.g. "320 g"']],
    ['a loss written in words', BASE.replace('loss: 2 %', 'loss: 2 percent'), ['6:7 error loss is "2 percent": unknown unit "percent"; write a percentage as a number and %, e.g. "2 %"']],
    ["baker's percent written with a % sign", BASE.replace('water: 70', 'water: 70 %'), ['11:10 error ingredients.water is "70 %"; write baker\'s percent as a plain number, e.g. 70']],
    [
      'minutes written with their unit',
      withLines('process:\n  - { step: mix, minutes: 10 min }\n'),
      ['15:27 error process.0.minutes is "10 min": write the number alone (the key "minutes" gives the unit "min"), or a range such as "10-14"'],
    ],
    [
      'a range written backwards',
      withLines('process:\n  - { step: retard, hours: 16-12, temperature: 4 °C }\n'),
      ['15:28 error process.0.hours is "16-12": range runs backwards; expected the smaller number first (e.g. "10-14")'],
    ],
    ['a negative loss', BASE.replace('loss: 2 %', 'loss: -2 %'), ['6:7 error loss is -2 %; it cannot be negative']],
    [
      'a banneton in the oven',
      withLines('process:\n  - { step: bake, minutes: 40, temperature: 230 °C, vessel: banneton }\n'),
      ['15:61 error a banneton is for the proof, not the oven; step 1 bakes: say deck, stone, tray, tin or pot'],
    ],
    ['a misspelt status', BASE.replace('status: active', 'status: activ'), ['3:9 error status is "activ", not one of: draft, active, retired; did you mean "active"?']],
    ['a flour listed under ingredients', withLines('  rye flour: 5\n'), ['14:3 error "rye flour" is a flour (catalog kind flour); list it under flour so the flours sum to 100 %']],
    ['an ingredient listed under flour', BASE.replace('  bread flour: 100\n', '  bread flour: 100\n  fine salt: 0\n'), [
      '10:3 error "fine salt" is listed under flour but the catalog\'s kind is salt; only flours go under flour',
      '10:14 warning flour "fine salt" is 0 %; remove the line or give it an amount',
      '13:3 error "fine salt" is listed under both flour and ingredients; list it once',
    ]],
    [
      'a bake covered longer than it lasts',
      withLines('process:\n  - { step: bake, minutes: 20, temperature: 230 °C, vessel: pot, covered: 25 }\n'),
      ['15:75 error the bake is covered for 25 min but lasts only 20 min'],
    ],
    [
      'minutes and hours on one step',
      withLines('process:\n  - { step: bulk, minutes: 90, hours: 2 }\n'),
      ['15:32 error step 1 (bulk) gives both minutes and hours; give one'],
    ],
  ])('reports %s', (_, text, expected) => {
    expect(lines(checkFormula('loaf.yaml', text))).toEqual(expected);
  });

  const LEVAIN = withLines(`preferments:
  - name: levain
    kind: levain
    share: 20 %
    ingredients:
      bread flour: 100
      water: 100
      mature levain: 20
`).replace('  instant yeast: 0.5\n', '');

  it('accepts a levain seeded with a mature culture without taking the seed from the overall formula', () => {
    expect(checkFormula('loaf.yaml', LEVAIN)).toEqual([]);
  });

  it.each([
    [
      'a seed fed with a flour the build does not have',
      LEVAIN.replace('      bread flour: 100\n      water: 100', '      rye flour: 100\n      water: 100').replace('  bread flour: 100\ningredients', '  bread flour: 80\n  rye flour: 20\ningredients'),
      ['21:7 error the seed "mature levain" is fed with "bread flour", which is not among the flours of pre-ferment "levain" (rye flour); its flour counts as that flour, so add it to the build'],
    ],
    [
      'a seed that brings more water than the build has',
      LEVAIN.replace('      water: 100\n', '      water: 5\n'),
      [
        '17:5 warning pre-ferment "levain" is at 5 % hydration; a levain is usually stiff at 50-60 % or liquid at 100-125 % (common practice)',
        // 20 % seed at 100 % hydration brings 10 % water (arithmetic of the seed convention in shared/scale.ts).
        '20:22 error the seed "mature levain" at 20 % brings 10 % water, more than the build\'s 5 %',
      ],
    ],
    [
      'a seed culture the catalog gives no hydration',
      LEVAIN,
      ['20:7 error the seed culture "mature levain" needs a hydration in the catalog (e.g. "hydration: 100 %") so its flour and water can be counted'],
      { ...catalog, 'mature levain': { ...catalog['mature levain'], hydration: undefined } },
    ],
  ])('reports %s', (_, text, expected, cat?: Catalog) => {
    expect(lines(checkFormula('loaf.yaml', text, cat ?? catalog))).toEqual(expected);
  });

  it('without a catalog, does not take a seed culture for a missing overall ingredient', () => {
    expect(lines(checkFormula('loaf.yaml', LEVAIN, null))).toEqual([
      '1:1 warning no ingredient catalog (ingredients.yaml beside the formula or in its parent folder, or --catalog); ingredient names and kinds were not checked',
    ]);
  });

  it('names both amounts when two pre-ferments together take more water than the formula has', () => {
    const text = withLines(`preferments:
  - name: poolish
    kind: poolish
    share: 40 %
    ingredients: { bread flour: 100, water: 100, instant yeast: 0.1 }
  - name: levain
    kind: levain
    share: 40 %
    ingredients: { bread flour: 100, water: 100 }
`);
    // 40 % + 40 % of the flour as water = 80 % against 70 % overall. Reference flour
    // = 5000 / 0.98 / 1.725 = 2957.7 g, so 80 % is 2366.2 g and 70 % is 2070.4 g.
    expect(lines(checkFormula('loaf.yaml', text))).toEqual([
      '14:1 warning 80 % of the flour is pre-fermented; above about 60 % the dough tends to be slack and sour (common practice)',
      '22:45 error the pre-ferments and soakers take 80 % of "water" (2366.2 g in the reference batch of 10 × 500 g), but the overall formula has only 70 % (2070.4 g); raise it in the overall formula or take less',
    ]);
  });

  it('reports two builds with one name', () => {
    const text = withLines('soakers:\n  - { name: soak, ingredients: { water: 10 } }\n  - { name: soak, ingredients: { water: 10 } }\n');
    expect(lines(checkFormula('loaf.yaml', text))).toEqual([
      '16:13 error two pre-ferments or soakers are named "soak"; give each its own name (each is one line of the final dough)',
    ]);
  });

  it('takes a soaker out of the overall formula in percent of the total flour', () => {
    const ok = withLines('soakers:\n  - name: soak\n    ingredients: { water: 70 }\n');
    expect(checkFormula('loaf.yaml', ok)).toEqual([]);
    const tooMuch = withLines('soakers:\n  - name: soak\n    ingredients: { water: 71 }\n');
    expect(lines(checkFormula('loaf.yaml', tooMuch))).toEqual([
      '16:27 error soaker "soak" takes 71 % of "water" (2100 g in the reference batch of 10 × 500 g), but the overall formula has only 70 % (2070.4 g); raise it in the overall formula or take less',
    ]);
  });

  it('warns once, at the top, when there is no catalog, and still checks the arithmetic', () => {
    expect(lines(checkFormula('loaf.yaml', BASE.replace('bread flour: 100', 'bread flour: 90'), null))).toEqual([
      '1:1 warning no ingredient catalog (ingredients.yaml beside the formula or in its parent folder, or --catalog); ingredient names and kinds were not checked',
      "8:1 error the flours sum to 90 %; in baker's percent they must sum to 100 %",
    ]);
  });
});

describe('checkFileText warnings for values outside the trade\'s usual ranges', () => {
  it.each([
    // Poolish at about 100 % hydration (common practice).
    [
      'a poolish far from 100 % hydration',
      withLines('preferments:\n  - { name: poolish, kind: poolish, share: 20 %, ingredients: { bread flour: 100, water: 60 } }\n'),
      ['15:50 warning pre-ferment "poolish" is at 60 % hydration; a poolish is usually about 100 % (equal weights of flour and water; common practice)'],
    ],
    // Biga stiff at 50–60 % (Hamelman, Bread, "Biga") or about 100 % (common practice).
    [
      'a biga at 75 %',
      withLines('preferments:\n  - { name: biga, kind: biga, share: 20 %, ingredients: { bread flour: 100, water: 75 } }\n'),
      ['15:44 warning pre-ferment "biga" is at 75 % hydration; a biga is usually stiff at 50-60 %, or liquid at about 100 % (common practice)'],
    ],
    ['a lean dough with 2 % instant yeast', BASE.replace('instant yeast: 0.5', 'instant yeast: 2'), [
      // 2 % instant ÷ 0.33 = 6.06 % as fresh yeast (Hamelman, Bread, Wiley 2004, "Yeast conversions: fresh to dry").
      '13:18 warning yeast is 2 % (6.06 % as fresh yeast) in a lean dough; lean doughs rarely need more than about 4 % fresh yeast (common practice)',
    ]],
    ['salt at 1 %', BASE.replace('fine salt: 2', 'fine salt: 1'), ['12:14 warning salt is 1 % of the flour; bread usually has 1.5-3 % (common practice)']],
    ['hydration at 45 %', BASE.replace('water: 70', 'water: 45'), ['10:1 warning hydration is 45 %; bread doughs are usually 50-100 % (common practice)']],
    ['a dough temperature of 32 °C', BASE.replace('25 °C', '32 °C'), ['7:20 warning dough temperature 32 °C is outside the usual 20-30 °C (common practice)']],
    ['a dough temperature of 86 °F (30 °C)', BASE.replace('25 °C', '86 °F'), []],
    ['a flour line at 0 %', BASE.replace('  bread flour: 100\n', '  bread flour: 100\n  rye flour: 0\n'), ['10:14 warning flour "rye flour" is 0 %; remove the line or give it an amount']],
    [
      'a warm retard',
      withLines('process:\n  - { step: retard, hours: 12, temperature: 12 °C }\n'),
      ['15:45 warning a retard (cold hold) at 12 °C is warm; cold holds usually run at about 2-6 °C (common practice; follow your food-safety plan)'],
    ],
  ])('warns about %s', (_, text, expected) => {
    expect(lines(checkFormula('loaf.yaml', text))).toEqual(expected);
  });
});

describe('fileStem', () => {
  it.each([
    ['formulas/harbour-ciabatta.yaml', 'harbour-ciabatta'],
    ['formulas/plans/2026-12-03.yml', '2026-12-03'],
    ['C:\\bakery\\loaf.yaml', 'loaf'],
  ])('%s → %s', (path, stem) => expect(fileStem(path)).toBe(stem));
});

describe('nearestName', () => {
  it.each([
    ['bred flour', ['bread flour', 'rye flour', 'water'], 'bread flour'],
    ['Instant Yeast', ['instant yeast', 'fresh yeast'], 'instant yeast'],
    ['flour bread', ['bread flour'], 'bread flour'],
    ['chocolate', ['bread flour', 'water'], undefined],
  ])('%s → %s', (name, known, expected) => expect(nearestName(name, known)).toBe(expected));

  it.each([
    ['kitten', 'sitting', 3],
    ['salt', 'slat', 1],
    ['', 'abc', 3],
  ])('editDistance(%s, %s) = %i', (a, b, d) => expect(editDistance(a, b)).toBe(d));
});

describe('the demo bakery', () => {
  const root = new URL('../../formulas/', import.meta.url);
  const demoCatalog = parseCatalogText(readFileSync(new URL('ingredients.yaml', root), 'utf8'), 'formulas/ingredients.yaml');
  const ids = readdirSync(root).filter((n) => n.endsWith('.yaml') && n !== 'ingredients.yaml');

  it('has a catalog that checks clean', () => {
    expect(checkFileText({ kind: 'catalog', file: 'formulas/ingredients.yaml', text: readFileSync(new URL('ingredients.yaml', root), 'utf8') }).findings).toEqual([]);
  });

  it.each(ids)('%s checks clean against the demo catalog', (name) => {
    if (!demoCatalog.ok) throw new Error('demo catalog must parse');
    const req: CheckRequest = { kind: 'formula', file: `formulas/${name}`, text: readFileSync(new URL(name, root), 'utf8'), catalog: demoCatalog.value };
    expect(checkFileText(req).findings).toEqual([]);
  });

  it.each(readdirSync(new URL('plans/', root)))('plan %s checks clean', (name) => {
    const formulas = new Map(ids.map((n) => [fileStem(n), { status: 'active' }]));
    const text = readFileSync(new URL(`plans/${name}`, root), 'utf8');
    expect(checkFileText({ kind: 'plan', file: `formulas/plans/${name}`, text, formulas, formulasDir: 'formulas/' }).findings).toEqual([]);
  });
});
