// The cautions have one home (shared/cautions.ts). One formula on a hot day (ice needed) is fed to
// every surface: `panform scale` (its collecting function), the API's formula answer, the viewer's
// cautions panel once its water helper weighs ice, and a batch sheet of that formula alone. All
// give the same cautions in the same words; what each formula's work involves is checked by hand.
import { readdirSync } from 'node:fs';
import { join } from 'node:path';
import { describe, expect, it } from 'vitest';
import { cautionsFor, cautionFacts, mergeCautions, iceCaution, type CautionTopic } from '#shared/cautions';
import type { Formula } from '#shared/model';
import { parsePlanText } from '#shared/parse';
import { buildSheet } from '#shared/sheet/build';
import { collectScale, toScaleOptions } from '../../cli/commands/scale.ts';
import { formulaDetail } from '../../server/routes/formulas.ts';
import type { FormulaEntry } from '../../server/routes/data.ts';
import { cautionsWithIce } from '../../src/features/formulas/components/cautions.tsx';
import { DEMO, readCatalogIn, readFormulaIn } from './sheet-fixtures.ts';

const catalog = readCatalogIn(DEMO);
const ids = readdirSync(DEMO).filter((n) => n.endsWith('.yaml') && n !== 'ingredients.yaml').map((n) => n.replace(/\.yaml$/, ''));
const formulas: Record<string, Formula> = Object.fromEntries(ids.map((id) => [id, readFormulaIn(DEMO, id)]));

// A summer night: everything at 30 °C, so every mix with water takes ice (tap warmer than the water must be).
const HOT = { room: '30', flourTemp: '30', friction: '13', tap: '30' };

function entryOf(f: Formula): FormulaEntry {
  return { id: f.id, title: f.title, status: f.status, category: f.category, tags: f.tags, figures: {} as FormulaEntry['figures'], revision: 1, updatedAt: '', path: '', formula: f, searchText: '' };
}

function sheetOf(f: Formula) {
  const text = `date: 2030-07-10
ready_by: "06:00"
conditions: { room: 30 °C, flour: 30 °C, tap_water: 30 °C }
mixers:
  - { name: spiral, capacity: 200 kg, friction: 13 °C }
orders:
  - { formula: ${f.id}, pieces: ${f.yield.pieces} }
`;
  const parsed = parsePlanText(text, 'plans/2030-07-10.yaml');
  if (!parsed.ok) throw new Error(JSON.stringify(parsed.findings));
  return buildSheet({ plan: parsed.value, formulas: { [f.id]: f }, catalog });
}

describe('cautions on every surface', () => {
  it.each(ids)('%s: the CLI, the API with the viewer, and the sheet give one answer', (id) => {
    const f = formulas[id];
    const cli = collectScale(join(DEMO, `${id}.yaml`), toScaleOptions({ units: 'metric', ...HOT }));
    // The milk buns take no water (their liquid is milk, tempered without ice), so no ice.
    const ice = (cli.water?.main?.ice ?? 0) > 0;
    expect(ice).toBe(id !== 'tidewater-milk-buns');
    const api = formulaDetail(entryOf(f), catalog, 'bench', { by: 'pieces', pieces: f.yield.pieces }).cautions;
    expect(api.map((c) => c.topic)).not.toContain('ice');
    const viewer = cautionsWithIce(api, ice);
    const sheet = sheetOf(f);
    expect(sheet.mixes.some((m) => m.ice > 0) || sheet.preferments.some((b) => b.ice > 0)).toBe(ice);
    expect(viewer).toEqual(cli.cautions);
    expect(sheet.cautions).toEqual(cli.cautions);
  });

  // What each demo formula's work involves, read from its file by hand.
  it.each<[string, CautionTopic[]]>([
    ['tidewater-milk-buns', ['allergens', 'may-contain', 'oven', 'eggs-dairy', 'food-safety']],
    ['country-levain', ['allergens', 'oven', 'pots', 'cold', 'food-safety']],
    ['harbour-ciabatta', ['allergens', 'oven', 'steam', 'food-safety']],
    ['spelt-porridge-loaf', ['allergens', 'oven', 'pots', 'hot-water', 'food-safety']],
  ])('%s warns about %j', (id, topics) => {
    expect(cautionsFor([cautionFacts(formulas[id], catalog)], { ice: false }).cautions.map((c) => c.topic)).toEqual(topics);
  });

  it('names, on a day of several products, which products carry each allergen', () => {
    const set = cautionsFor([cautionFacts(formulas['tidewater-milk-buns'], catalog), cautionFacts(formulas['harbour-ciabatta'], catalog)], { ice: false });
    expect(set.cautions[0].text).toMatch(/^Allergens: wheat \(Tidewater milk buns, Harbour ciabatta\); eggs \(Tidewater milk buns\); milk \(Tidewater milk buns\)\./i);
    expect(set.cautions.map((c) => c.topic)).toContain('eggs-dairy');
  });
});

describe('mergeCautions', () => {
  it('adds a caution by its topic, once, in its usual place', () => {
    const base = cautionsFor([cautionFacts(formulas['harbour-ciabatta'], catalog)], { ice: false }).cautions;
    const merged = mergeCautions(base, [iceCaution()]);
    expect(merged.map((c) => c.topic)).toEqual(['allergens', 'oven', 'steam', 'ice', 'food-safety']);
    expect(mergeCautions(merged, [iceCaution(), { topic: 'steam', text: 'other words' }])).toEqual(merged);
  });
});
