// Generated formula folders for benchmarks and tests: a catalog, N formulas and a plan, all valid
// and within common bakery ranges, deterministic for a given index and variant. Plain JavaScript so
// `node bench/...` can import it without a TypeScript loader.
import { mkdirSync, writeFileSync } from 'node:fs';
import { join } from 'node:path';

/** The catalog every generated formula draws from. */
export function generateCatalogYaml() {
  return [
    '# Generated catalog for benchmarks and tests (invented prices).',
    'bread flour: { kind: flour, allergens: [wheat], cost_per_kg: 0.92 }',
    'wholemeal flour: { kind: flour, allergens: [wheat], cost_per_kg: 1.05 }',
    'rye flour: { kind: flour, allergens: [rye], cost_per_kg: 1.18 }',
    'spelt flour: { kind: flour, allergens: [spelt], cost_per_kg: 2.35 }',
    'water: { kind: water }',
    'fine salt: { kind: salt, cost_per_kg: 0.40 }',
    'instant yeast: { kind: yeast, yeast: instant, cost_per_kg: 6.50 }',
    'fresh yeast: { kind: yeast, yeast: fresh, cost_per_kg: 2.80 }',
    'mature levain: { kind: culture, hydration: 100 %, fed_with: bread flour }',
    'whole milk: { kind: dairy, water: 88 %, allergens: [milk], cost_per_kg: 0.95 }   # USDA SR28 NDB 01077',
    'unsalted butter: { kind: fat, water: 16 %, allergens: [milk], cost_per_kg: 7.20 }   # USDA SR28 NDB 01145',
    'sunflower seeds: { kind: seed, cost_per_kg: 2.60 }',
    'olive oil: { kind: fat, cost_per_kg: 6.00 }',
    '',
  ].join('\n');
}

const pick = (xs, i) => xs[((i % xs.length) + xs.length) % xs.length];
const round = (x, d = 2) => Math.round(x * 10 ** d) / 10 ** d;

/**
 * One formula's YAML. `variant` changes the figures a little (water, salt, yield) so a test can
 * "edit" the same formula; the same (index, variant) always gives the same text.
 */
export function generateFormulaYaml(index, variant = 0, id = `generated-${String(index).padStart(4, '0')}`) {
  const style = index % 5; // 0 straight, 1 poolish, 2 levain, 3 soaker, 4 enriched
  const water = round(64 + ((index * 7 + variant * 3) % 14)); // 64-77 %
  const salt = round(1.8 + ((index + variant) % 5) * 0.1); // 1.8-2.2 %
  const pieces = 6 + ((index + variant * 2) % 20);
  const piece = pick([300, 320, 450, 500, 800, 900], index + variant);
  const wholemeal = (index % 3) * 10; // 0, 10, 20 %
  const lines = [
    `id: ${id}`,
    `title: Generated loaf ${index}${variant ? ` (v${variant})` : ''}`,
    `status: ${pick(['active', 'active', 'draft'], index)}`,
    `category: ${pick(['lean', 'lean', 'sourdough', 'rye', 'enriched'], style)}`,
    `tags: [generated, ${pick(['tray', 'tin', 'deck'], index)}]`,
    `yield: { pieces: ${pieces}, piece: ${piece} g }`,
    `loss: ${pick([1, 2, 3], index)} %`,
    `dough_temperature: ${24 + (index % 3)} °C`,
    'flour:',
  ];
  if (wholemeal > 0) lines.push(`  bread flour: ${100 - wholemeal}`, `  wholemeal flour: ${wholemeal}`);
  else lines.push('  bread flour: 100');
  lines.push('ingredients:');
  const milk = style === 4 ? 20 : 0;
  lines.push(`  water: ${round(water - milk * 0.88)}`, `  fine salt: ${salt}`);
  if (style !== 2) lines.push(`  instant yeast: ${round(0.3 + (index % 4) * 0.2)}`);
  if (style === 3) lines.push('  sunflower seeds: 8');
  if (style === 4) lines.push(`  whole milk: ${milk}`, '  unsalted butter: 8');
  if (style === 1) {
    lines.push(
      'preferments:',
      '  - name: poolish',
      '    kind: poolish',
      `    share: ${20 + (index % 3) * 5} %`,
      '    ingredients: { bread flour: 100, water: 100, instant yeast: 0.1 }',
      '    ripen: { hours: 12-16, temperature: 20 °C }',
    );
  } else if (style === 2) {
    lines.push(
      'preferments:',
      '  - name: levain',
      '    kind: levain',
      '    share: 20 %',
      '    ingredients: { bread flour: 100, water: 100, mature levain: 20 }',
      '    ripen: { hours: 10-12, temperature: 22 °C }',
    );
  } else if (style === 3) {
    lines.push(
      'soakers:',
      '  - name: seed soak',
      '    ingredients: { sunflower seeds: 8, water: 8 }',
      '    soak: { hours: 4-12 }',
    );
  }
  lines.push(
    'process:',
    '  - { step: mix, minutes: 10 }',
    `  - { step: bulk, minutes: ${60 + (index % 4) * 30}, folds: { count: 2, every: 30 } }`,
    '  - { step: divide }',
    '  - { step: shape }',
    `  - { step: proof, minutes: ${45 + (index % 3) * 15} }`,
    `  - { step: bake, minutes: ${20 + (index % 4) * 5}, temperature: 230 °C, vessel: ${pick(['tray', 'tin', 'deck'], index)}, steam: true }`,
    '  - { step: cool, minutes: 60 }',
    '',
  );
  return lines.join('\n');
}

/** A plan ordering the first few generated formulas. */
export function generatePlanYaml(date, ids) {
  return [
    `date: ${date}`,
    'ready_by: "06:00"',
    'conditions: { room: 22 °C, flour: 20 °C, tap_water: 12 °C }',
    'mixers:',
    '  - { name: spiral, capacity: 50 kg, friction: 13 °C }',
    'orders:',
    ...ids.map((id, i) => `  - { formula: ${id}, pieces: ${10 + i * 5} }`),
    '',
  ].join('\n');
}

/**
 * Writes a formulas folder into `dir`: ingredients.yaml, `count` formulas and, when `plan` is set,
 * plans/2026-12-03.yaml ordering the first three active ones. Returns the formula ids.
 */
export function writeGeneratedFolder(dir, count, { plan = true, variant = 0 } = {}) {
  mkdirSync(dir, { recursive: true });
  writeFileSync(join(dir, 'ingredients.yaml'), generateCatalogYaml());
  const ids = [];
  for (let i = 0; i < count; i++) {
    const id = `generated-${String(i).padStart(4, '0')}`;
    writeFileSync(join(dir, `${id}.yaml`), generateFormulaYaml(i, variant, id));
    ids.push(id);
  }
  if (plan && count > 0) {
    mkdirSync(join(dir, 'plans'), { recursive: true });
    writeFileSync(join(dir, 'plans', '2026-12-03.yaml'), generatePlanYaml('2026-12-03', ids.filter((_, i) => i % 3 !== 2).slice(0, 3)));
  }
  return ids;
}
