// fast-check generators for the reliability suite: valid formula files of every shape (straight,
// pre-ferments, a levain seeded with a mature culture, soakers, enriched doughs) and random
// corruptions of a file's text. The run count comes from PANFORM_FUZZ_RUNS so CI stays quick and
// `npm run test:large` can push it to 20 000.
import fc from 'fast-check';
import { stringify } from 'yaml';
import type { CatalogFile, FormulaFile } from '#shared/schema/shapes';

/** Runs per property: PANFORM_FUZZ_RUNS, or a default that keeps the folder well under a minute. */
export function fuzzRuns(defaultRuns: number): number {
  const n = Number(process.env.PANFORM_FUZZ_RUNS);
  return Number.isInteger(n) && n > 0 ? n : defaultRuns;
}

/** A test's time limit for `runs` runs: generous, so a busy machine slows the suite but never fails it. */
export function fuzzTimeout(runs: number): number {
  return Math.max(120_000, runs * 100);
}

export const FLOURS = ['bread flour', 'whole wheat flour', 'rye flour', 'spelt flour', 'durum flour'] as const;

/**
 * The catalog the generated formulas use. Water contents are the usual round figures (common
 * practice; they only need to be stable here, not exact).
 */
export const FUZZ_CATALOG: CatalogFile = {
  'bread flour': { kind: 'flour', allergens: ['wheat'] },
  'whole wheat flour': { kind: 'flour', allergens: ['wheat'] },
  'rye flour': { kind: 'flour', allergens: ['rye'] },
  'spelt flour': { kind: 'flour', allergens: ['spelt'] },
  'durum flour': { kind: 'flour', allergens: ['wheat'] },
  water: { kind: 'water' },
  'fine salt': { kind: 'salt' },
  'instant yeast': { kind: 'yeast', yeast: 'instant' },
  'fresh yeast': { kind: 'yeast', yeast: 'fresh', water: 70 },
  'whole milk': { kind: 'dairy', water: 88, allergens: ['milk'] },
  butter: { kind: 'fat', water: 16, allergens: ['milk'] },
  'whole egg': { kind: 'egg', water: 75, allergens: ['eggs'] },
  honey: { kind: 'sugar', water: 17 },
  'caster sugar': { kind: 'sugar' },
  'olive oil': { kind: 'fat' },
  'sunflower seeds': { kind: 'seed' },
  'cracked rye': { kind: 'seed', allergens: ['rye'] },
  'mature levain': { kind: 'culture', hydration: 100, fed_with: 'bread flour', allergens: ['wheat'] },
  'stiff levain': { kind: 'culture', hydration: 60, fed_with: 'rye flour', allergens: ['rye'] },
};

/** Percent with at most two decimals, so YAML round-trips it exactly. */
const pct = (min: number, max: number) => fc.integer({ min: Math.round(min * 100), max: Math.round(max * 100) }).map((n) => n / 100);
/** A fraction in [0, 1]. */
const unit = fc.integer({ min: 0, max: 1000 }).map((n) => n / 1000);

const idArb = fc.stringMatching(/^[a-z][a-z0-9]{0,7}(-[a-z0-9]{1,6}){0,2}$/);

/** Flour percentages as whole-number cuts of 100, so they sum to exactly 100. */
const flourTable = fc
  .shuffledSubarray([...FLOURS], { minLength: 1, maxLength: 3 })
  .chain((names) =>
    fc.uniqueArray(fc.integer({ min: 1, max: 99 }), { minLength: names.length - 1, maxLength: names.length - 1 }).map((cuts) => {
      const points = [0, ...cuts.sort((a, b) => a - b), 100];
      const table: Record<string, number> = {};
      names.forEach((n, i) => (table[n] = points[i + 1] - points[i]));
      return table;
    }),
  );

interface Extras {
  water: number;
  salt: number;
  yeast: { name: 'instant yeast' | 'fresh yeast'; percent: number } | null;
  milk: number | null;
  butter: number | null;
  egg: number | null;
  honey: number | null;
  sugar: number | null;
  oil: number | null;
}

const extrasArb: fc.Arbitrary<Extras> = fc.record({
  water: pct(40, 110),
  salt: pct(1.2, 2.6),
  yeast: fc.option(fc.record({ name: fc.constantFrom('instant yeast' as const, 'fresh yeast' as const), percent: pct(0.05, 4) })),
  milk: fc.option(pct(5, 40)),
  butter: fc.option(pct(2, 30)),
  egg: fc.option(pct(5, 30)),
  honey: fc.option(pct(1, 8)),
  sugar: fc.option(pct(1, 15)),
  oil: fc.option(pct(1, 12)),
});

interface PrefermentSpec {
  kind: 'poolish' | 'biga' | 'levain' | 'sponge' | 'old-dough';
  flourPick: number;
  shareFraction: number;
  hydration: number;
  yeastFraction: number;
  seed: { name: 'mature levain' | 'stiff levain'; percent: number } | null;
}

const prefermentArb: fc.Arbitrary<PrefermentSpec> = fc.record({
  kind: fc.constantFrom('poolish' as const, 'biga' as const, 'levain' as const, 'sponge' as const, 'old-dough' as const),
  flourPick: fc.nat(10),
  shareFraction: unit,
  hydration: pct(45, 130),
  yeastFraction: unit,
  seed: fc.option(fc.record({ name: fc.constantFrom('mature levain' as const, 'stiff levain' as const), percent: pct(5, 40) })),
});

const soakerArb = fc.record({
  seed: fc.constantFrom('sunflower seeds', 'cracked rye'),
  percent: pct(2, 25),
  waterFraction: unit,
});

export interface GeneratedFormula {
  file: FormulaFile;
  text: string;
}

/**
 * A valid formula file of any shape. Pre-ferments and soakers are fitted so they never take more
 * of an ingredient than the overall formula has (the file would be refused otherwise); a levain
 * seed's water always fits in its build's water.
 */
export const formulaArb: fc.Arbitrary<GeneratedFormula> = fc
  .record({
    id: idArb,
    pieces: fc.integer({ min: 1, max: 400 }),
    piece: fc.integer({ min: 20, max: 3000 }),
    loss: pct(0, 12),
    flour: flourTable,
    extras: extrasArb,
    preferments: fc.array(prefermentArb, { maxLength: 2 }),
    soaker: fc.option(soakerArb),
    status: fc.constantFrom('draft' as const, 'active' as const, 'retired' as const),
  })
  .map((g) => {
    const ingredients: Record<string, number> = { water: g.extras.water, 'fine salt': g.extras.salt };
    const e = g.extras;
    if (e.yeast) ingredients[e.yeast.name] = e.yeast.percent;
    if (e.milk !== null) ingredients['whole milk'] = e.milk;
    if (e.butter !== null) ingredients.butter = e.butter;
    if (e.egg !== null) ingredients['whole egg'] = e.egg;
    if (e.honey !== null) ingredients.honey = e.honey;
    if (e.sugar !== null) ingredients['caster sugar'] = e.sugar;
    if (e.oil !== null) ingredients['olive oil'] = e.oil;

    // What is still free to be taken by builds, in baker's percent of the total flour.
    const free: Record<string, number> = { ...g.flour, ...ingredients };
    const flourNames = Object.keys(g.flour);
    const preferments: NonNullable<FormulaFile['preferments']> = [];
    g.preferments.forEach((p, i) => {
      const flourName = flourNames[p.flourPick % flourNames.length];
      const maxShare = Math.min(free[flourName], 60);
      const share = Math.floor(maxShare * p.shareFraction * 100) / 100;
      if (share < 1) return;
      // Fresh water of the build, in percent of the build's flour, fitted to the water left.
      const waterRoom = Math.floor(((free.water * 100) / share) * 100) / 100;
      let hydration = Math.min(p.hydration, waterRoom);
      const build: Record<string, number> = { [flourName]: 100 };
      let seed = p.seed;
      if (seed) {
        const h = FUZZ_CATALOG[seed.name].hydration as number;
        const seedWater = (seed.percent * h) / (100 + h);
        // The seed's water counts inside the build's water line: that line must hold it.
        if (hydration < seedWater + 1) seed = null;
        // The seed's flour counts inside the build flour line: its fed-with flour must be that line, or any flour.
      }
      if (hydration < 1) return;
      hydration = Math.floor(hydration * 100) / 100;
      build.water = hydration;
      if (seed) build[seed.name] = seed.percent;
      const yeastName = e.yeast?.name;
      if (yeastName && p.yeastFraction > 0.5) {
        const yeastRoom = (free[yeastName] * 100) / share;
        const y = Math.floor(yeastRoom * (p.yeastFraction - 0.5) * 100) / 100;
        if (y > 0) {
          build[yeastName] = y;
          free[yeastName] -= (share * y) / 100;
        }
      }
      free[flourName] -= share;
      free.water -= (share * hydration) / 100;
      preferments.push({
        name: `${p.kind} ${i + 1}`,
        kind: p.kind,
        share: `${share} %`,
        ingredients: build,
        ripen: { hours: '10-14', temperature: '20 °C' },
      });
    });

    const soakers: NonNullable<FormulaFile['soakers']> = [];
    if (g.soaker) {
      ingredients[g.soaker.seed] = g.soaker.percent;
      const water = Math.floor(Math.min(free.water, g.soaker.percent * 1.5) * g.soaker.waterFraction * 100) / 100;
      const soak: Record<string, number> = { [g.soaker.seed]: g.soaker.percent };
      if (water > 0) soak.water = water;
      soakers.push({ name: 'soaker', ingredients: soak, soak: { hours: '4-12' } });
    }

    const file: FormulaFile = {
      id: g.id,
      title: `Fuzz ${g.id}`,
      status: g.status,
      category: 'lean',
      yield: { pieces: g.pieces, piece: `${g.piece} g` },
      loss: `${g.loss} %`,
      dough_temperature: '25 °C',
      flour: g.flour,
      ingredients,
      ...(preferments.length > 0 ? { preferments } : {}),
      ...(soakers.length > 0 ? { soakers } : {}),
      process: [{ step: 'mix', minutes: 10 }, { step: 'bulk', minutes: '60-90' }, { step: 'bake', minutes: 30, temperature: '240 °C' }],
    };
    return { file, text: stringify(file) };
  });

export const catalogText = stringify(FUZZ_CATALOG);

// ---- corruption ---------------------------------------------------------------------------

export type Mutation =
  | { kind: 'flip'; at: number; byte: number }
  | { kind: 'truncate'; at: number }
  | { kind: 'delete-lines'; at: number; count: number }
  | { kind: 'duplicate-line'; at: number }
  | { kind: 'swap-unit'; at: number; to: string }
  | { kind: 'insert'; at: number; text: string }
  | { kind: 'indent'; at: number; by: number }
  | { kind: 'replace-number'; at: number; to: string };

const UNIT_SWAPS = ['kg', 'g', 'oz', 'lb', '°C', '°F', '%', 'K', 'ml', 'cups', '', '°', ' %%', 'g g'];
const NUMBER_SWAPS = ['-1', '0', '1e309', 'NaN', '.inf', '-.inf', '0x1F', '99999999999999999999', '1.5.2', '½', '١٢', 'null', '~', '[]', '{}'];

const insertText = fc.oneof(
  fc.string({ unit: 'grapheme', maxLength: 12 }),
  fc.string({ unit: 'binary', maxLength: 6 }),
  fc.constantFrom('\t', ': ', '- ', '&a ', '*a', '!!binary ', '? ', '|', '>', '"', "'", '#', '{', '[', '\u0000', '\ufeff', '\u202e', '\r', 'ß', '🥖', '---\n', '...\n', '<<: *a', '__proto__', 'constructor', '.inf', '.nan'),
);

export const mutationArb: fc.Arbitrary<Mutation> = fc.oneof(
  fc.record({ kind: fc.constant('flip' as const), at: fc.nat(), byte: fc.integer({ min: 0, max: 255 }) }),
  fc.record({ kind: fc.constant('truncate' as const), at: fc.nat() }),
  fc.record({ kind: fc.constant('delete-lines' as const), at: fc.nat(), count: fc.integer({ min: 1, max: 4 }) }),
  fc.record({ kind: fc.constant('duplicate-line' as const), at: fc.nat() }),
  fc.record({ kind: fc.constant('swap-unit' as const), at: fc.nat(), to: fc.constantFrom(...UNIT_SWAPS) }),
  fc.record({ kind: fc.constant('insert' as const), at: fc.nat(), text: insertText }),
  fc.record({ kind: fc.constant('indent' as const), at: fc.nat(), by: fc.integer({ min: -4, max: 4 }) }),
  fc.record({ kind: fc.constant('replace-number' as const), at: fc.nat(), to: fc.constantFrom(...NUMBER_SWAPS) }),
);

/** Applies one mutation to a text; positions wrap around its length. */
export function applyMutation(text: string, m: Mutation): string {
  const lines = text.split('\n');
  const line = (at: number) => at % Math.max(1, lines.length);
  switch (m.kind) {
    case 'flip': {
      const bytes = Buffer.from(text, 'utf8');
      if (bytes.length === 0) return text;
      bytes[m.at % bytes.length] = m.byte;
      // Decoding as the CLI does (utf8): invalid sequences become U+FFFD.
      return bytes.toString('utf8');
    }
    case 'truncate':
      return text.slice(0, m.at % (text.length + 1));
    case 'delete-lines': {
      const i = line(m.at);
      return [...lines.slice(0, i), ...lines.slice(i + m.count)].join('\n');
    }
    case 'duplicate-line': {
      const i = line(m.at);
      return [...lines.slice(0, i + 1), lines[i], ...lines.slice(i + 1)].join('\n');
    }
    case 'swap-unit': {
      const units = [...text.matchAll(/(kg|g|oz|lb|°C|°F|%)(?=\b|\s|$|,|\})/g)];
      if (units.length === 0) return text;
      const u = units[m.at % units.length];
      return text.slice(0, u.index) + m.to + text.slice((u.index ?? 0) + u[0].length);
    }
    case 'insert': {
      const at = m.at % (text.length + 1);
      return text.slice(0, at) + m.text + text.slice(at);
    }
    case 'indent': {
      const i = line(m.at);
      const l = lines[i];
      lines[i] = m.by >= 0 ? ' '.repeat(m.by) + l : l.replace(new RegExp(`^ {0,${-m.by}}`), '');
      return lines.join('\n');
    }
    case 'replace-number': {
      const nums = [...text.matchAll(/-?[0-9]+(\.[0-9]+)?/g)];
      if (nums.length === 0) return text;
      const n = nums[m.at % nums.length];
      return text.slice(0, n.index) + m.to + text.slice((n.index ?? 0) + n[0].length);
    }
  }
}
