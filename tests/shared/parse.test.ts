import { readFileSync } from 'node:fs';
import { describe, expect, it } from 'vitest';
import { parseFormulaText, parseYamlText } from '#shared/parse';

// shared/parse.ts reads YAML with the `yaml` package (YAML 1.2 core schema), with source positions.
describe('parseYamlText', () => {
  it('locates a schema finding on its line and column', () => {
    const text = readFileSync(new URL('../../formulas/harbour-ciabatta.yaml', import.meta.url), 'utf8');
    const broken = text.replace(/^status: .*$/m, 'status: maybe');
    const parsed = parseFormulaText(broken, 'harbour-ciabatta.yaml');
    expect(parsed.ok).toBe(false);
    const line = broken.split('\n').findIndex((l) => l.startsWith('status:')) + 1;
    expect(parsed.findings[0]).toMatchObject({ line, col: 9 });
  });

  it('reports syntax errors located', () => {
    const r = parseYamlText('a: 1\na: 2\n', 'x.yaml');
    expect(r.ok).toBe(false);
    if (!r.ok) expect(r.findings[0]).toMatchObject({ line: 2, col: 1, message: expect.stringMatching(/duplicate key/) });
  });

  it('reads a lone "&" in a note as plain text, and expands an alias', () => {
    const r = parseYamlText('note: salt & water\na: &x [1]\nb: *x\n', 'x.yaml');
    expect(r.ok && r.data).toEqual({ note: 'salt & water', a: [1], b: [1] });
  });
});
