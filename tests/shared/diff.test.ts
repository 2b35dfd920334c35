import { describe, expect, it } from 'vitest';
import { describeStep, diffFormulas } from '#shared/diff';
import type { Catalog, Formula } from '#shared/model';
import { parseCatalogText, parseFormulaText } from '#shared/parse';

function formula(text: string): Formula {
  const p = parseFormulaText(text, 'test-loaf.yaml');
  if (!p.ok) throw new Error(p.findings.map((f) => f.message).join('; '));
  return p.value;
}
function catalog(text: string): Catalog {
  const p = parseCatalogText(text, 'ingredients.yaml');
  if (!p.ok) throw new Error(p.findings.map((f) => f.message).join('; '));
  return p.value;
}

const CATALOG = catalog(`
bread flour: { kind: flour }
rye flour: { kind: flour }
water: { kind: water }
fine salt: { kind: salt }
instant yeast: { kind: yeast, yeast: instant }
whole milk: { kind: dairy, water: 88 % }
sunflower seeds: { kind: seed }
`);

const OLD = formula(`
id: test-loaf
title: Test loaf
status: draft
category: lean
yield: { pieces: 10, piece: 500 g }
flour: { bread flour: 100 }
ingredients: { water: 70, fine salt: 2, instant yeast: 1 }
process:
  - { step: mix, minutes: 10 }
  - { step: bulk, minutes: 90 }
  - { step: bake, minutes: 30, temperature: 230 °C }
`);

const NEW = formula(`
id: test-loaf
title: Test loaf
status: active
category: lean
yield: { pieces: 10, piece: 500 g }
loss: 2 %
flour: { bread flour: 90, rye flour: 10 }
ingredients: { water: 75, fine salt: 2, instant yeast: 1, whole milk: 10 }
preferments:
  - name: poolish
    kind: poolish
    share: 30 %
    ingredients: { bread flour: 100, water: 100, instant yeast: 0.1 }
    ripen: { hours: 12-16, temperature: 20 °C }
process:
  - { step: mix, minutes: 12 }
  - { step: bulk, minutes: 90, folds: { count: 2, every: 30 } }
  - { step: divide }
  - { step: bake, minutes: 30, temperature: 230 °C }
`);

describe('diffFormulas', () => {
  const d = diffFormulas(OLD, NEW, CATALOG);

  it('lists flour and ingredient lines added, removed and re-percented with their change in points', () => {
    expect(d.change).toBe('changed');
    expect(d.flour).toEqual([
      { ingredient: 'bread flour', change: 'changed', before: 100, after: 90, delta: -10 },
      { ingredient: 'rye flour', change: 'added', before: null, after: 10, delta: 10 },
    ]);
    expect(d.ingredients).toEqual([
      { ingredient: 'water', change: 'changed', before: 70, after: 75, delta: 5 },
      { ingredient: 'whole milk', change: 'added', before: null, after: 10, delta: 10 },
    ]);
  });

  it('shows a new pre-ferment with its kind, share, lines and ripening', () => {
    expect(d.preferments).toHaveLength(1);
    const p = d.preferments[0];
    expect(p).toMatchObject({ name: 'poolish', change: 'added', kind: { before: null, after: 'poolish' }, share: { before: null, after: 30 } });
    expect(p.lines.map((l) => [l.ingredient, l.after])).toEqual([['bread flour', 100], ['water', 100], ['instant yeast', 0.1]]);
    expect(p.fields).toEqual([{ field: 'ripen', label: 'ripening', before: null, after: '12–16 h at 20 °C' }]);
  });

  it('names the status and loss changes as plain fields', () => {
    expect(d.fields).toEqual([
      { field: 'status', label: 'status', before: 'draft', after: 'active' },
      { field: 'loss', label: 'loss', before: '0 %', after: '2 %' },
    ]);
  });

  it('names a changed bake loss and changed finishes, which change the label', () => {
    const after = { ...OLD, bakeLoss: 12, finishes: [{ ingredient: 'whole milk', perPieceGrams: 3, use: 'wash' as const }] };
    expect(diffFormulas(OLD, after, CATALOG).fields).toEqual([
      { field: 'bakeLoss', label: 'bake loss', before: null, after: '12 %' },
      { field: 'finishes', label: 'finishes', before: null, after: 'whole milk 3 g a piece (wash)' },
    ]);
  });

  it('matches process steps in order and reports changed settings, added and unchanged steps', () => {
    expect(d.process).toEqual([
      { change: 'changed', step: 'mix', beforeIndex: 1, afterIndex: 1, before: 'mix 10 min', after: 'mix 12 min', fields: ['minutes'] },
      { change: 'changed', step: 'bulk', beforeIndex: 2, afterIndex: 2, before: 'bulk 90 min', after: 'bulk 90 min, 2 folds every 30 min', fields: ['folds'] },
      { change: 'added', step: 'divide', beforeIndex: null, afterIndex: 3, before: null, after: 'divide', fields: [] },
    ]);
  });

  it("computes each side's reference-batch figures", () => {
    const byKey = Object.fromEntries(d.figures.rows.map((r) => [r.key, r]));
    // Old: total % = 100 + 70 + 2 + 1 = 173; D = M = 10 × 500 g; F = 5000 / 1.73 (docs/arithmetic.md).
    expect(byKey.totalPercent.before).toBeCloseTo(173, 9);
    expect(byKey.flour.before).toBeCloseTo(5000 / 1.73, 9);
    expect(byKey.hydration.before).toBeCloseTo(70, 9);
    expect(byKey.prefermentedFlour.before).toBeCloseTo(0, 9);
    // New: total % = 90 + 10 + 75 + 2 + 1 + 10 = 188; M = 5000 / (1 − 0.02); F = M / 1.88.
    expect(byKey.totalPercent.after).toBeCloseTo(188, 9);
    expect(byKey.mixedDough.after).toBeCloseTo(5000 / 0.98, 9);
    expect(byKey.flour.after).toBeCloseTo(5000 / 0.98 / 1.88, 9);
    expect(byKey.dividedDough.after).toBeCloseTo(5000, 9);
    expect(byKey.dividedDough.changed).toBe(false);
    expect(byKey.hydration.after).toBeCloseTo(75, 9);
    // Effective hydration adds the milk's water: 75 + 10 × 0.88 (milk water 88 %: USDA SR28 NDB 01077, as in the test catalog).
    expect(byKey.effectiveHydration.after).toBeCloseTo(83.8, 9);
    expect(byKey.prefermentedFlour.after).toBeCloseTo(30, 9);
    // Final dough: water 75 − 30 in the poolish; flour 90 − 30 bread + 10 rye = 70 → 45 / 70.
    expect(byKey.finalDoughHydration.after).toBeCloseTo((45 / 70) * 100, 9);
    expect(byKey.hydration.delta).toBeCloseTo(5, 9);
    expect(d.figures.batchBefore).toBe('10 × 500 g');
  });

  it('calls a version that differs only in comments and layout unchanged', () => {
    const same = formula(`# a comment\nid: test-loaf\ntitle: Test loaf\nstatus: draft\ncategory: lean\nyield: { pieces: 10, piece: 500 g }\nflour:\n  bread flour: 100\ningredients: { water: 70, fine salt: 2, instant yeast: 1 }\nprocess:\n  - { step: mix, minutes: 10 }\n  - { step: bulk, minutes: 90 }\n  - { step: bake, minutes: 30, temperature: 230 °C }\n`);
    const u = diffFormulas(OLD, same, CATALOG);
    expect(u.change).toBe('unchanged');
    expect(u.figures.rows.every((r) => !r.changed)).toBe(true);
  });

  it('reports an added and a removed formula with one side of figures', () => {
    const added = diffFormulas(null, NEW, CATALOG);
    expect(added.change).toBe('added');
    expect(added.figures.before).toBeNull();
    expect(added.figures.after?.totalPercent).toBeCloseTo(188, 9);
    expect(added.flour.map((l) => l.change)).toEqual(['added', 'added']);
    const removed = diffFormulas(OLD, null, CATALOG);
    expect(removed.change).toBe('removed');
    expect(removed.id).toBe('test-loaf');
    expect(removed.process.map((s) => s.change)).toEqual(['removed', 'removed', 'removed']);
  });

  it("uses the old side's catalog for the old figures", () => {
    const wetterMilk = catalog('bread flour: { kind: flour }\nrye flour: { kind: flour }\nwater: { kind: water }\nfine salt: { kind: salt }\ninstant yeast: { kind: yeast, yeast: instant }\nwhole milk: { kind: dairy, water: 90 % }\n');
    const c = diffFormulas(NEW, NEW, CATALOG, wetterMilk);
    const eff = c.figures.rows.find((r) => r.key === 'effectiveHydration')!;
    expect(eff.before).toBeCloseTo(75 + 9, 9); // 10 % milk at 90 % water
    expect(eff.after).toBeCloseTo(75 + 8.8, 9); // 10 % milk at 88 % water
    expect(c.change).toBe('changed');
  });

  it('shows a soaker whose seeds changed, and a pre-ferment whose share and kind changed', () => {
    const a = formula(`
id: test-loaf
title: Seeded
status: active
category: rye
yield: { pieces: 4, piece: 800 g }
flour: { bread flour: 100 }
ingredients: { water: 80, fine salt: 2, instant yeast: 0.5, sunflower seeds: 10 }
preferments:
  - { name: starter, kind: poolish, share: 20 %, ingredients: { bread flour: 100, water: 100 } }
soakers:
  - { name: seed soak, ingredients: { sunflower seeds: 10, water: 10 }, soak: { hours: 4-12 } }
`);
    const b = formula(`
id: test-loaf
title: Seeded
status: active
category: rye
yield: { pieces: 4, piece: 800 g }
flour: { bread flour: 100 }
ingredients: { water: 80, fine salt: 2, instant yeast: 0.5, sunflower seeds: 12 }
preferments:
  - { name: starter, kind: sponge, share: 25 %, ingredients: { bread flour: 100, water: 60 } }
soakers:
  - { name: seed soak, ingredients: { sunflower seeds: 12, water: 12 }, soak: { hours: 4-12, hot: true } }
`);
    const s = diffFormulas(a, b, CATALOG);
    expect(s.preferments).toEqual([
      {
        name: 'starter',
        change: 'changed',
        kind: { before: 'poolish', after: 'sponge' },
        share: { before: 20, after: 25 },
        lines: [{ ingredient: 'water', change: 'changed', before: 100, after: 60, delta: -40 }],
        fields: [],
      },
    ]);
    expect(s.soakers).toEqual([
      {
        name: 'seed soak',
        change: 'changed',
        lines: [
          { ingredient: 'sunflower seeds', change: 'changed', before: 10, after: 12, delta: 2 },
          { ingredient: 'water', change: 'changed', before: 10, after: 12, delta: 2 },
        ],
        fields: [{ field: 'soak', label: 'soaking', before: '4–12 h', after: '4–12 h hot' }],
      },
    ]);
    const pf = s.figures.rows.find((r) => r.key === 'prefermentedFlour')!;
    expect([pf.before, pf.after]).toEqual([20, 25]);
  });

  it('matches reordered steps by kind and keeps the rest in place', () => {
    const a = formula('id: test-loaf\ntitle: T\nstatus: active\ncategory: lean\nyield: { pieces: 1, piece: 500 g }\nflour: { bread flour: 100 }\ningredients: { water: 70 }\nprocess:\n  - { step: mix }\n  - { step: bulk }\n  - { step: shape }\n  - { step: proof }\n');
    const b = formula('id: test-loaf\ntitle: T\nstatus: active\ncategory: lean\nyield: { pieces: 1, piece: 500 g }\nflour: { bread flour: 100 }\ningredients: { water: 70 }\nprocess:\n  - { step: mix }\n  - { step: shape }\n  - { step: bulk }\n  - { step: proof }\n');
    const r = diffFormulas(a, b, CATALOG).process;
    expect(r.map((s) => `${s.change} ${s.step}`)).toEqual(['removed bulk', 'added bulk']);
  });
});

describe('describeStep', () => {
  it.each([
    [{ step: 'bulk' as const, minutes: { min: 180, max: 240 }, temperature: 26, folds: { count: 4, every: 30 } }, 'bulk 3–4 h at 26 °C, 4 folds every 30 min'],
    [{ step: 'bake' as const, minutes: { min: 45, max: 45 }, temperature: 230, vessel: 'pot' as const, covered: 20 }, 'bake 45 min at 230 °C, in pots, covered 20 min'],
    [{ step: 'divide' as const }, 'divide'],
    [{ step: 'proof' as const, minutes: { min: 30, max: 30 }, note: 'seam up' }, 'proof 30 min (seam up)'],
  ])('describes %o as "%s"', (step, text) => {
    expect(describeStep(step)).toBe(text);
  });
});
