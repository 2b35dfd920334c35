// `panform scale`: the JSON and every refusal through the command's own functions in-process;
// the built CLI for finding a formula by id, the tables, CSV and the exit codes.
import { copyFileSync, mkdirSync, mkdtempSync, rmSync, writeFileSync } from 'node:fs';
import { tmpdir } from 'node:os';
import { join } from 'node:path';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { collectScale, command as scaleCommand, scaleJson, toScaleOptions } from '../../cli/commands/scale.ts';
import { buildCli, type BuiltCli } from './arithmetic-cli.ts';
import { parseFlags, refusal } from './flags.ts';

const FIXTURES = join('tests', 'fixtures', 'arithmetic');
const fixture = (id: string) => join(FIXTURES, `${id}.yaml`);

let cli: BuiltCli;
beforeAll(async () => {
  cli = await buildCli();
});
afterAll(() => cli?.dispose());

interface Json {
  formula: string;
  mixedDough: number;
  dividedDough: number;
  flour: number;
  totalPercent: number;
  hydration: number;
  effectiveHydration: number;
  prefermentedFlour: number;
  overall: { ingredient: string; percent: number; grams: number }[];
  preferments: { name: string; grams: number; ingredients: { ingredient: string; grams: number; weigh: number; seed?: boolean }[] }[];
  soakers: { name: string; grams: number; ingredients: { ingredient: string; grams: number }[] }[];
  finalDough: { ingredient: string; grams: number }[];
  water: number;
  mixingWater: { waterTemperature: number; factors: number; ice: number | null; tapWater: number | null } | null;
}

type RawFlags = Parameters<typeof toScaleOptions>[0];

/** What `panform scale <args> --json` prints, collected in-process. */
async function json(args: string[]): Promise<Json> {
  const { operands, options } = parseFlags<RawFlags>(scaleCommand, [...args, '--json']);
  const opts = toScaleOptions(options);
  return JSON.parse(JSON.stringify(scaleJson(collectScale(operands[0], opts), opts))) as Json;
}

describe('panform scale --json', () => {
  it('prints the contract keys with grams unrounded', async () => {
    const j = await json([fixture('worksheet-baguette'), '--pieces', '73']);
    for (const key of ['formula', 'mixedDough', 'dividedDough', 'flour', 'totalPercent', 'hydration', 'effectiveHydration', 'prefermentedFlour', 'overall', 'preferments', 'soakers', 'finalDough']) {
      expect(j).toHaveProperty(key);
    }
    expect(j.formula).toBe('worksheet-baguette');
    expect(j.water).toBeCloseTo(0.67 * (28470 / 1.7), 9); // all the water, g
    expect(j.mixingWater).toBeNull();
    expect(j.dividedDough).toBe(28470); // "Baker's Percentage Worksheet" handout, example 1: 73 × 390 g
    expect(j.flour).toBeCloseTo(28470 / 1.7, 9); // same worksheet: 16 747 g (16 747.06 unrounded)
    expect(j.overall[0]).toEqual({ ingredient: 'bread flour', percent: 100, grams: j.flour, kind: 'flour' });
    expect(j.overall.find((l) => l.ingredient === 'water')!.grams).toBeCloseTo(11220.529, 3); // 28 470 / 1.7 × 0.67 = 11 220.53 g (the worksheet prints 11 220.49 g from its rounded flour)
  });

  it.each([
    [['--mix', '28.47 kg'], 28470],
    [['--mix', '28470'], 28470],
    [['--mix', '2 lb'], 907.18474], // International yard and pound agreement (1959): 1 lb = 453.592 37 g
    [['--pieces', '3', '--piece', '900 g'], 2700],
    [['--pieces', '2', '--piece', '1 lb'], 907.18474],
  ])('reads the target %j', async (args, mixed) => {
    const j = await json([fixture('lean-straight'), ...args]);
    expect(j.mixedDough).toBeCloseTo(mixed, 9);
  });

  it('scales by total flour', async () => {
    const j = await json([fixture('lean-straight'), '--flour', '1000']);
    expect(j.mixedDough).toBeCloseTo(1680, 9); // common practice lean dough 100/65/2/1 = 168 %, hand-worked
  });

  it('scales the formula\'s own yield without a target', async () => {
    const j = await json([fixture('lean-straight')]);
    expect(j.mixedDough).toBeCloseTo(1680, 9);
  });

  it('finds a formula by id in ./formulas', async () => {
    const dir = mkdtempSync(join(tmpdir(), 'panform-scale-'));
    try {
      mkdirSync(join(dir, 'formulas'));
      copyFileSync(fixture('levain-seed'), join(dir, 'formulas', 'levain-seed.yaml'));
      copyFileSync(join(FIXTURES, 'ingredients.yaml'), join(dir, 'formulas', 'ingredients.yaml'));
      const r = await cli.run(['scale', 'levain-seed', '--json'], { cwd: dir });
      expect(r.code).toBe(0);
      const j = JSON.parse(r.stdout) as Json;
      const seed = j.preferments[0].ingredients.find((l) => l.seed);
      expect(seed?.ingredient).toBe('mature culture'); // the catalog beside the formula marks it a culture
    } finally {
      rmSync(dir, { recursive: true, force: true });
    }
  });

  it('gives the pre-ferments, soakers and final dough', async () => {
    const p = await json([fixture('poolish-loaf'), '--mix', '1000']);
    expect(p.preferments.map((b) => b.name)).toEqual(['poolish']);
    expect(Math.round(p.finalDough.find((l) => l.ingredient === 'all-purpose flour')!.grams)).toBe(393); // hand-worked poolish example: 587 − 194 = 393
    const s = await json([fixture('rye-soaker')]);
    expect(s.soakers[0].name).toBe('seed soak');
    expect(s.finalDough.at(-1)!.ingredient).toBe('seed soak');
  });

  it('works out the water and ice for the final dough', async () => {
    const j = await json([fixture('lean-straight'), '--mix', '1680', '--room', '30', '--flour-temp', '28', '--friction', '13', '--tap', '20']);
    // 3·25 − (30 + 28 + 13) = 4 °C (by hand, dough_temperature 25 °C in the formula); 650 g of water in the final dough.
    expect(j.mixingWater!.waterTemperature).toBe(4);
    expect(j.mixingWater!.factors).toBe(3);
    expect(j.mixingWater!.ice).toBeCloseTo((650 * 16) / (20 + 333.55 / 4.186), 6); // L = 333.55 J/g (CRC Handbook), c = 4.186 J/(g·K) (NIST SP 811 B.8)
    expect(j.mixingWater!.ice! + j.mixingWater!.tapWater!).toBeCloseTo(650, 9);
  });

  it('counts each pre-ferment measured tonight in the water temperature, and the friction as 5 × the rise', async () => {
    const j = await json([fixture('two-preferments'), '--room', '22', '--flour-temp', '20', '--rise', '4', '--preferment-temp', '21', '--preferment-temp', '17']);
    expect(j.mixingWater!.factors).toBe(5);
    expect(j.mixingWater!.waterTemperature).toBe(5 * 25 - (22 + 20 + 5 * 4 + 21 + 17)); // 25 °C, by hand (the multiplier method)
  });

  it('uses the pre-ferments\' ripening temperatures when none is measured', async () => {
    const j = await json([fixture('two-preferments'), '--room', '22', '--flour-temp', '20', '--friction', '12']);
    expect(j.mixingWater!.waterTemperature).toBe(5 * 25 - (22 + 20 + 5 * 4 + 20 + 18)); // ripen at 20 and 18 °C in the fixture; rise 12/3
  });

  it('reads bare temperatures as °F with --fahrenheit, friction as a difference', async () => {
    const c = await json([fixture('lean-straight'), '--ddt', '25', '--room', '22', '--flour-temp', '20', '--friction', '11.11111111111111']);
    const f = await json([fixture('lean-straight'), '--ddt', '77', '--room', '71.6', '--flour-temp', '68', '--friction', '20', '--fahrenheit']);
    expect(f.mixingWater!.waterTemperature).toBeCloseTo(c.mixingWater!.waterTemperature, 9); // NIST SP 811 B.8: a difference of 20 °F-degrees = 11.11 K
  });
});

describe('panform scale (table)', () => {
  it('prints a table per section', async () => {
    const r = await cli.run(['scale', fixture('levain-seed'), '--room', '22', '--flour-temp', '20', '--friction', '13', '--tap', '14']);
    expect(r.code).toBe(0);
    for (const heading of ['Overall formula', 'Pre-ferment "levain"', 'Final dough', 'Derived figures', 'Water for the final dough']) {
      expect(r.stdout).toContain(heading);
    }
    expect(r.stdout).toMatch(/mature culture \(seed\)/);
    expect(r.stdout).toMatch(/levain \(pre-ferment, all of it\)/);
    expect(r.stdout).toMatch(/effective hydration/);
    expect(r.stdout).toMatch(/│ total\s+│\s+177 % │ 1\u202f800 g │/);
  });

  it('prints pounds and ounces with --units us', async () => {
    const r = await cli.run(['scale', fixture('pizza-lb'), '--flour', '40 lb', '--units', 'us']);
    expect(r.code).toBe(0);
    expect(r.stdout).toMatch(/│ fine salt\s+│\s+1.75 % │\s+11.20 oz │/); // handout "How to Work with a Formula Expressed in Baker's Percent": salt 11.2 oz
    expect(r.stdout).toMatch(/│ water\s+│\s+58 % │ 23 lb 3.20 oz │/); // same handout: water 23 lb 3.2 oz
  });

  it('rounds to the configured resolution', async () => {
    const r = await cli.run(['scale', fixture('worksheet-baguette'), '--pieces', '73', '--resolution', '10']);
    expect(r.stdout).toMatch(/│ bread flour\s+│\s+100 % │ 16\u202f750 g │/);
  });
});

describe('panform scale --csv', () => {
  it('prints one row per line with a section column', async () => {
    const r = await cli.run(['scale', fixture('poolish-loaf'), '--mix', '1000', '--csv']);
    expect(r.code).toBe(0);
    const rows = r.stdout.trim().split('\n');
    expect(rows[0]).toBe('section,build,ingredient,percent,grams,weigh,seed');
    expect(rows.filter((l) => l.startsWith('overall,')).length).toBe(4);
    expect(rows.filter((l) => l.startsWith('preferment,poolish,')).length).toBe(3);
    expect(rows.some((l) => l.startsWith('final,poolish,poolish,'))).toBe(true);
  });
});

describe('panform scale: misuse and bad input', () => {
  it.each([
    [['--pieces', '3', '--mix', '1000'], 2, 'panform: --pieces and --mix cannot be used together'],
    [['--mix', '1000', '--flour', '500'], 2, 'panform: --mix and --flour cannot be used together'],
    [['--pieces', '0'], 2, 'panform: --pieces must be a whole number of at least 1; got 0'],
    [['--pieces', '2.5'], 2, 'panform: --pieces must be a whole number of at least 1; got 2.5'],
    [['--pieces', '3', '--piece', '-900'], 2, 'panform: --piece must be a weight above 0; got -900'],
    [['--mix', '-5 kg'], 2, 'panform: --mix must be a weight above 0; got -5 kg'],
    [['--mix', '0'], 2, 'panform: --mix must be a weight above 0; got 0'],
    [['--flour', 'lots'], 2, 'panform: --flour: not a weight: "lots"'],
    [['--piece', '900'], 2, 'panform: --piece needs --pieces'],
    [['--json', '--csv'], 2, 'panform: --json and --csv cannot be used together'],
    [['--room', '22'], 2, 'panform: the water temperature needs --flour-temp, --friction'],
    [['--room', '30', '--flour-temp', '30', '--friction', '20'], 1, 'panform: lean-straight: the water would have to be -5.0 °C, below the 0 °C that ice can bring it to'],
    [['--room', '22', '--flour-temp', '20', '--friction', '11', '--preferment-temp', '20'], 2, 'panform: lean-straight has 0 pre-ferment(s) but --preferment-temp was given 1 times'],
  ])('refuses %j with exit %d and one clear line', async (args, code, message) => {
    const r = await refusal(() => {
      const { operands, options } = parseFlags<RawFlags>(scaleCommand, [fixture('lean-straight'), ...args]);
      const opts = toScaleOptions(options);
      collectScale(operands[0], opts);
    });
    expect(r.code).toBe(code);
    expect(r.line).toContain(message);
  });

  it.each([
    [['--pieces', '0'], 2, 'panform: --pieces must be a whole number of at least 1; got 0'],
    [['--room', '30', '--flour-temp', '30', '--friction', '20'], 1, 'panform: lean-straight: the water would have to be -5.0 °C'],
  ])('prints a refusal of %j as one line on stderr, exit %d, no stack trace', async (args, code, message) => {
    const r = await cli.run(['scale', fixture('lean-straight'), ...args]);
    expect(r.code).toBe(code);
    expect(r.stdout).toBe('');
    expect(r.stderr.split('\n')[0]).toContain(message);
    expect(r.stderr).not.toMatch(/\n\s+at /);
  });

  it('refuses an unknown --units with exit 2', async () => {
    const r = await cli.run(['scale', fixture('lean-straight'), '--units', 'imperial']);
    expect(r.code).toBe(2);
    expect(r.stderr).toMatch(/Allowed choices are metric, us/);
  });

  it('suggests the nearest formula id for a mistyped one', async () => {
    const r = await cli.run(['scale', 'harbor-ciabatta']);
    expect(r.code).toBe(1);
    expect(r.stderr.split('\n')[0]).toBe('panform: unknown formula: harbor-ciabatta; did you mean harbour-ciabatta?');
  });

  it('refuses an unknown formula with exit 1', async () => {
    const r = await cli.run(['scale', 'no-such-bread', '--pieces', '3']);
    expect(r.code).toBe(1);
    expect(r.stderr.split('\n')[0]).toBe('panform: unknown formula: no-such-bread');
    expect(r.stderr).not.toMatch(/\n\s+at /);
  });

  it('refuses a formula whose builds take more than it has, naming the ingredient and both amounts', async () => {
    const dir = mkdtempSync(join(tmpdir(), 'panform-scale-'));
    try {
      // In a folder of its own, with an empty catalog beside it: no stray catalog in a parent folder is picked up.
      writeFileSync(join(dir, 'ingredients.yaml'), 'water: { kind: water }\nbread flour: { kind: flour }\n');
      writeFileSync(
        join(dir, 'too-much-poolish.yaml'),
        [
          'id: too-much-poolish',
          'title: Too much poolish',
          'status: draft',
          'category: lean',
          'yield: { pieces: 1, piece: 1000 g }',
          'flour: { bread flour: 100 }',
          'ingredients: { water: 60 }',
          'preferments:',
          '  - { name: poolish, kind: poolish, share: 80 %, ingredients: { bread flour: 100, water: 100 } }',
          '',
        ].join('\n'),
      );
      const r = await cli.run(['scale', join(dir, 'too-much-poolish.yaml'), '--flour', '1000']);
      expect(r.code).toBe(1);
      // Named by the check that reading a formula runs (percentages), or by the scaling itself (grams).
      expect(r.stderr).toMatch(/poolish" takes 80 % of "water".*has only 60 %|take 800\.0 g of water, but the formula has only 600\.0 g/);
      expect(r.stderr).not.toMatch(/\n\s+at /);
    } finally {
      rmSync(dir, { recursive: true, force: true });
    }
  });

  it('shows an example in --help', async () => {
    const r = await cli.run(['scale', '--help']);
    expect(r.code).toBe(0);
    expect(r.stdout).toMatch(/\$ panform scale harbour-ciabatta --pieces 60/);
  });
});
