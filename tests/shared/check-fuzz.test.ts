import { readdirSync, readFileSync } from 'node:fs';
import fc from 'fast-check';
import { describe, expect, it } from 'vitest';
import { checkFileText, type CheckRequest } from '#shared/check/check-file';
import { parseCatalogText } from '#shared/parse';

// Whatever bytes a file holds, checking it returns findings: it never throws, and no check
// trips over its own bug (which would show as an "internal error" finding).
const root = new URL('../../formulas/', import.meta.url);
const demo = [
  ...readdirSync(root).filter((n) => n.endsWith('.yaml')),
  ...readdirSync(new URL('plans/', root)).map((n) => `plans/${n}`),
].map((name) => ({ name, text: readFileSync(new URL(name, root), 'utf8') }));
const catalogText = readFileSync(new URL('ingredients.yaml', root), 'utf8');
const parsedCatalog = parseCatalogText(catalogText, 'ingredients.yaml');
const catalog = parsedCatalog.ok ? parsedCatalog.value : null;
const formulas = new Map([['harbour-ciabatta', { status: 'active' }]]);
const runs = Number(process.env.PANFORM_FUZZ_RUNS ?? 200);

function requests(text: string): CheckRequest[] {
  return [
    { kind: 'formula', file: 'x.yaml', text, catalog },
    { kind: 'formula', file: 'x.yaml', text, catalog: null },
    { kind: 'catalog', file: 'ingredients.yaml', text },
    { kind: 'plan', file: 'plans/2026-12-03.yaml', text, formulas, formulasDir: 'formulas/' },
  ];
}

/** The demo file's own kind: a catalog checked as a catalog, a plan as a plan. */
function kindOf(name: string): number {
  return name === 'ingredients.yaml' ? 2 : name.startsWith('plans/') ? 3 : 0;
}

function expectCheckedCleanly(text: string, only?: number): void {
  const all = requests(text);
  for (const req of only === undefined ? all : [all[only]]) {
    const r = checkFileText(req);
    for (const f of r.findings) {
      expect(f.message).not.toMatch(/internal error/);
      expect(f.line).toBeGreaterThanOrEqual(1);
      expect(f.col).toBeGreaterThanOrEqual(1);
    }
  }
}

describe('checkFileText on arbitrary input', () => {
  it('never throws on random bytes', () => {
    fc.assert(
      fc.property(fc.uint8Array({ maxLength: 400 }), (bytes) => {
        expectCheckedCleanly(Buffer.from(bytes).toString('utf8'));
      }),
      { numRuns: runs, seed: 20261203 },
    );
  });

  it('never throws on a demo file cut short anywhere', () => {
    for (const { name, text } of demo) {
      const step = Math.max(1, Math.floor(text.length / 40));
      for (let i = 0; i <= text.length; i += step) expectCheckedCleanly(text.slice(0, i), kindOf(name));
    }
  });

  it('never throws on a demo file with characters replaced or spliced in', () => {
    const edit = fc.record({
      file: fc.integer({ min: 0, max: demo.length - 1 }),
      at: fc.nat(),
      cut: fc.integer({ min: 0, max: 8 }),
      insert: fc.oneof(
        fc.string({ maxLength: 6 }),
        fc.constantFrom(': ', '- ', '{', '}', '[', ']', '&a', '*a', '"', "'", '#', '\t', '\u0000', '-1', '.inf', '.nan', '1e309', '__proto__', 'constructor', '\n  '),
      ),
    });
    fc.assert(
      fc.property(edit, ({ file, at, cut, insert }) => {
        const text = demo[file].text;
        const i = at % (text.length + 1);
        expectCheckedCleanly(text.slice(0, i) + insert + text.slice(i + cut), kindOf(demo[file].name));
      }),
      { numRuns: runs, seed: 20261204 },
    );
  });

  it.each([
    ['a YAML alias bomb', 'a: &a [x, x, x, x, x, x, x, x]\nb: &b [*a, *a, *a, *a, *a, *a, *a, *a]\nc: &c [*b, *b, *b, *b, *b, *b, *b, *b]\nd: [*c, *c, *c, *c, *c, *c, *c, *c]\n'],
    ['a prototype key', 'id: x\ntitle: t\nstatus: active\ncategory: lean\nyield: {pieces: 1, piece: 1 g}\nflour: {__proto__: 100}\ningredients: {constructor: 5, toString: 1}\n'],
    ['infinite and missing numbers', 'id: x\ntitle: t\nstatus: active\ncategory: lean\nyield: {pieces: 1, piece: 1 g}\nflour: {a: .inf}\ningredients: {b: .nan}\n'],
    ['a lone byte-order mark', '\uFEFF'],
    ['deep nesting', `${'['.repeat(500)}${']'.repeat(500)}`],
  ])('never throws on %s', (_, text) => {
    expectCheckedCleanly(text);
  });
});
