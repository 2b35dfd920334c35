// One vocabulary for the steps, the trade's: the sheet, its chart legend and the viewer say the same.
import { readdirSync, readFileSync, statSync } from 'node:fs';
import { join } from 'node:path';
import { describe, expect, it } from 'vitest';
import { PALETTE } from '#shared/sheet/chart';
import { STEP_WORDS, stepWord } from '#shared/step-words';
import { STEP_KINDS } from '#shared/schema/vocabulary';

const ROOT = new URL('../../', import.meta.url).pathname;
const files = (dir: string): string[] =>
  readdirSync(dir).flatMap((n) => (statSync(join(dir, n)).isDirectory() ? files(join(dir, n)) : /\.(ts|tsx)$/.test(n) ? [join(dir, n)] : []));

describe('stepWord', () => {
  it('names every step kind, with the trade terms', () => {
    for (const k of STEP_KINDS) expect(STEP_WORDS[k]).toBeTruthy();
    expect(stepWord('bulk')).toBe('bulk fermentation');
    expect(stepWord('retard')).toBe('retard');
    expect(stepWord('proof')).toBe('proof');
  });

  it('is the only vocabulary: the chart legend uses it, and no surface says "first rise" or "cold hold"', () => {
    expect(PALETTE.map((p) => p.label).join(', ')).toContain('bulk fermentation');
    expect(PALETTE.map((p) => p.label)).toContain('retard');
    const offenders = [...files(join(ROOT, 'src')), ...files(join(ROOT, 'shared/sheet')), ...files(join(ROOT, 'cli'))].filter((f) =>
      /first rise|cold hold/i.test(readFileSync(f, 'utf8')),
    );
    expect(offenders).toEqual([]);
  });
});
