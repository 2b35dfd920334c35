import { readdirSync, readFileSync } from 'node:fs';
import fc from 'fast-check';
import { describe, expect, it } from 'vitest';
import { parseDocument } from 'yaml';
import { parseFormulaText, parseYamlText, quickReadYaml } from '#shared/parse';
import { applyMutation, fuzzRuns, mutationArb } from '../reliability/generators.ts';

// shared/parse.ts reads a file with js-yaml when it can and with the `yaml` package otherwise
// (and for positions). Whenever the quick read is taken, the full reader must accept the same
// text and mean the same data by it: the quick read is an optimisation, never a second dialect.
const root = new URL('../../formulas/', import.meta.url);
const demo = [
  ...readdirSync(root).filter((n) => n.endsWith('.yaml')),
  ...readdirSync(new URL('plans/', root)).map((n) => `plans/${n}`),
].map((name) => ({ name, text: readFileSync(new URL(name, root), 'utf8') }));

/** The full reader's verdict: its data, or null when it reports any error. */
function fullRead(text: string): { data: unknown } | null {
  const doc = parseDocument(text, { uniqueKeys: true, prettyErrors: false, strict: true });
  if (doc.errors.length > 0) return null;
  try {
    return { data: doc.toJS({ maxAliasCount: 100 }) };
  } catch {
    return null;
  }
}

function expectSameMeaning(text: string): void {
  const quick = quickReadYaml(text);
  if (!quick) return;
  const full = fullRead(text);
  expect(full, `the quick read accepted what the full reader refuses:\n${text}`).not.toBeNull();
  expect(quick.data).toStrictEqual(full!.data);
}

describe('the quick YAML read agrees with the full reader', () => {
  it.each(demo.map((d) => [d.name, d.text]))('on the demo file %s', (_, text) => {
    expect(quickReadYaml(text)).not.toBeNull();
    expectSameMeaning(text);
  });

  it.each([
    // YAML 1.2 core schema scalars (yaml.org/spec/1.2.2, 10.3.2 "Tag Resolution"), and YAML 1.1
    // forms that 1.2 reads as strings.
    ['integers', 'a: 12\nb: -3\nc: 0o17\nd: 0x1F\ne: +7\nf: 017\n'],
    ['floats', 'a: 1.5\nb: -3.5e2\nc: .5\nd: .inf\ne: -.Inf\nf: 1e3\n'],
    ['booleans and nulls', 'a: true\nb: False\nc: TRUE\nd: ~\ne: null\nf:\n'],
    ['1.1 forms are strings in 1.2', 'a: yes\nb: off\nc: 0b101\nd: 1_000\ne: 12:30\nf: 2026-12-03\n'],
    ['quoted scalars', 'a: "25 °C"\nb: \'320 g\'\nc: "line\\nbreak"\nd: \'it\'\'s\'\n'],
    ['block scalars', 'a: |\n  two\n  lines\nb: >-\n  folded\n  text\n'],
    ['flow collections', 'a: {x: 1, y: [2, 3]}\nb: []\nc: {}\n'],
    ['prototype keys', '__proto__: {x: 1}\nconstructor: 2\ntoString: 3\n'],
    ['a byte-order mark', '\uFEFFa: 1\n'],
    ['comments', '# top\na: 1 # after\nb: "#not"\n'],
    ['an ampersand or a bang in a note', 'notes: mix & fold, then rest\nwarn: hot oven !\n'],
  ])('on %s', (_, text) => {
    expect(quickReadYaml(text)).not.toBeNull();
    expectSameMeaning(text);
  });

  it.each([
    ['a duplicate key', 'a: 1\na: 2\n'],
    ['an alias', 'a: &x [1]\nb: *x\n'],
    ['a tab in the indentation', 'a:\n\t- 1\n'],
    ['two documents', 'a: 1\n---\na: 2\n'],
    ['an unknown tag', 'a: !oven 230\n'],
  ])('leaves %s to the full reader', (_, text) => {
    expect(quickReadYaml(text)).toBeNull();
  });

  it('keeps positions for findings after a quick read', () => {
    const text = demo.find((d) => d.name === 'harbour-ciabatta.yaml')!.text;
    const broken = text.replace(/^status: .*$/m, 'status: maybe');
    const parsed = parseFormulaText(broken, 'harbour-ciabatta.yaml');
    expect(parsed.ok).toBe(false);
    const line = broken.split('\n').findIndex((l) => l.startsWith('status:')) + 1;
    expect(parsed.findings[0]).toMatchObject({ line, col: 9 });
  });

  it('reports syntax errors with the full reader’s located message', () => {
    const r = parseYamlText('a: 1\na: 2\n', 'x.yaml');
    expect(r.ok).toBe(false);
    if (!r.ok) expect(r.findings[0]).toMatchObject({ line: 2, col: 1, message: expect.stringMatching(/duplicate key/) });
  });

  it('on demo files with random edits', () => {
    fc.assert(
      fc.property(fc.integer({ min: 0, max: demo.length - 1 }), fc.array(mutationArb, { minLength: 1, maxLength: 3 }), (file, edits) => {
        expectSameMeaning(edits.reduce((t, m) => applyMutation(t, m), demo[file].text));
      }),
      { numRuns: fuzzRuns(500), seed: 20261202 },
    );
  });

  it('on strings of YAML punctuation and scalars', () => {
    const piece = fc.constantFrom(
      ...['a', 'b', '1', '0', '.', 'e', '-', '+', ' ', '  ', '\n', ':', '#', '"', "'", '[', ']', '{', '}', ',', '|', '>', '~', '!', '&', '*'],
      ...['x: ', '- ', '\\', 'é', '\t', '?', '@', '`', '%', 'null', 'true', '.inf', '1.0', '0x1', '\r\n', '---', '...', '<<', '12:30'],
    );
    fc.assert(
      fc.property(fc.array(piece, { maxLength: 60 }), (parts) => expectSameMeaning(parts.join(''))),
      { numRuns: fuzzRuns(2000), seed: 20261205 },
    );
  });
});
