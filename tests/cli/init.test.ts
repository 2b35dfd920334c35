// `panform init`: answers from a file through the built CLI, and the questions with the prompt
// functions replaced by a script.
import { copyFileSync, existsSync, mkdirSync, mkdtempSync, readFileSync, rmSync, writeFileSync } from 'node:fs';
import { tmpdir } from 'node:os';
import { join } from 'node:path';
import { afterAll, beforeAll, beforeEach, describe, expect, it } from 'vitest';
import { renderFormulaYaml, runInit, schemaReference, type InitAnswers, type Prompts } from '../../cli/commands/init.ts';
import { parseFormulaText } from '#shared/parse';
import { scaleFormula } from '#shared/scale';
import { buildCli, ROOT, type BuiltCli } from './arithmetic-cli.ts';

const CATALOG = join(ROOT, 'tests', 'fixtures', 'arithmetic', 'ingredients.yaml');

const rolls: InitAnswers = {
  id: 'harbour-rolls',
  title: 'Harbour rolls',
  category: 'rolls',
  pieces: 24,
  piece: '80 g',
  loss: 2,
  doughTemperature: 25,
  flours: [{ name: 'bread flour', percent: 100 }],
  ingredients: [
    { name: 'water', percent: 65 },
    { name: 'fine salt', percent: 2 },
    { name: 'instant yeast', percent: 0.8 },
  ],
  preferment: { kind: 'poolish', share: 30, hydration: 100, yeast: { name: 'instant yeast', percent: 0.1 } },
};

let cli: BuiltCli;
let work: string;
beforeAll(async () => {
  cli = await buildCli();
});
afterAll(() => cli?.dispose());
beforeEach(() => {
  work = mkdtempSync(join(tmpdir(), 'panform-init-'));
  mkdirSync(join(work, 'bakery', 'formulas'), { recursive: true });
  copyFileSync(CATALOG, join(work, 'bakery', 'formulas', 'ingredients.yaml'));
  return () => rmSync(work, { recursive: true, force: true });
});

const bakery = () => join(work, 'bakery');
const answersFile = (a: unknown) => {
  const p = join(work, 'answers.json');
  writeFileSync(p, JSON.stringify(a));
  return p;
};

describe('panform init --answers', () => {
  it('writes a checked formula with the schema line', async () => {
    const r = await cli.run(['init', '--answers', answersFile(rolls)], { cwd: bakery() });
    expect(r.stderr).toBe('');
    expect(r.code).toBe(0);
    expect(r.stdout).toContain('wrote formulas/harbour-rolls.yaml');
    const text = readFileSync(join(bakery(), 'formulas', 'harbour-rolls.yaml'), 'utf8');
    expect(text.split('\n')[0]).toMatch(/^# yaml-language-server: \$schema=\S+formula\.schema\.json$/);
    const parsed = parseFormulaText(text, 'harbour-rolls.yaml');
    expect(parsed.ok).toBe(true);
    if (!parsed.ok) return;
    expect(parsed.value.preferments[0]).toMatchObject({ name: 'poolish', kind: 'poolish', share: 30 });
    expect(parsed.value.yield).toEqual({ pieces: 24, pieceGrams: 80 });
    const scaled = scaleFormula(parsed.value, {}, { by: 'pieces', pieces: 24 });
    expect(scaled.dividedDough).toBe(1920); // 24 × 80 g
  });

  it('refuses to write over an existing formula', async () => {
    const target = join(bakery(), 'formulas', 'harbour-rolls.yaml');
    writeFileSync(target, 'keep me\n');
    const r = await cli.run(['init', '--answers', answersFile(rolls)], { cwd: bakery() });
    expect(r.code).toBe(1);
    expect(r.stderr.split('\n')[0]).toBe('panform: formulas/harbour-rolls.yaml exists already; Panform does not write over a formula');
    expect(readFileSync(target, 'utf8')).toBe('keep me\n');
  });

  it.each([
    [{ ...rolls, flours: [{ name: 'bread flour', percent: 90 }] }, 'panform: the flours must add up to 100 %; they add up to 90 %'],
    [{ ...rolls, id: 'Harbour Rolls' }, 'panform: id must be kebab-case (e.g. "harbour-rolls"); got "Harbour Rolls"'],
    [{ ...rolls, pieces: 0 }, 'panform: pieces must be a whole number of at least 1; got 0'],
    [{ ...rolls, piece: 'lots' }, 'panform: piece: not a weight: "lots"'],
    [{ ...rolls, preferment: { kind: 'poolish', share: 80, hydration: 100 } }, 'formulas/harbour-rolls.yaml:21:14 error pre-ferment "poolish" takes 80 % of "water"'],
  ])('refuses bad answers with exit 1 and writes nothing (%#)', async (answers, message) => {
    const r = await cli.run(['init', '--answers', answersFile(answers)], { cwd: bakery() });
    expect(r.code).toBe(1);
    expect(r.stderr.split('\n')[0]).toContain(message);
    expect(r.stderr).not.toMatch(/\n\s+at /);
    expect(existsSync(join(bakery(), 'formulas', 'harbour-rolls.yaml'))).toBe(false);
  });

  it('asks for --answers when there is no terminal to ask in', async () => {
    const r = await cli.run(['init'], { cwd: bakery(), input: '' });
    expect(r.code).toBe(2);
    expect(r.stderr).toContain('panform: panform init asks questions and needs a terminal');
  });
});

/** Prompt functions that answer from a script, in order; `undefined` takes the default. */
function scripted(answers: unknown[]): Prompts & { asked: string[] } {
  const queue = [...answers];
  const asked: string[] = [];
  const next = (message: string) => {
    asked.push(message);
    if (queue.length === 0) throw new Error(`no scripted answer for: ${message}`);
    return queue.shift();
  };
  return {
    asked,
    async input(q) {
      const v = next(q.message);
      const value = v === undefined ? (q.default ?? '') : String(v);
      const ok = q.validate?.(value) ?? true;
      if (ok !== true) throw new Error(`scripted answer ${JSON.stringify(value)} refused: ${ok}`);
      return value;
    },
    async number(q) {
      const v = next(q.message);
      const value = v === undefined ? q.default : Number(v);
      // The rule @inquirer/number applies: without step 'any', only multiples of the step (1) pass.
      const step = q.step ?? 1;
      if (value !== undefined && step !== 'any' && !Number.isInteger(value / step)) throw new Error(`${q.message}: ${value} refused, must be a multiple of ${step}`);
      return value;
    },
    async select(q) {
      const v = next(q.message);
      return (v === undefined ? q.default ?? q.choices[0].value : v) as never;
    },
    async confirm(q) {
      const v = next(q.message);
      return v === undefined ? (q.default ?? false) : Boolean(v);
    },
  };
}

describe('panform init (questions)', () => {
  it('asks for the formula and writes it', async () => {
    const prompts = scripted([
      'wharf-buns', // id
      undefined, // title: "Wharf buns"
      'enriched', // category
      12, // pieces
      '90 g', // piece weight
      undefined, // loss 2 %
      '26', // dough temperature
      'bread flour', 70, // flour 1
      'whole wheat flour', undefined, // flour 2 takes the rest: 30
      'water', 40,
      'whole milk', 25,
      'fine salt', 2,
      'instant yeast', 1,
      '', // no more ingredients
      'levain', // pre-ferment
      20, // share
      100, // hydration
      'mature culture', // seed
      20, // seed %
    ]);
    const dir = join(bakery(), 'formulas');
    const r = await runInit({ dir }, prompts);
    expect(r.path).toBe(join(dir, 'wharf-buns.yaml'));
    const text = readFileSync(r.path, 'utf8');
    expect(text).toContain('title: Wharf buns');
    expect(text).toContain('  whole wheat flour: 30');
    expect(text).toContain('loss: 2 %');
    expect(text).toContain('      mature culture: 20');
    const parsed = parseFormulaText(text, r.path);
    expect(parsed.ok).toBe(true);
    expect(r.findings.filter((f) => f.severity === 'error')).toEqual([]);
  });

  it('takes decimals for percentages, loss and the pre-ferment, including its own 0.1 % yeast default', async () => {
    const prompts = scripted([
      'quay-baguette', undefined, 'lean', 20, '350 g',
      1.5, // loss
      '', // no dough temperature
      'bread flour', undefined,
      'water', 72.5,
      'fine salt', 1.8,
      'instant yeast', 0.35,
      '',
      'poolish',
      33.3, // share
      undefined, // hydration 100
      undefined, // yeast 0.1 % of the poolish's flour (the default)
    ]);
    const r = await runInit({ dir: join(bakery(), 'formulas') }, prompts);
    const text = readFileSync(r.path, 'utf8');
    expect(text).toContain('  water: 72.5');
    expect(text).toContain('  fine salt: 1.8');
    expect(text).toContain('loss: 1.5 %');
    expect(text).toContain('    share: 33.3 %');
    expect(text).toContain('      instant yeast: 0.1');
  });

  it('will not take an id that exists already', async () => {
    const dir = join(bakery(), 'formulas');
    writeFileSync(join(dir, 'taken.yaml'), 'x: 1\n');
    const prompts = scripted(['taken']);
    await expect(runInit({ dir }, prompts)).rejects.toThrow(/a formula with this id exists already/);
  });
});

describe('renderFormulaYaml', () => {
  it('quotes names that YAML would misread', () => {
    const text = renderFormulaYaml({ ...rolls, title: 'Rolls: the "harbour" kind', ingredients: [{ name: 'yes', percent: 1 }], preferment: null }, 'x.json');
    expect(text).toContain('title: "Rolls: the \\"harbour\\" kind"');
    expect(text).toContain('  "yes": 1');
  });
});

describe('schemaReference', () => {
  it('points at the project\'s schema, relative to the new file', () => {
    expect(schemaReference(join(ROOT, 'formulas'))).toBe('../shared/schema/formula.schema.json');
  });
});
