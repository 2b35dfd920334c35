// The CLI bundle validates files with standalone code generated at build time
// (scripts/standalone-validators.mjs); tests and the server compile the schemas with ajv at run
// time (shared/schema/validators.ts). Both must judge every file the same way and report the same
// errors, or `panform check` and the viewer's loads would disagree. Checked over the demo files
// and thousands of generated and damaged ones.
import { mkdirSync, readdirSync, readFileSync, rmSync, writeFileSync } from 'node:fs';
import { join } from 'node:path';
import { pathToFileURL } from 'node:url';
import fc from 'fast-check';
import type { ValidateFunction } from 'ajv';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { parseYamlText } from '#shared/parse';
import type { SchemaKind } from '#shared/schema/shapes';
import { validatorFor as runtimeValidatorFor } from '#shared/schema/validators';
import { applyMutation, catalogText, formulaArb, fuzzRuns, fuzzTimeout, mutationArb } from './generators.ts';

const RUNS = fuzzRuns(500);
// Inside the project, so the generated module resolves ajv's runtime helpers from node_modules.
const dir = join(process.cwd(), 'node_modules', '.cache', 'panform-tests');
const file = join(dir, `validators-${process.pid}.mjs`);
let standaloneValidatorFor: (kind: SchemaKind) => ValidateFunction;

beforeAll(async () => {
  const script = pathToFileURL(join(process.cwd(), 'scripts', 'standalone-validators.mjs')).href;
  const { generateValidatorsModule } = (await import(script)) as { generateValidatorsModule: () => string };
  mkdirSync(dir, { recursive: true });
  writeFileSync(file, generateValidatorsModule());
  ({ validatorFor: standaloneValidatorFor } = (await import(pathToFileURL(file).href)) as { validatorFor: typeof standaloneValidatorFor });
});
afterAll(() => rmSync(file, { force: true }));

function verdict(v: ValidateFunction, data: unknown) {
  const ok = v(data);
  return { ok, errors: (v.errors ?? []).map((e) => ({ instancePath: e.instancePath, keyword: e.keyword, params: e.params })) };
}

function expectSameVerdict(kind: SchemaKind, text: string): void {
  const y = parseYamlText(text, 'x.yaml');
  if (!y.ok || y.data === null || typeof y.data !== 'object') return;
  expect(verdict(standaloneValidatorFor(kind), y.data)).toEqual(verdict(runtimeValidatorFor(kind), y.data));
}

const demo = (() => {
  const out: { kind: SchemaKind; text: string }[] = [{ kind: 'catalog', text: catalogText }];
  const root = join(process.cwd(), 'formulas');
  for (const f of readdirSync(root)) {
    if (f.endsWith('.yaml')) out.push({ kind: f === 'ingredients.yaml' ? 'catalog' : 'formula', text: readFileSync(join(root, f), 'utf8') });
  }
  for (const f of readdirSync(join(root, 'plans'))) out.push({ kind: 'plan', text: readFileSync(join(root, 'plans', f), 'utf8') });
  return out;
})();

describe('standalone schema validators', () => {
  it('accept every demo file, as the run-time validators do', () => {
    for (const s of demo) expectSameVerdict(s.kind, s.text);
  });

  it('give the same errors as the run-time validators for damaged demo files', { timeout: fuzzTimeout(RUNS) }, () => {
    fc.assert(
      fc.property(fc.constantFrom(...demo), fc.array(mutationArb, { minLength: 1, maxLength: 3 }), (s, ms) => {
        expectSameVerdict(s.kind, ms.reduce(applyMutation, s.text));
      }),
      { numRuns: RUNS },
    );
  });

  it('give the same verdict as the run-time validators for generated formulas, whole and damaged', { timeout: fuzzTimeout(RUNS) }, () => {
    fc.assert(
      fc.property(formulaArb, fc.array(mutationArb, { maxLength: 2 }), (g, ms) => {
        expectSameVerdict('formula', ms.reduce(applyMutation, g.text));
      }),
      { numRuns: RUNS },
    );
  });
});
