// Thousands of corrupted files (byte flips, truncation, deleted or doubled lines, swapped units,
// broken numbers, stray indentation, random unicode) made from the demo bakery's files and from
// generated formulas. Whatever the damage, reading a file (shared/parse.ts) and checking it
// (shared/check, what `panform check` runs) give either a valid value or located findings
// (file:line:col and a one-line message): never a throw, and never the check's own "internal
// error" finding, which would mean a check crashed. Also: every demo file cut short at forty
// points, random bytes, and the YAML traps (alias bombs, prototype keys, infinities, deep nesting).
// Run count: PANFORM_FUZZ_RUNS.
import { existsSync, readdirSync, readFileSync } from 'node:fs';
import { join, relative } from 'node:path';
import fc from 'fast-check';
import { describe, expect, it } from 'vitest';
import { parseCatalogText, parseFormulaText, parsePlanText, type Finding, type Parsed } from '#shared/parse';
import { checkFileText, type CheckRequest } from '#shared/check/check-file';
import type { KnownFormula } from '#shared/check/plan';
import type { Catalog } from '#shared/model';
import { applyMutation, catalogText, formulaArb, fuzzRuns, fuzzTimeout, mutationArb } from './generators.ts';

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
      out.push({ name: relative(process.cwd(), join(dir, f)), kind: kind(f), text: readFileSync(join(dir, f), 'utf8') });
    }
  };
  read(root, (f) => (f === 'ingredients.yaml' ? 'catalog' : 'formula'));
  read(join(root, 'plans'), () => 'plan');
  return out;
}

const samples = demoSamples();

function readDemoCatalog(): Catalog {
  const s = samples.find((x) => x.kind === 'catalog' && x.name.endsWith(join('formulas', 'ingredients.yaml'))) ?? samples[0];
  const parsed = parseCatalogText(s.text, s.name);
  if (!parsed.ok) throw new Error(`the catalog ${s.name} does not parse`);
  return parsed.value;
}
const catalog = readDemoCatalog();
const knownFormulas: ReadonlyMap<string, KnownFormula> = new Map(
  samples.filter((s) => s.kind === 'formula').map((s) => [s.name.split('/').pop()!.replace(/\.yaml$/, ''), { status: 'active' }]),
);

function checkRequest(kind: Kind, text: string, file: string, withCatalog: boolean): CheckRequest {
  if (kind === 'formula') return { kind, file, text, catalog: withCatalog ? catalog : null };
  if (kind === 'catalog') return { kind, file, text };
  return { kind, file, text, formulas: knownFormulas, formulasDir: 'formulas' };
}

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

function assertReadable(kind: Kind, text: string, file: string, withCatalog = true): void {
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

  let checked;
  try {
    checked = checkFileText(checkRequest(kind, text, file, withCatalog));
  } catch (e) {
    throw new Error(`checking a corrupted ${kind} threw ${(e as Error).name}: ${(e as Error).message}\n--- text ---\n${text}`);
  }
  for (const f of checked.findings) {
    assertLocated(f, file, text);
    if (/internal error/.test(f.message)) throw new Error(`a check crashed on a corrupted ${kind}: ${f.message}\n--- text ---\n${text}`);
  }
  if (!parsed.ok && !checked.findings.some((f) => f.severity === 'error')) {
    throw new Error(`the file does not parse but the check reports no error\n--- text ---\n${text}`);
  }
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

  it('reports a key written as a YAML collection in a one-line finding', () => {
    const text = `id: a\ntitle: A\nstatus: draft\ncategory: lean\nyield: { pieces: 1, piece: 20 g }\nflour: { rye flour: 100 }\ningredients: { water: 40 }\n? { kind: biga,\n    share: 10 % }\n: 1\n`;
    const parsed = parseFormulaText(text, 'a.yaml');
    expect(parsed.ok).toBe(false);
    expect(parsed.findings.map((f) => f.message)).toEqual(['unknown field "{ kind: biga, share: 10 % }" in the file']);
  });

  it('checks a percentage written as a block of keys without printing a programming value', () => {
    // What a stray indent under `flour:` makes of the next line.
    const text = `id: a\ntitle: A\nstatus: draft\ncategory: lean\nyield: { pieces: 1, piece: 20 g }\nflour:\n  bread flour:\n    water: 40\ningredients: { water: 40 }\n`;
    const r = checkFileText({ kind: 'formula', file: 'a.yaml', text, catalog });
    expect(r.findings.length).toBeGreaterThan(0);
    for (const f of r.findings) expect(f.message).not.toMatch(/\[object Object\]/);
  });

  it('reports located findings and never throws for randomly damaged demo files', { timeout: fuzzTimeout(RUNS) }, () => {
    fc.assert(
      fc.property(sampleArb, fc.array(mutationArb, { minLength: 1, maxLength: 4 }), fc.boolean(), (s, mutations, withCatalog) => {
        const text = mutations.reduce(applyMutation, s.text);
        assertReadable(s.kind, text, s.name, withCatalog);
      }),
      { numRuns: RUNS },
    );
  });

  it('reports located findings and never throws for randomly damaged generated formulas', { timeout: fuzzTimeout(RUNS) }, () => {
    fc.assert(
      fc.property(formulaArb, fc.array(mutationArb, { minLength: 1, maxLength: 3 }), (g, mutations) => {
        assertReadable('formula', mutations.reduce(applyMutation, g.text), 'fuzz/formula.yaml');
      }),
      { numRuns: RUNS },
    );
  });

  it('reports located findings and never throws for any text at all, read as each kind of file', { timeout: fuzzTimeout(RUNS) }, () => {
    // Any string, or any bytes read as UTF-8 (invalid sequences become U+FFFD, as when a file is read).
    const anyText = fc.oneof(
      fc.string({ unit: 'binary', maxLength: 300 }),
      fc.uint8Array({ maxLength: 400 }).map((bytes) => Buffer.from(bytes).toString('utf8')),
    );
    fc.assert(
      fc.property(anyText, fc.constantFrom<Kind>('formula', 'catalog', 'plan'), fc.boolean(), (text, kind, withCatalog) => {
        assertReadable(kind, text, 'fuzz/any.yaml', withCatalog);
      }),
      { numRuns: RUNS },
    );
  });

  it('reports located findings for every demo file cut short at forty points', () => {
    for (const s of samples) {
      const step = Math.max(1, Math.floor(s.text.length / 40));
      for (let i = 0; i <= s.text.length; i += step) {
        assertReadable(s.kind, s.text.slice(0, i), s.name, true);
        if (s.kind === 'formula') assertReadable(s.kind, s.text.slice(0, i), s.name, false);
      }
    }
  });

  it.each([
    ['a YAML alias bomb', 'a: &a [x, x, x, x, x, x, x, x]\nb: &b [*a, *a, *a, *a, *a, *a, *a, *a]\nc: &c [*b, *b, *b, *b, *b, *b, *b, *b]\nd: [*c, *c, *c, *c, *c, *c, *c, *c]\n'],
    ['a prototype key', 'id: x\ntitle: t\nstatus: active\ncategory: lean\nyield: {pieces: 1, piece: 1 g}\nflour: {__proto__: 100}\ningredients: {constructor: 5, toString: 1}\n'],
    ['infinite and missing numbers', 'id: x\ntitle: t\nstatus: active\ncategory: lean\nyield: {pieces: 1, piece: 1 g}\nflour: {a: .inf}\ningredients: {b: .nan}\n'],
    ['a lone byte-order mark', '\uFEFF'],
    ['deep nesting', `${'['.repeat(500)}${']'.repeat(500)}`],
  ])('reports located findings and never throws on %s, read as each kind of file', (_, text) => {
    for (const kind of ['formula', 'catalog', 'plan'] as const) {
      assertReadable(kind, text, 'fuzz/trap.yaml', true);
      if (kind === 'formula') assertReadable(kind, text, 'fuzz/trap.yaml', false);
    }
  });
});
