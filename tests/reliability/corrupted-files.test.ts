// Thousands of corrupted files (byte flips, truncation, deleted or doubled lines, swapped units,
// broken numbers, stray indentation, random unicode) made from the demo bakery's files and from
// generated formulas. Whatever the damage, reading a file gives either a valid value or located
// findings (file:line:col and a one-line message), and never throws. Run count: PANFORM_FUZZ_RUNS.
import { existsSync, readdirSync, readFileSync } from 'node:fs';
import { join } from 'node:path';
import fc from 'fast-check';
import { describe, expect, it } from 'vitest';
import { parseCatalogText, parseFormulaText, parsePlanText, type Finding, type Parsed } from '#shared/parse';
import { applyMutation, catalogText, formulaArb, fuzzRuns, mutationArb } from './generators.ts';

const RUNS = fuzzRuns(1000);

type Kind = 'formula' | 'catalog' | 'plan';
interface Sample {
  name: string;
  kind: Kind;
  text: string;
}

const FALLBACK_PLAN = `date: 2026-12-03
ready_by: "06:00"
conditions: { room: 22 °C, flour: 20 °C, tap_water: 14 °C }
mixers:
  - { name: spiral, capacity: 50 kg, friction: 13 °C }
orders:
  - { formula: harbour-ciabatta, pieces: 60 }
  - { formula: country-levain, pieces: 18, piece: 900 g }
`;

/** The demo bakery's files (formulas/), with a generated catalog and a plan as a floor. */
function demoSamples(): Sample[] {
  const root = join(process.cwd(), 'formulas');
  const out: Sample[] = [
    { name: 'fuzz/ingredients.yaml', kind: 'catalog', text: catalogText },
    { name: 'fuzz/plans/2026-12-03.yaml', kind: 'plan', text: FALLBACK_PLAN },
  ];
  const read = (dir: string, kind: (file: string) => Kind) => {
    if (!existsSync(dir)) return;
    for (const f of readdirSync(dir).sort()) {
      if (!/\.ya?ml$/.test(f)) continue;
      out.push({ name: join(dir, f), kind: kind(f), text: readFileSync(join(dir, f), 'utf8') });
    }
  };
  read(root, (f) => (f === 'ingredients.yaml' ? 'catalog' : 'formula'));
  read(join(root, 'plans'), () => 'plan');
  return out;
}

const samples = demoSamples();

function parseAs(kind: Kind, text: string, file: string): Parsed<unknown> {
  if (kind === 'formula') return parseFormulaText(text, file);
  if (kind === 'catalog') return parseCatalogText(text, file);
  return parsePlanText(text, file);
}

function assertLocated(f: Finding, file: string, text: string): void {
  const lines = text.split('\n').length;
  const where = `${f.file}:${f.line}:${f.col} ${JSON.stringify(f.message)}`;
  if (f.file !== file) throw new Error(`finding names another file: ${where}`);
  if (!Number.isInteger(f.line) || f.line < 1 || f.line > lines + 1) throw new Error(`line out of the file (${lines} lines): ${where}`);
  if (!Number.isInteger(f.col) || f.col < 1) throw new Error(`column not a positive whole number: ${where}`);
  if (f.severity !== 'error' && f.severity !== 'warning') throw new Error(`unknown severity: ${where}`);
  if (typeof f.message !== 'string' || f.message.trim() === '' || f.message.includes('\n')) throw new Error(`message not one line: ${where}`);
  if (/\bundefined\b|\[object Object\]/.test(f.message)) throw new Error(`message leaks a programming value: ${where}`);
}

function assertReadable(kind: Kind, text: string, file: string): void {
  let parsed: Parsed<unknown>;
  try {
    parsed = parseAs(kind, text, file);
  } catch (e) {
    throw new Error(`reading a corrupted ${kind} threw ${(e as Error).name}: ${(e as Error).message}\n--- text ---\n${text}`);
  }
  if (parsed.ok) {
    expect(parsed.value).toBeTypeOf('object');
  } else {
    expect(parsed.findings.length).toBeGreaterThan(0);
  }
  for (const f of parsed.findings) assertLocated(f, file, text);
}

const sampleArb = fc.constantFrom(...samples);

describe('reading corrupted files', () => {
  it('reads every demo file as it is, without a finding', () => {
    for (const s of samples) {
      const parsed = parseAs(s.kind, s.text, s.name);
      expect(parsed.findings.map((f) => `${f.line}:${f.col} ${f.message}`), s.name).toEqual([]);
    }
  });

  // Damage the fuzzing once found; kept as plain cases so they never come back.
  it.each([
    ['a weight written as a percentage', 'loss: 0 %', 'loss: 0 kg', 'loss is not written as expected (a percentage, e.g. "2 %")'],
    ['a negative piece weight', 'piece: 20 g', 'piece: -1 g', 'yield.piece is not written as expected (a weight with its unit, e.g. "320 g")'],
  ])('reports %s as a located finding', (_, from, to, message) => {
    const text = `id: a\ntitle: A\nstatus: draft\ncategory: lean\nyield:\n  pieces: 1\n  piece: 20 g\nloss: 0 %\nflour:\n  rye flour: 100\ningredients:\n  water: 40\n`.replace(from, to);
    const parsed = parseFormulaText(text, 'a.yaml');
    expect(parsed.ok).toBe(false);
    expect(parsed.findings.map((f) => `${f.line}:${f.col} ${f.message}`)).toEqual([`${to.startsWith('loss') ? 8 : 7}:${to.startsWith('loss') ? 7 : 10} ${message}`]);
  });

  it('reports located findings and never throws for randomly damaged demo files', () => {
    fc.assert(
      fc.property(sampleArb, fc.array(mutationArb, { minLength: 1, maxLength: 4 }), (s, mutations) => {
        const text = mutations.reduce(applyMutation, s.text);
        assertReadable(s.kind, text, s.name);
      }),
      { numRuns: RUNS },
    );
  });

  it('reports located findings and never throws for randomly damaged generated formulas', () => {
    fc.assert(
      fc.property(formulaArb, fc.array(mutationArb, { minLength: 1, maxLength: 3 }), (g, mutations) => {
        assertReadable('formula', mutations.reduce(applyMutation, g.text), 'fuzz/formula.yaml');
      }),
      { numRuns: RUNS },
    );
  });

  it('reports located findings and never throws for any text at all, read as each kind of file', () => {
    fc.assert(
      fc.property(fc.string({ unit: 'binary', maxLength: 300 }), fc.constantFrom<Kind>('formula', 'catalog', 'plan'), (text, kind) => {
        assertReadable(kind, text, 'fuzz/any.yaml');
      }),
      { numRuns: RUNS },
    );
  });
});
