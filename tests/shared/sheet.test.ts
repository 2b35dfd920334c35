// buildSheet: builds for tonight, mixes split by mixer capacity, water and ice, the timeline and
// the pick list, on the demo bakery's plans and on small fixtures with known answers.
import fc from 'fast-check';
import { describe, expect, it } from 'vitest';
import { buildSheet } from '#shared/sheet/build';
import { SheetError, type Sheet, type SheetInput } from '#shared/sheet/types';
import { scaleFormula, sum } from '#shared/scale';
import type { Mixer, Plan } from '#shared/model';
import { expectScheduleRules } from './schedule-rules.ts';
import { DEMO_PLANS, FIXTURE_PLANS, SHEET_FIXTURES, readCatalogIn, readFormulaIn, sheetInput } from './sheet-fixtures.ts';

// Ice: I = W·(T_tap − T_w) / (T_tap + L/c), L = 333.55 J/g (CRC Handbook of Chemistry and Physics,
// enthalpy of fusion of water; from memory), c = 4.186 J/(g·K) (NIST SP 811 App. B.8, calorie at 15 °C).
const L_OVER_C = 333.55 / 4.186;
const iceFor = (w: number, tap: number, target: number) => (w * (tap - target)) / (tap + L_OVER_C);

const HOT = FIXTURE_PLANS[0];
const COLD = FIXTURE_PLANS[1];
const ALL_PLANS = [...DEMO_PLANS, ...FIXTURE_PLANS];

function mixesOf(sheet: Sheet, formula: string) {
  return sheet.mixes.filter((m) => m.formula === formula).sort((a, b) => a.mixNumber - b.mixNumber);
}

describe('buildSheet on the fixtures (known answers)', () => {
  const input = sheetInput(HOT);
  const sheet = buildSheet(input);

  it('splits an order into the fewest equal mixes that fit the mixer', () => {
    // 100 × 600 g with 2 % loss: 60 000 / 0.98 = 61 224.49 g; 40 kg spiral → 2 mixes (from the arithmetic conventions)
    const mixes = mixesOf(sheet, 'poolish-bread');
    expect(mixes.map((m) => `${m.mixNumber}/${m.of}`)).toEqual(['1/2', '2/2']);
    for (const m of mixes) expect(m.dough).toBeCloseTo(60000 / 0.98 / 2, 6);
    expect(mixes.map((m) => m.pieces)).toEqual([50, 50]);
    expect(mixes.every((m) => m.mixer === 'big spiral')).toBe(true);
  });

  it('puts an order without a mixer on the first mixer that takes it whole', () => {
    // 300 × 90 g / 0.98 = 27 551.02 g: fits the 40 kg spiral in one mix
    const [m] = mixesOf(sheet, 'straight-rolls');
    expect(m.mixer).toBe('big spiral');
    expect(m.of).toBe(1);
    expect(m.dough).toBeCloseTo(27000 / 0.98, 6);
    expect(m.customer).toBe('harbour shop');
  });

  it('works out the water temperature and the ice when the water must be colder than the tap', () => {
    const [m] = mixesOf(sheet, 'straight-rolls');
    // 3·24 − (27 + 25 + 3 × 14/3) = 6 °C (the multiplier method, Cook's Illustrated "Precise Water Temperature for the Perfect Loaf")
    expect(m.waterTemperature).toBeCloseTo(6, 9);
    expect(m.factors).toEqual({ room: 27, flour: 25, rise: 14 / 3, friction: expect.closeTo(14, 9), preferments: [], n: 3 });
    // flour = 27 551.02 / 1.68; water 60 %
    const water = ((27000 / 0.98) / 1.68) * 0.6;
    expect(m.water).toBeCloseTo(water, 6);
    expect(m.ice).toBeCloseTo(iceFor(water, 20, 6), 6);
    expect(m.ice).toBeCloseTo(1381.91, 1); // 9 839.65 · 14 / (20 + 79.683), by hand
    expect(m.ice + m.tapWater).toBeCloseTo(m.water, 9);
  });

  it('counts each pre-ferment at its ripening temperature, and the friction as 4 × the mixer rise', () => {
    const [m] = mixesOf(sheet, 'poolish-bread');
    // 4·25 − (27 + 25 + 20 + 4 × 14/3) = 9.333 °C (the multiplier method; friction factor = n × rise)
    expect(m.waterTemperature).toBeCloseTo(28 / 3, 9);
    expect(m.factors?.n).toBe(4);
    expect(m.factors?.preferments).toEqual([{ name: 'poolish', temperature: 20, source: 'ripening' }]);
    const [rye] = mixesOf(sheet, 'seeded-rye');
    // 4·27 − (27 + 25 + 24 + 4 × 8/3) = 21.333 °C: warmer than the 20 °C tap, so no ice
    expect(rye.waterTemperature).toBeCloseTo(64 / 3, 9);
    expect(rye.ice).toBe(0);
    expect(rye.tapWater).toBe(rye.water);
  });

  it('uses the plan conditions.preferment only for a pre-ferment that gives no temperature of its own', () => {
    const cold = sheetInput(COLD);
    const [m] = mixesOf(buildSheet(cold), 'poolish-bread');
    // the poolish ripens at 20 °C: 4·25 − (18 + 16 + 20 + 4 × 9/3) = 34 °C; the plan's 19 °C is not used
    expect(m.waterTemperature).toBeCloseTo(34, 9);
    expect(m.ice).toBe(0);
    const bare = structuredClone(cold);
    for (const f of Object.values(bare.formulas)) for (const p of f.preferments) delete p.ripenTemperature, delete p.temperature;
    const [n] = mixesOf(buildSheet(bare), 'poolish-bread');
    // no temperature of its own: the plan's 19 °C; 100 − (18 + 16 + 19 + 12) = 35 °C
    expect(n.waterTemperature).toBeCloseTo(35, 9);
    expect(n.factors?.preferments[0].source).toBe('plan default');
  });

  it('combines identical pre-ferments of two formulas into one build', () => {
    const poolish = sheet.preferments.filter((b) => b.kind === 'poolish');
    expect(poolish).toHaveLength(1);
    const [b] = poolish;
    expect(b.formulas).toEqual(['poolish-bread', 'poolish-twin']);
    // poolish-bread: F = 61 224.49 / 1.724; poolish flour 30 % of F; build = flour · 2.001
    const bread = ((60000 / 0.98) / 1.724) * 0.3 * 2.001;
    // poolish-twin: 16 × 500 g / 0.99, total 170.3 %, share 25 %
    const twin = ((8000 / 0.99) / 1.703) * 0.25 * 2.001;
    expect(b.grams).toBeCloseTo(bread + twin, 6);
    expect(sum(b.uses.map((u) => u.grams))).toBeCloseTo(b.grams, 6);
    expect(sum(b.ingredients.map((l) => l.grams))).toBeCloseTo(b.grams, 6);
    // 3·20 − (27 + 25) = 8 °C for a poolish that ripens at 20 °C (no seed, no friction); the tap is 20 °C, so ice
    expect(b.waterTemperature).toBeCloseTo(8, 9);
    expect(b.seedTemperature).toBeNull();
    expect(b.ice).toBeCloseTo(iceFor(b.water, 20, 8), 6);
  });

  it('gives each build a window that leaves it ripe at every final mix that takes it', () => {
    for (const b of [...sheet.preferments, ...sheet.soakers]) {
      expect(b.hours).not.toBeNull();
      const { min, max } = b.hours!;
      const from = Date.parse(`${b.mixFrom}:00Z`);
      const until = Date.parse(`${b.mixUntil}:00Z`);
      expect(from).toBeLessThanOrEqual(until);
      for (const u of b.uses) {
        const use = Date.parse(`${u.at}:00Z`);
        expect((use - until) / 3_600_000).toBeGreaterThanOrEqual(min - 1e-9);
        expect((use - from) / 3_600_000).toBeLessThanOrEqual(max + 1e-9);
      }
      // The window is as wide as the ripening range allows: its edges touch the first and last use.
      expect((Date.parse(`${b.uses[0].at}:00Z`) - until) / 3_600_000).toBeCloseTo(min, 9);
      expect((Date.parse(`${b.uses[b.uses.length - 1].at}:00Z`) - from) / 3_600_000).toBeCloseTo(max, 9);
    }
  });

  it('lists the seed culture and the fresh flour and water of a levain build', () => {
    const levain = sheet.preferments.find((b) => b.kind === 'levain')!;
    const seed = levain.ingredients.find((l) => l.seed)!;
    expect(seed.ingredient).toBe('mature levain');
    const flour = levain.flour;
    // the seed is 20 % of the build's flour; its half-flour, half-water is taken from the fresh lines
    expect(seed.grams).toBeCloseTo(flour * 0.2, 9);
    expect(levain.ingredients.find((l) => l.ingredient === 'bread flour')!.grams).toBeCloseTo(flour - flour * 0.1, 9);
    // 4·26 − (27 + 25 + 27) = 25 °C: the build's own temperature wins over its ripening temperature, and the
    // seed counts as a fourth factor at the room's 27 °C (the plan gives no pre-ferment default)
    expect(levain.waterTemperature).toBeCloseTo(25, 9);
    expect(levain.seedTemperature).toBe(27);
  });

  it('makes soakers with their soaking window', () => {
    expect(sheet.soakers).toHaveLength(1);
    const [s] = sheet.soakers;
    expect(s.kind).toBe('soaker');
    expect(s.hours).toEqual({ min: 6, max: 10 });
    expect(s.waterTemperature).toBeNull();
  });

  it('adds up the pick list to everything mixed', () => {
    const mixed = sum(sheet.formulas.map((f) => f.mixedDough));
    expect(sum(sheet.totals.map((t) => t.grams))).toBeCloseTo(mixed, 6);
    const water = sheet.totals.find((t) => t.ingredient === 'water')!;
    const fromLines = sum([
      ...[...sheet.preferments, ...sheet.soakers].flatMap((b) => b.ingredients.filter((l) => l.ingredient === 'water').map((l) => l.grams)),
      ...sheet.mixes.flatMap((m) => m.ingredients.filter((l) => l.ingredient === 'water').map((l) => l.grams)),
    ]);
    expect(water.grams).toBeCloseTo(fromLines, 6);
    expect(sheet.totals.find((t) => t.ingredient === 'mature levain')?.kind).toBe('culture');
  });

  it('names the allergens of the day and the usual cautions', () => {
    expect(sheet.allergens).toEqual(['wheat', 'rye', 'milk', 'sesame']);
    const topics = sheet.cautions.map((c) => c.topic);
    for (const t of ['allergens', 'oven', 'steam', 'ice', 'cold', 'food-safety'] as const) expect(topics).toContain(t);
    expect(sheet.cautions.find((c) => c.topic === 'food-safety')!.text).toMatch(/does not replace/);
  });

  it('keeps the night\'s rules', () => {
    expectScheduleRules(sheet, input);
  });

  it('uses the long end of each range when the plan says so', () => {
    const cold = buildSheet(sheetInput(COLD));
    const proof = cold.timeline.find((e) => e.formula === 'straight-rolls' && e.step === 'proof')!;
    expect(proof.minutes).toBe(50);
    const hot = sheet.timeline.find((e) => e.formula === 'straight-rolls' && e.step === 'proof')!;
    expect(hot.minutes).toBe(45);
  });

  it('lists folds at their times during bulk', () => {
    const bulk = sheet.timeline.find((e) => e.formula === 'poolish-bread' && e.step === 'bulk' && e.mixNumber === 1)!;
    const start = Date.parse(`${bulk.start}:00Z`);
    expect(bulk.folds!.map((f) => (Date.parse(`${f}:00Z`) - start) / 60_000)).toEqual([30, 60, 90]);
  });

  it('marks cold holds on the timeline', () => {
    const retard = sheet.timeline.find((e) => e.step === 'retard')!;
    expect(retard.cold).toBe(true);
    expect(retard.temperature).toBe(4);
    expect(retard.minutes).toBe(9 * 60);
  });
});

describe('buildSheet refuses plans that cannot be mixed', () => {
  const base = sheetInput(HOT);
  const withPlan = (p: Partial<Plan>): SheetInput => ({ ...base, plan: { ...base.plan, ...p } });
  const mixer = (m: Partial<Mixer>): Mixer => ({ name: 'tiny', kind: 'machine', capacityGrams: 5000, rise: 8 / 3, riseFrom: 'friction', ...m });

  it.each([
    ['one piece is bigger than the mixer', { mixers: [mixer({ capacityGrams: 800 })], orders: [{ formula: 'seeded-rye', pieces: 2 }] }, /one piece needs .* more than mixer "tiny"/],
    ['a mix is below the mixer minimum', { mixers: [mixer({ minimumGrams: 3000 })], orders: [{ formula: 'straight-rolls', pieces: 10 }] }, /below mixer "tiny"'s minimum/],
    ['an order names an unknown mixer', { orders: [{ formula: 'straight-rolls', pieces: 10, mixer: 'hand' }] }, /asks for mixer "hand", which the plan does not list/],
    ['an order names an unknown formula', { orders: [{ formula: 'no-such-bread', pieces: 10 }] }, /formula "no-such-bread", which was not found/],
  ])('when %s', (_, plan, message) => {
    expect(() => buildSheet(withPlan(plan as Partial<Plan>))).toThrow(SheetError);
    expect(() => buildSheet(withPlan(plan as Partial<Plan>))).toThrow(message);
  });

  it('takes the biggest mixer when none holds the order whole', () => {
    const sheet = buildSheet(withPlan({ mixers: [mixer({ name: 'a', capacityGrams: 4000 }), mixer({ name: 'b', capacityGrams: 9000 })], orders: [{ formula: 'straight-rolls', pieces: 300 }] }));
    // 27 551 g / 9 kg → 4 mixes of 6 887.8 g
    expect(sheet.mixes.map((m) => m.mixer)).toEqual(['b', 'b', 'b', 'b']);
    expect(sheet.mixes[0].dough).toBeCloseTo(27000 / 0.98 / 4, 6);
    expect(sheet.mixes.map((m) => m.pieces)).toEqual([75, 75, 75, 75]);
  });

  it('divides whole pieces when they do not split evenly across mixes', () => {
    const sheet = buildSheet(withPlan({ mixers: [mixer({ capacityGrams: 10000 })], orders: [{ formula: 'straight-rolls', pieces: 301 }] }));
    // 301 × 90 / 0.98 = 27 642.86 g → 3 mixes; 101 + 100 + 100 pieces
    expect([...sheet.mixes].sort((a, b) => a.mixNumber - b.mixNumber).map((m) => m.pieces)).toEqual([101, 100, 100]);
    expect(sum(sheet.mixes.map((m) => m.pieces))).toBe(301);
  });

  it('warns when the water would have to be colder than ice can make it', () => {
    const sheet = buildSheet(withPlan({ conditions: { room: 35, flour: 33, tapWater: 25 }, orders: [{ formula: 'straight-rolls', pieces: 40 }] }));
    // 40 × 90 g / 0.98 = 3 673 g: below the big spiral's 5 kg minimum, so the small spiral (friction 8 °C)
    expect(sheet.mixes[0].mixer).toBe('small spiral');
    // 3·24 − (35 + 33 + 8) = −4 °C
    expect(sheet.mixes[0].waterTemperature).toBeCloseTo(-4, 9);
    expect(sheet.warnings.join('\n')).toMatch(/below the 0 °C that ice can bring it to/);
    // The most ice can do: water at 0 °C
    expect(sheet.mixes[0].ice).toBeCloseTo(iceFor(sheet.mixes[0].water, 25, 0), 6);
  });
});

describe.each(ALL_PLANS)('buildSheet on %s', (path) => {
  const input = sheetInput(path);
  const sheet = buildSheet(input);

  it('splits each order into the fewest equal mixes within capacity and minimum', () => {
    input.plan.orders.forEach((o, i) => {
      const mixes = sheet.mixes.filter((m) => m.order === i);
      const whole = scaleFormula(input.formulas[o.formula], input.catalog, { by: 'pieces', pieces: o.pieces, pieceGrams: o.pieceGrams });
      const mixer = input.plan.mixers.find((m) => m.name === mixes[0].mixer)!;
      expect(mixes).toHaveLength(mixes[0].of);
      expect(sum(mixes.map((m) => m.dough))).toBeCloseTo(whole.mixedDough, 6);
      for (const m of mixes) {
        expect(m.dough).toBeCloseTo(mixes[0].dough, 9);
        expect(m.dough).toBeLessThanOrEqual(mixer.capacityGrams * (1 + 1e-9));
        if (mixer.minimumGrams !== undefined) expect(m.dough).toBeGreaterThanOrEqual(mixer.minimumGrams * (1 - 1e-9));
      }
      // One mix fewer would not fit.
      if (mixes[0].of > 1) expect(whole.mixedDough / (mixes[0].of - 1)).toBeGreaterThan(mixer.capacityGrams);
      expect(sum(mixes.map((m) => m.pieces))).toBe(o.pieces);
      if (o.mixer) expect(mixes[0].mixer).toBe(o.mixer);
    });
  });

  it('gives every mix with a dough temperature its water temperature by n·DDT − Σ', () => {
    for (const m of sheet.mixes) {
      const f = input.formulas[m.formula];
      if (f.doughTemperature === undefined) continue;
      const c = input.plan.conditions;
      const mixer = input.plan.mixers.find((x) => x.name === m.mixer)!;
      const prefs = f.preferments.map((p) => p.ripenTemperature ?? p.temperature ?? c.preferment ?? c.room);
      const n = 3 + prefs.length;
      expect(m.waterTemperature).toBeCloseTo(n * f.doughTemperature - (c.room + c.flour + n * mixer.rise + sum(prefs)), 9);
      const target = Math.max(0, m.waterTemperature!);
      expect(m.ice).toBeCloseTo(target < c.tapWater ? iceFor(m.water, c.tapWater, target) : 0, 6);
      expect(m.ice + m.tapWater).toBeCloseTo(m.water, 9);
    }
  });

  it('adds up the pick list: the sum of every line equals the sum over the formulas', () => {
    const totals = sum(sheet.totals.map((t) => t.grams));
    const lines = sum([
      ...[...sheet.preferments, ...sheet.soakers].flatMap((b) => b.ingredients.map((l) => l.grams)),
      ...sheet.mixes.flatMap((m) => m.ingredients.filter((l) => l.kind !== 'preferment' && l.kind !== 'soaker').map((l) => l.grams)),
    ]);
    const formulas = sum(
      input.plan.orders.map((o) => scaleFormula(input.formulas[o.formula], input.catalog, { by: 'pieces', pieces: o.pieces, pieceGrams: o.pieceGrams }).mixedDough),
    );
    expect(totals).toBeCloseTo(lines, 6);
    expect(totals).toBeCloseTo(formulas, 6);
    for (const f of sheet.formulas) {
      expect(f.weighed).toBeCloseTo(f.mixedDough, 6);
      expect(sum(f.ingredients.map((l) => l.grams))).toBeCloseTo(f.mixedDough, 6);
    }
  });

  it('builds every pre-ferment and soaker that the mixes take, in the amounts they take', () => {
    const taken = new Map<string, number>();
    for (const m of sheet.mixes) {
      for (const l of m.ingredients) if (l.kind === 'preferment' || l.kind === 'soaker') taken.set(m.formula, (taken.get(m.formula) ?? 0) + l.grams);
    }
    const built = new Map<string, number>();
    for (const b of [...sheet.preferments, ...sheet.soakers]) {
      expect(sum(b.uses.map((u) => u.grams))).toBeCloseTo(b.grams, 6);
      for (const u of b.uses) built.set(u.formula, (built.get(u.formula) ?? 0) + u.grams);
    }
    expect([...built.keys()].sort()).toEqual([...taken.keys()].sort());
    for (const [f, g] of taken) expect(built.get(f)).toBeCloseTo(g, 6);
  });

  it('keeps the night\'s rules: no resource over capacity, steps in their ranges, builds ripe at use, orders as their bakes', () => {
    expectScheduleRules(sheet, input);
  });

  it('always carries the food-safety caution and names the day’s allergens', () => {
    expect(sheet.cautions.some((c) => c.topic === 'food-safety')).toBe(true);
    expect(sheet.allergens).toContain('wheat');
  });
});

describe('the demo plans', () => {
  it.runIf(DEMO_PLANS.length > 0)('counts the wharf rolls\' cold old dough and the rye sour at their own temperatures on 3 December', () => {
    // The multiplier method (Cook's Illustrated, "Precise Water Temperature for the Perfect Loaf": n·DDT − the other factors),
    // with the friction factor n × the mixer's rise (spiral: 13 °C found on a straight dough = rise 13/3; small spiral 10/3).
    const sheet = buildSheet(sheetInput(DEMO_PLANS[0]));
    const wharf = mixesOf(sheet, 'wharf-rolls')[0];
    // old dough kept at 4 °C: 4·25 − (22 + 20 + 4 + 4 × 13/3) = 36.667 °C (the plan's 20 °C pre-ferment default is not used)
    expect(wharf.waterTemperature).toBeCloseTo(110 / 3, 9);
    expect(wharf.factors?.preferments).toEqual([{ name: 'old dough', temperature: 4, source: 'ripening' }]);
    const rye = mixesOf(sheet, 'saltmere-seeded-rye')[0];
    // rye sour ripened at 25 °C: 4·28 − (22 + 20 + 25 + 4 × 10/3) = 31.667 °C
    expect(rye.waterTemperature).toBeCloseTo(95 / 3, 9);
    expect(rye.factors?.preferments).toEqual([{ name: 'rye sour', temperature: 25, source: 'ripening' }]);
  });

  it.runIf(DEMO_PLANS.length > 0)('combine the poolish of two formulas that share it into one build', () => {
    const sheet = buildSheet(sheetInput(DEMO_PLANS[0]));
    const combined = sheet.preferments.filter((b) => b.formulas.length > 1);
    expect(combined.length).toBeGreaterThan(0);
    for (const b of combined) expect(new Set(b.uses.map((u) => u.formula)).size).toBe(b.formulas.length);
  });
});

describe('property: for any plan, the mixes of an order add up to its scaled mixed dough', () => {
  const catalog = readCatalogIn(SHEET_FIXTURES);
  const ids = ['straight-rolls', 'poolish-bread', 'poolish-twin', 'seeded-rye'];
  const formulas = Object.fromEntries(ids.map((id) => [id, readFormulaIn(SHEET_FIXTURES, id)]));
  const RUNS = Number(process.env.PANFORM_FUZZ_RUNS ?? 30);
  const arbPlan = fc.record({
    mixers: fc.array(fc.record({ capacity: fc.integer({ min: 3000, max: 80000 }), friction: fc.integer({ min: 0, max: 16 }) }), { minLength: 1, maxLength: 3 }),
    orders: fc.array(
      fc.record({
        formula: fc.constantFrom(...ids),
        pieces: fc.integer({ min: 1, max: 200 }),
        piece: fc.option(fc.double({ min: 30, max: 1500, noNaN: true, noDefaultInfinity: true }), { nil: undefined }),
        mixer: fc.option(fc.nat(2), { nil: undefined }),
      }),
      { minLength: 1, maxLength: 5 },
    ),
    readyBy: fc.integer({ min: 0, max: 23 * 60 + 59 }),
    ranges: fc.constantFrom('short', 'mid', 'long' as const),
  });

  it('to 0.01 g, with equal mixes that fit, and the timeline rules kept', () => {
    fc.assert(
      fc.property(arbPlan, (g) => {
        const mixers: Mixer[] = g.mixers.map((m, i) => ({ name: `mixer ${i + 1}`, kind: 'machine', capacityGrams: m.capacity, rise: m.friction / 3, riseFrom: 'friction' }));
        const readyBy = `${String(Math.floor(g.readyBy / 60)).padStart(2, '0')}:${String(g.readyBy % 60).padStart(2, '0')}`;
        const plan: Plan = {
          date: '2030-03-01',
          readyBy,
          conditions: { room: 24, flour: 22, tapWater: 15 },
          mixers,
          orders: g.orders.map((o) => ({
            formula: o.formula,
            pieces: o.pieces,
            pieceGrams: o.piece,
            mixer: o.mixer !== undefined && o.mixer < mixers.length ? mixers[o.mixer].name : undefined,
          })),
          ranges: g.ranges,
        };
        let sheet: Sheet;
        try {
          sheet = buildSheet({ plan, formulas, catalog });
        } catch (e) {
          // Only a piece bigger than its mixer, or a mix more than the oven takes while it proofs, may stop a plan with no minimum loads.
          if (e instanceof SheetError && /one piece needs|oven slots/.test(e.message)) return;
          throw e;
        }
        plan.orders.forEach((o, i) => {
          const whole = scaleFormula(formulas[o.formula], catalog, { by: 'pieces', pieces: o.pieces, pieceGrams: o.pieceGrams });
          const mixes = sheet.mixes.filter((m) => m.order === i);
          expect(Math.abs(sum(mixes.map((m) => m.dough)) - whole.mixedDough)).toBeLessThan(0.01);
          const cap = mixers.find((m) => m.name === mixes[0].mixer)!.capacityGrams;
          for (const m of mixes) expect(m.dough).toBeLessThanOrEqual(cap * (1 + 1e-9));
          if (mixes.length > 1) expect(whole.mixedDough / (mixes.length - 1)).toBeGreaterThan(cap);
        });
        expect(Math.abs(sum(sheet.totals.map((t) => t.grams)) - sum(sheet.formulas.map((f) => f.mixedDough)))).toBeLessThan(0.01);
        expectScheduleRules(sheet, { plan, formulas, catalog });
      }),
      { numRuns: RUNS },
    );
  });
});
