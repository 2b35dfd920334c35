import { readdirSync, readFileSync } from 'node:fs';
import { describe, expect, it } from 'vitest';
import { parseCatalogText, parseFormulaText } from '#shared/parse';
import { scaleFormula, sum } from '#shared/scale';

// The demo bakery's formulas must not only check clean but scale: every part of the batch
// adds back up to the mixed dough (final dough = overall − what the builds take, plus the builds).
const root = new URL('../../formulas/', import.meta.url);
const read = (name: string) => readFileSync(new URL(name, root), 'utf8');
const names = readdirSync(root).filter((n) => n.endsWith('.yaml') && n !== 'ingredients.yaml');

describe('scaleFormula on the demo formulas', () => {
  const catalog = parseCatalogText(read('ingredients.yaml'), 'formulas/ingredients.yaml');

  it('has between 8 and 12 formulas, one of them a draft and one retired', () => {
    expect(names.length).toBeGreaterThanOrEqual(8);
    expect(names.length).toBeLessThanOrEqual(12);
    const statuses = names.map((n) => {
      const p = parseFormulaText(read(n), n);
      return p.ok ? p.value.status : 'broken';
    });
    expect(statuses).toContain('draft');
    expect(statuses).toContain('retired');
  });

  it.each(names)('%s scales to its reference batch and its parts sum to the mixed dough', (name) => {
    if (!catalog.ok) throw new Error('the demo catalog must parse');
    const parsed = parseFormulaText(read(name), `formulas/${name}`);
    if (!parsed.ok) throw new Error(`${name} must parse: ${parsed.findings.map((f) => f.message).join('; ')}`);
    const f = parsed.value;
    const r = scaleFormula(f, catalog.value, { by: 'pieces', pieces: f.yield.pieces });
    // D = N·P; M = D / (1 − loss) (docs/arithmetic.md, "Scaling").
    expect(r.dividedDough).toBeCloseTo(f.yield.pieces * f.yield.pieceGrams, 6);
    expect(r.mixedDough).toBeCloseTo(r.dividedDough / (1 - f.loss / 100), 6);
    expect(sum(r.overall.map((l) => l.grams))).toBeCloseTo(r.mixedDough, 6);
    expect(sum(r.finalDough.map((l) => l.grams))).toBeCloseTo(r.mixedDough, 6);
    for (const l of r.finalDough) expect(l.grams).toBeGreaterThan(0);
    for (const b of r.preferments) for (const l of b.ingredients) expect(l.weigh).toBeGreaterThanOrEqual(0);
  });
});
