// The water for a mix (shared/dough-water.ts): which temperature each pre-ferment counts at, one
// mixer's friction in sums of 3, 4 and 5 temperatures, bassinage, milk, hand mixing, and one input
// fed to every surface (`panform temp`, `panform scale`, the sheet, the API and the viewer's helper).
// The method: the multiplier method (Cook's Illustrated, "Precise Water Temperature for the Perfect
// Loaf": water = n × DDT − the other factors, n = 3, or 4 with a starter); friction = n × the mixer's
// rise. Ice: I = W·(T_tap − T_w)/(T_tap + L/c), L = 333.55 J/g (CRC Handbook of Chemistry and
// Physics, enthalpy of fusion of water), c = 4.186 J/(g·K) (NIST SP 811, App. B.8, calorie at 15 °C).
import type { Request } from 'express';
import { describe, expect, it } from 'vitest';
import { planMixWater, prefermentTemperature } from '#shared/dough-water';
import type { Formula, Plan, Preferment } from '#shared/model';
import { parseFormulaText, parsePlanText } from '#shared/parse';
import { scaleFormula } from '#shared/scale';
import { buildSheet } from '#shared/sheet/build';
import { collectScale, toScaleOptions } from '../../cli/commands/scale.ts';
import { collectTemp, toTempOptions } from '../../cli/commands/temp.ts';
import { formulaWater } from '../../server/routes/formulas.ts';
import type { Snapshot } from '../../server/routes/data.ts';
import { readingsFromPlan } from '../../src/features/formulas/components/water-temperature.tsx';
import { DEMO, readCatalogIn, readFormulaIn } from './sheet-fixtures.ts';

const catalog = readCatalogIn(DEMO);
const L_OVER_C = 333.55 / 4.186;
const iceFor = (w: number, tap: number, target: number) => (w * (tap - target)) / (tap + L_OVER_C);

function formulaOf(text: string): Formula {
  const parsed = parseFormulaText(text, 'formulas/test-dough.yaml');
  if (!parsed.ok) throw new Error(JSON.stringify(parsed.findings));
  return parsed.value;
}

function planOf(text: string): Plan {
  const parsed = parsePlanText(text, 'plans/2030-07-10.yaml');
  if (!parsed.ok) throw new Error(JSON.stringify(parsed.findings));
  return parsed.value;
}

describe('prefermentTemperature', () => {
  const p = (extra: Partial<Preferment>): Preferment => ({ name: 'levain', kind: 'levain', share: 20, ingredients: [], ...extra });
  it.each([
    ['measured tonight wins', p({ ripenTemperature: 22, temperature: 24 }), { measured: 23.5, planDefault: 20, room: 21 }, 23.5, 'measured'],
    ['else its ripening temperature, not the plan\'s', p({ ripenTemperature: 4, temperature: 24 }), { planDefault: 20, room: 21 }, 4, 'ripening'],
    ['else the temperature it was built at', p({ temperature: 24 }), { planDefault: 20, room: 21 }, 24, 'build'],
    ['else the plan\'s default', p({}), { planDefault: 20, room: 21 }, 20, 'plan default'],
    ['else the room', p({}), { room: 21 }, 21, 'room'],
  ])('%s', (_, pre, readings, temperature, source) => {
    expect(prefermentTemperature(pre, readings)).toEqual({ name: 'levain', temperature, source });
  });

  it('aims a ripening range at its middle', () => {
    const f = formulaOf(`id: test-dough
title: Test
status: active
category: lean
yield: { pieces: 10, piece: 500 g }
dough_temperature: 25-26 °C
flour: { bread flour: 100 }
ingredients: { water: 70, fine salt: 2 }
preferments:
  - { name: poolish, kind: poolish, share: 30 %, ingredients: { bread flour: 100, water: 100 }, ripen: { hours: 12-16, temperature: 18-21 °C } }
`);
    expect(f.preferments[0].ripenTemperatureRange).toEqual({ min: 18, max: 21 });
    expect(prefermentTemperature(f.preferments[0], { room: 22 })).toEqual({ name: 'poolish', temperature: 19.5, source: 'ripening' });
    expect(f.doughTemperature).toBe(25.5);
    const w = planMixWater(f, scaleFormula(f, catalog, { by: 'pieces', pieces: 10 }), catalog, { room: 22, flour: 20, rise: 4 });
    // 4 × 25.5 − (22 + 20 + 19.5 + 4 × 4) = 24.5 °C; the range is kept for the bench to see
    expect(w.main!.temperature).toBeCloseTo(24.5, 9);
    expect(w.doughTemperatureRange).toEqual({ min: 25, max: 26 });
  });
});

describe('planMixWater', () => {
  const lean = `id: test-dough
title: Test
status: active
category: lean
yield: { pieces: 10, piece: 500 g }
dough_temperature: 25 °C
flour: { bread flour: 100 }
ingredients: { water: 70, fine salt: 2, fresh yeast: 1 }
process:
  - { step: mix, minutes: 10 }
  - { step: bulk, minutes: 60 }
  - { step: bake, minutes: 30, temperature: 230 °C }
`;

  it('gives a three-factor and a five-factor dough off the same mixer the friction of its own sum', () => {
    const straight = formulaOf(lean);
    const two = formulaOf(`${lean.replace(/process:[\s\S]*$/, '')}preferments:
  - { name: poolish, kind: poolish, share: 20 %, ingredients: { bread flour: 100, water: 100 }, ripen: { hours: 12, temperature: 20 °C } }
  - { name: old dough, kind: old-dough, share: 10 %, ingredients: { bread flour: 100, water: 70, fine salt: 2 }, ripen: { hours: 12, temperature: 4 °C } }
`);
    // the spiral: friction 12 °C found on a straight dough, so a rise of 4 °C
    const c = { room: 22, flour: 20, rise: 12 / 3 };
    const w3 = planMixWater(straight, scaleFormula(straight, catalog, { by: 'pieces', pieces: 10 }), catalog, c);
    const w5 = planMixWater(two, scaleFormula(two, catalog, { by: 'pieces', pieces: 10 }), catalog, c);
    expect([w3.factors, w3.frictionFactor]).toEqual([3, 12]);
    expect(w3.main!.temperature).toBeCloseTo(3 * 25 - (22 + 20 + 12), 9); // 21 °C
    expect([w5.factors, w5.frictionFactor]).toEqual([5, 20]);
    expect(w5.main!.temperature).toBeCloseTo(5 * 25 - (22 + 20 + 20 + 4 + 20), 9); // 39 °C, not the 47 °C of an unchanged 12 °C friction
    // Both doughs come off the mixer at their factors' average plus the same rise.
    for (const [w, pre] of [[w3, [] as number[]], [w5, [20, 4]]] as const) {
      const avg = (22 + 20 + w.main!.temperature + pre.reduce((a, b) => a + b, 0)) / w.factors;
      expect(avg + 4).toBeCloseTo(25, 9);
    }
  });

  it('holds back the bassinage at its own temperature and warms the main water to make up for it', () => {
    const f = formulaOf(lean.replace('dough_temperature: 25 °C', 'dough_temperature: 25 °C\nbassinage: { percent: 8, temperature: 6 °C }'));
    const scaled = scaleFormula(f, catalog, { by: 'flour', grams: 10000 });
    const w = planMixWater(f, scaled, catalog, { room: 24, flour: 22, rise: 4, tap: 18 });
    // all the water: 3 × 25 − (24 + 22 + 12) = 17 °C for 7000 g; 800 g of it held back at 6 °C
    expect(w.liquid!.temperature).toBeCloseTo(17, 9);
    expect(w.bassinage).toEqual({ grams: 800, percent: 8, temperature: 6 });
    // main water: (7000 × 17 − 800 × 6) ÷ 6200 = 18.419 °C (the heat balance of one liquid): warmer than the 18 °C tap, no ice
    expect(w.main!.grams).toBeCloseTo(6200, 9);
    expect(w.main!.temperature).toBeCloseTo((7000 * 17 - 800 * 6) / 6200, 9);
    expect(w.main!.ice).toBe(0);
    expect(w.advice.join(' ')).toMatch(/warmer than the tap/);
    // The sheet lists it apart, under the water line.
    const sheet = buildSheet({
      plan: planOf(`date: 2030-07-10
ready_by: "06:00"
conditions: { room: 24 °C, flour: 22 °C, tap_water: 12 °C }
mixers:
  - { name: spiral, capacity: 50 kg, rise: 4 °C }
orders:
  - { formula: test-dough, pieces: 10 }
`),
      formulas: { 'test-dough': f },
      catalog,
    });
    const mix = sheet.mixes[0];
    expect(mix.bassinage!.temperature).toBe(6);
    expect(mix.bassinage!.grams).toBeCloseTo(mix.flour * 0.08, 9);
    expect(mix.ice + mix.tapWater + mix.bassinage!.grams).toBeCloseTo(mix.water, 9);
  });

  it('tempers the milk of a dough without water by the same method, never "0 g of water"', () => {
    const buns = readFormulaIn(DEMO, 'tidewater-milk-buns');
    const scaled = scaleFormula(buns, catalog, { by: 'pieces', pieces: 24 });
    const w = planMixWater(buns, scaled, catalog, { room: 22, flour: 20, rise: 4, tap: 14 });
    expect(w.liquid!.kind).toBe('other');
    expect(w.liquid!.names).toEqual(['whole milk']);
    expect(w.liquid!.grams).toBeCloseTo(scaled.finalDough.find((l) => l.ingredient === 'whole milk')!.grams, 9);
    expect(w.main!.temperature).toBeCloseTo(3 * 25 - (22 + 20 + 12), 9); // 21 °C milk
    expect(w.main!.ice).toBe(0); // no ice in milk: it would add water
    expect(w.specificHeat).toMatch(/not counted/);
    expect(w.advice.join(' ')).toMatch(/bring whole milk to 21\.0 °C/);
  });

  it('mixes by hand with the small rise of common practice and a batch per person', () => {
    const plan = planOf(`date: 2030-07-10
ready_by: "06:00"
conditions: { room: 22 °C, flour: 20 °C, tap_water: 12 °C }
mixers:
  - { name: bench, kind: hand, capacity: 4 kg }
orders:
  - { formula: test-dough, pieces: 10 }
`);
    expect(plan.mixers[0]).toMatchObject({ kind: 'hand', rise: 1, riseFrom: 'hand default' }); // about 1 °C: common practice
    const sheet = buildSheet({ plan, formulas: { 'test-dough': formulaOf(lean) }, catalog });
    // 10 × 500 g = 5 kg: two batches of 2.5 kg, each within one person's 4 kg
    expect(sheet.mixes.map((m) => m.dough)).toEqual([2500, 2500]);
    expect(sheet.mixes[0].waterTemperature).toBeCloseTo(3 * 25 - (22 + 20 + 3), 9); // 30 °C
  });
});

describe('one input, every surface', () => {
  // The country levain (levain ripened at 22 °C, built at 24 °C) for 24 pieces on a summer night:
  // room 22, flour 20, tap 30 °C, the spiral's rise 4 °C; the plan's 20 °C pre-ferment default must not be used.
  // 4 × 26 − (22 + 20 + 22 + 4 × 4) = 24 °C, with ice because the tap is warmer.
  const planText = `date: 2030-07-10
ready_by: "06:00"
conditions: { room: 22 °C, flour: 20 °C, tap_water: 30 °C, preferment: 20 °C }
mixers:
  - { name: spiral, capacity: 50 kg, rise: 4 °C }
orders:
  - { formula: country-levain, pieces: 24, mixer: spiral }
`;
  const plan = planOf(planText);
  const formula = readFormulaIn(DEMO, 'country-levain');
  const WATER = 24;

  it('gives the same water and ice from temp, scale, the sheet, the API and the viewer', () => {
    const temp = collectTemp(toTempOptions({ ddt: '26', room: '22', flour: '20', rise: '4', preferment: ['22'], tap: '30' }));
    const scale = collectScale(`${DEMO}/country-levain.yaml`, toScaleOptions({ units: 'metric', pieces: '24', room: '22', flourTemp: '20', rise: '4', tap: '30' }));
    const sheet = buildSheet({ plan, formulas: { 'country-levain': formula }, catalog }).mixes[0];
    const snapshot = { catalog, plans: [{ date: plan.date, plan, updatedAt: '' }], formulas: new Map(), version: 1, memo: new Map() } as unknown as Snapshot;
    const api = formulaWater(snapshot, formula, { query: { plan: '2030-07-10', pieces: '24' } } as unknown as Request, true).water;
    const r = readingsFromPlan(plan, formula.id);
    const viewer = planMixWater(formula, scaleFormula(formula, catalog, { by: 'pieces', pieces: 24 }), catalog, {
      room: Number(r.room), flour: Number(r.flour), tap: Number(r.tap), rise: Number(r.rise), prefermentDefault: plan.conditions.preferment,
    });

    expect(temp.waterTemperature).toBeCloseTo(WATER, 9);
    for (const t of [scale.water!.main!.temperature, sheet.waterTemperature!, api.main!.temperature, viewer.main!.temperature]) expect(t).toBeCloseTo(WATER, 9);
    for (const w of [scale.water!, api, viewer]) expect(w.preferments).toEqual([{ name: 'levain', temperature: 22, source: 'ripening' }]);
    expect(sheet.factors!.preferments).toEqual([{ name: 'levain', temperature: 22, source: 'ripening' }]);
    const grams = scale.water!.main!.grams;
    const ice = iceFor(grams, 30, WATER);
    for (const i of [scale.water!.main!.ice!, sheet.ice, api.main!.ice!, viewer.main!.ice!]) expect(i).toBeCloseTo(ice, 6);
  });
});

describe('checking a bassinage', () => {
  it('refuses one that holds back more water than the final dough weighs', async () => {
    const { checkFileText } = await import('#shared/check/check-file');
    const text = `id: test-dough
title: Test
status: active
category: lean
yield: { pieces: 10, piece: 500 g }
dough_temperature: 25 °C
bassinage: { percent: 60, temperature: 6 °C }
flour: { bread flour: 100 }
ingredients: { water: 70, fine salt: 2 }
preferments:
  - { name: poolish, kind: poolish, share: 20 %, ingredients: { bread flour: 100, water: 100 } }
`;
    const { findings } = checkFileText({ kind: 'formula', file: 'formulas/test-dough.yaml', text, catalog });
    // the final dough weighs 70 − 20 × 100 % = 50 % of water
    expect(JSON.stringify(findings)).toMatch(/the bassinage holds back 60 % of water, but the final dough weighs only 50 % of water/);
  });
});
