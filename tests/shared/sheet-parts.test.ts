// The sheet's finishes, equipment, scales and culture feeds (shared/sheet/pick.ts, equipment.ts,
// scales.ts, cultures.ts): known answers worked by hand, and the demo day.
import { describe, expect, it } from 'vitest';
import { buildSheet } from '#shared/sheet/build';
import { allergenSummary } from '#shared/allergens';
import { checkWeights, MIN_DIVISIONS, premixFor, scaleFor } from '#shared/sheet/scales';
import { equipmentNeeds } from '#shared/sheet/equipment';
import type { Formula, Scale } from '#shared/model';
import type { SheetLine, SheetMix, TimelineEntry } from '#shared/sheet/types';
import { localDateTime } from '#shared/sheet/time';
import { DEMO, sheetInput } from './sheet-fixtures.ts';
import { join } from 'node:path';

const DAY = join(DEMO, 'plans', '2026-12-03.yaml');
const FRIDAY = join(DEMO, 'plans', '2026-12-04.yaml');
const demo = buildSheet(sheetInput(DAY));

const SCALES: Scale[] = [
  { name: 'platform', maxGrams: 60_000, resolutionGrams: 20 },
  { name: 'bench', maxGrams: 3_000, resolutionGrams: 0.5 },
];

describe('scales and small weights', () => {
  // The rule: at least 20 divisions (a reading is off by half a division, so at most 2.5 %):
  // the minimum capacity of a class III weighing instrument, OIML R 76-1 (2006) Table 3 (from memory).
  it('asks for 20 divisions', () => expect(MIN_DIVISIONS).toBe(20));

  it('puts a weight on the finest scale that holds it, else on the largest', () => {
    expect(scaleFor(2_999, SCALES).name).toBe('bench');
    expect(scaleFor(3_001, SCALES).name).toBe('platform');
    expect(scaleFor(80_000, SCALES).name).toBe('platform');
  });

  it('suggests a premix in part of the water (worked by hand)', () => {
    // 7.5 g on a 0.5 g scale: 15 divisions < 20. Least readable weight 20 × 0.5 = 10 g: dissolve
    // 10 g; 1 in 5 is the least factor with 7.5 × 5 = 37.5 g ≥ 10 g; water 10 × 4 = 40 g; take
    // 37.5 g of the solution, which carries 7.5 × 4 = 30 g of water off the water line.
    expect(premixFor(7.5, 0.5, 1000)).toEqual({ dissolve: 10, water: 40, factor: 5, take: 37.5, lessWater: 30 });
    // 0.3 g on a 1 g scale: least 20 g; 0.3 × 100 = 30 g ≥ 20 (× 50 = 15 is not): 1 in 100,
    // water 20 × 99 = 1980 g, take 30 g, 29.7 g less water.
    const p = premixFor(0.3, 1, 5000)!;
    expect(p.factor).toBe(100);
    expect(p.water).toBe(1980);
    expect(p.take).toBeCloseTo(30, 9);
    expect(p.lessWater).toBeCloseTo(29.7, 9);
    // Not enough water in the mix to carry it: no premix.
    expect(premixFor(7.5, 0.5, 20)).toBeNull();
  });

  it('gives each line its scale and flags the small ones, with a premix only for what dissolves', () => {
    const lines: SheetLine[] = [
      { ingredient: 'bread flour', grams: 5000, kind: 'flour' },
      { ingredient: 'water', grams: 3400, kind: 'water' },
      { ingredient: 'instant yeast', grams: 6, kind: 'yeast' },
      { ingredient: 'dried rosemary', grams: 4, kind: 'other' },
    ];
    const r = checkWeights([{ where: 'mix', label: 'Test 1/1', formula: 'test', lines }], SCALES);
    expect(lines.map((l) => l.scale)).toEqual(['platform', 'platform', 'bench', 'bench']);
    expect(r.smallWeights.map((w) => [w.ingredient, w.problem, w.premix !== null])).toEqual([
      ['instant yeast', 'few-divisions', true],
      ['dried rosemary', 'few-divisions', false],
    ]);
    // Least weight: 20 divisions, 20 × 20 g = 400 g and 20 × 0.5 g = 10 g.
    expect(r.scales.map((s) => [s.name, s.weights, s.least])).toEqual([['platform', 2, 400], ['bench', 2, 10]]);
  });

  it('checks nothing when the plan lists no scales', () => {
    expect(checkWeights([{ where: 'mix', label: 'x', formula: 'x', lines: [{ ingredient: 'salt', grams: 0.1, kind: 'salt' }] }], undefined)).toEqual({ scales: [], smallWeights: [], warnings: [] });
  });

  it('weighs what no scale holds on the largest, in lots', () => {
    // 130 kg on a 60 kg scale: ceil(130 / 60) = 3 lots.
    const r = checkWeights([{ where: 'mix', label: 'Big 1/1', formula: 'big', lines: [{ ingredient: 'bread flour', grams: 130_000, kind: 'flour' }] }], SCALES);
    expect(r.warnings).toEqual(['bread flour for Big 1/1 (130 kg) is more than the platform takes (60 kg): weigh it in 3 lots']);
  });

  it('flags the instant yeast of the demo day\'s biga, with its premix', () => {
    expect(demo.smallWeights.map((w) => [w.label, w.ingredient, w.scale])).toEqual([['biga', 'instant yeast', 'bench scale']]);
    expect(demo.smallWeights[0].premix).toMatchObject({ dissolve: 10, water: 40, factor: 5 });
    expect(demo.warnings.some((w) => w.includes('too small for the scale'))).toBe(true);
    expect(demo.mixes.every((m) => m.ingredients.every((l) => l.scale !== undefined))).toBe(true);
  });
});

describe('equipment at the peak', () => {
  const at = (m: number) => localDateTime('2030-01-01', m);
  const entry = (order: number, step: TimelineEntry['step'], start: number, end: number, extra: Partial<TimelineEntry> = {}): TimelineEntry => ({
    formula: `f${order}`, label: `F${order} 1/1`, step, order, mixNumber: 1, start: at(start), end: at(end), startMinute: start, endMinute: end, minutes: end - start, ...extra,
  });
  const mix = (order: number, pieces: number): SheetMix => ({ formula: `f${order}`, title: `F${order}`, order, mixNumber: 1, of: 1, pieces } as SheetMix);
  const formula = (perSlot: number) => ({ process: [{ step: 'bake', perSlot }] }) as unknown as Formula;

  it('counts what is in use at once, not the total, and warns of a shortage', () => {
    // Two mixes of 10 loaves proofed in bannetons: the first shaped 0–20, baked at 60; the second
    // shaped 60–80 (the first load's baskets come back at 60), baked at 120. Peak 10, not 20.
    // Each bakes in pots (one per loaf, 5 per slot in 2 slots) from its load to its unload.
    const timeline = [
      entry(0, 'shape', 0, 20), entry(0, 'proof', 20, 60, { vessel: 'banneton' }), entry(0, 'bake', 60, 100, { vessel: 'pot', slots: 2 }),
      entry(1, 'shape', 60, 80), entry(1, 'proof', 80, 120, { vessel: 'banneton' }), entry(1, 'bake', 90, 130, { vessel: 'pot', slots: 2 }),
    ];
    const r = equipmentNeeds([mix(0, 10), mix(1, 10)], timeline, { f0: formula(5), f1: formula(5) }, { banneton: 8 }, at);
    const by = Object.fromEntries(r.needs.map((n) => [n.kind, n]));
    expect(by.banneton.peak).toBe(10);
    expect(by.banneton.short).toBe(2);
    // Pots: 10 from 60 to 100 and 10 from 90 to 130 overlap: 20.
    expect(by.pot.peak).toBe(20);
    expect(by.pot.at).toBe(at(90));
    expect(r.warnings.some((w) => w.startsWith('short of bannetons: the night needs 10'))).toBe(true);
    expect(r.warnings.some((w) => w.includes('does not count pots'))).toBe(true);
  });

  it('counts a tray or a couche per oven slot, held from shaping to the end of the bake when it bakes on them', () => {
    // 30 rolls, 15 to a tray (per_slot 15), proofed and baked on trays in one load of 2 slots: 2 trays.
    const timeline = [entry(0, 'shape', 0, 10), entry(0, 'proof', 10, 50, { vessel: 'tray' }), entry(0, 'bake', 50, 70, { vessel: 'tray', slots: 2 })];
    const r = equipmentNeeds([mix(0, 30)], timeline, { f0: formula(15) }, undefined, at);
    expect(r.needs).toHaveLength(1);
    expect(r.needs[0]).toMatchObject({ kind: 'tray', peak: 2, have: null, short: 0 });
    expect(r.needs[0].uses[0]).toMatchObject({ from: at(0), until: at(70) });
    expect(r.warnings).toEqual([]);
  });

  it('lists the demo day\'s kit against what the plan has, and Friday\'s banneton shortage', () => {
    expect(demo.equipment.map((e) => e.kind)).toEqual(['tray', 'tin', 'pot', 'banneton', 'couche']);
    // 24 country levain loaves bake at once: 3 decks × 4 slots × 2 per slot = 24 pots.
    expect(demo.equipment.find((e) => e.kind === 'pot')).toMatchObject({ peak: 24, have: 24, short: 0 });
    expect(demo.equipment.every((e) => e.short === 0)).toBe(true);
    const friday = buildSheet(sheetInput(FRIDAY));
    // 30 country levain loaves are in bannetons from shaping through the retard; the plan has 24.
    expect(friday.equipment.find((e) => e.kind === 'banneton')).toMatchObject({ peak: 30, have: 24, short: 6 });
    expect(friday.warnings).toContain("short of bannetons: the night needs 30 at once (at 14:59), the plan's equipment lists 24; find 6 more, or bake in more loads");
  });
});

describe('culture feeds', () => {
  it('sizes the rye sour\'s feed back from the build plus the keep-back, at the catalog\'s ratio', () => {
    const rye = demo.cultures.find((c) => c.culture === 'mature rye sour')!;
    const build = demo.preferments.find((b) => b.name === 'rye sour')!;
    const seed = build.ingredients.find((l) => l.seed)!.grams;
    // Catalog: ratio 1:5:5, 12-16 h at 24 °C, keep 100 g. Feed = build's 165 g + 100 g; culture
    // 1/11 of it, flour and water 5/11 each.
    expect(seed).toBeCloseTo(165.4, 1);
    expect(rye.grams).toBeCloseTo(seed + 100, 9);
    expect(rye.seed).toBeCloseTo((seed + 100) / 11, 9);
    expect(rye.flour).toEqual({ ingredient: 'rye flour', grams: expect.closeTo(((seed + 100) * 5) / 11, 9) });
    expect(rye.water).toBeCloseTo(((seed + 100) * 5) / 11, 9);
    // The build is on the mixer at 2 Dec 15:55: aimed 14 h (the middle of 12-16 h) before, ripe from 12 h after.
    expect(build.booked?.start).toBe('2026-12-02T15:55');
    expect(rye).toMatchObject({ at: '2026-12-02T01:55', ripeFrom: '2026-12-02T13:55', keepSource: 'the catalog', ratioSource: 'the catalog' });
  });

  it('feeds the levain twice when its builds are too far apart, with the defaults marked as common practice', () => {
    const levain = demo.cultures.filter((c) => c.culture === 'mature levain');
    expect(levain.map((c) => `${c.feed}/${c.feeds}`)).toEqual(['1/2', '2/2']);
    // Default 1:2:2 (common practice) at the culture's 100 % hydration; keep-back 200 g (common practice).
    for (const c of levain) {
      expect(c.ratio).toEqual([1, 2, 2]);
      expect(c.keep).toBe(200);
      expect(c.keepSource).toBe('default, common practice');
      expect(c.timingSource).toBe('default, common practice');
      expect(c.seed).toBeCloseTo(c.grams / 5, 9);
      expect(c.hours).toEqual({ min: 8, max: 12 });
    }
    const builds = demo.preferments.filter((b) => b.name === 'levain');
    expect(levain.map((c) => c.needed)).toEqual(builds.map((b) => b.ingredients.find((l) => l.seed)!.grams));
  });
});

describe('finishes in the pick list', () => {
  it('weighs each formula\'s finishes for its pieces', () => {
    const seeds = demo.finishes.find((f) => f.ingredient === 'harbour seed mix')!;
    // saltmere-seeded-rye: 20 g of seed mix on each of the 8 loaves = 160 g.
    expect(seeds).toMatchObject({ formula: 'saltmere-seeded-rye', use: 'topping', perPiece: 20, pieces: 8, grams: 160 });
    const egg = demo.finishes.find((f) => f.ingredient === 'whole egg')!;
    // tidewater-milk-buns: 3 g of egg wash on each of 96 buns = 288 g.
    expect(egg).toMatchObject({ use: 'wash', pieces: 96, grams: 288 });
  });

  it('names the same allergens as the labels, finishes included (one home: allergens.ts)', () => {
    const input = sheetInput(DAY);
    const fromLabels = new Set(Object.values(input.formulas).flatMap((f) => allergenSummary(f, input.catalog).codes));
    expect(new Set(demo.allergens)).toEqual(fromLabels);
    // The egg wash and the seed mix on top bring eggs and sesame.
    expect(demo.allergens).toEqual(expect.arrayContaining(['eggs', 'sesame']));
  });
});

describe('culture feeds in the task list', () => {
  it('lists each feed as a task of the shift it falls in (panform shift)', async () => {
    const { tasksInWindow } = await import('#shared/schedule/window');
    const tasks = tasksInWindow([demo], '2026-12-02T00:00', '2026-12-02T08:00').filter((t) => t.task === 'feed');
    expect(tasks.map((t) => [t.start, t.what])).toEqual([
      ['2026-12-02T01:55', 'mature rye sour'],
      ['2026-12-02T05:35', 'mature levain (feed 2/2)'],
    ]);
  });
});

describe('the sheet for one shift or window', async () => {
  const { resolveWindow, windowSheet, windowTime } = await import('#shared/sheet/window');
  const { tasksInWindow } = await import('#shared/schedule/window');
  const { presentSheet } = await import('#shared/sheet/present');

  it('reads bare times on the plan\'s night: from 12:00 the evening before, else the plan\'s date', () => {
    expect(windowTime('18:00', '2026-12-03', '--from')).toBe('2026-12-02T18:00');
    expect(windowTime('04:30', '2026-12-03', '--to')).toBe('2026-12-03T04:30');
    expect(windowTime('2026-12-02 10:00', '2026-12-03', '--from')).toBe('2026-12-02T10:00');
    expect(resolveWindow(demo, { from: '22:00', to: '06:00' })).toEqual({ from: '2026-12-02T22:00', to: '2026-12-03T06:00' });
    expect(resolveWindow(demo, {})).toBeNull();
  });

  it('reads a typed date and time once for the sheet\'s window and `panform shift`', async () => {
    const { toShiftOptions } = await import('#cli/commands/shift');
    const { parseLocalDateTime } = await import('#shared/sheet/time');
    // One reader (shared/sheet/time.ts): both surfaces give the same time or both refuse.
    for (const text of ['2026-12-02 18:00', '2026-12-02T18:00', ' 2026-12-31 23:59 ', '2028-02-29 06:00']) {
      const t = parseLocalDateTime(text)!;
      expect(windowTime(text, '2026-12-03', '--from')).toBe(t);
      expect(toShiftOptions('formulas', { from: text, hours: '1' }).from).toBe(t);
    }
    // Not a day on the calendar (2026 is not a leap year), an hour past 23, a month 13.
    for (const text of ['2026-02-29 06:00', '2026-12-02 24:00', '2026-13-01 06:00', '2026-12-02 6:00']) {
      expect(parseLocalDateTime(text)).toBeNull();
      expect(() => windowTime(text, '2026-12-03', '--from')).toThrow('--from needs a time');
      expect(() => toShiftOptions('formulas', { from: text })).toThrow('--from needs a local date and time');
    }
    // --hours runs on past midnight and the month's end on the calendar.
    expect(toShiftOptions('formulas', { from: '2026-12-31 18:00', hours: '12' }).to).toBe('2027-01-01T06:00');
  });

  it('takes a named shift of the plan, and says which names there are', () => {
    expect(resolveWindow(demo, { shift: 'night' })).toEqual({ from: '2026-12-03T00:30', to: '2026-12-03T08:00', name: 'night' });
    expect(() => resolveWindow(demo, { shift: 'evening' })).toThrow('the plan has no shift "evening"; its shifts: day builds, night');
    expect(() => resolveWindow(demo, { from: '25:00', to: '06:00' })).toThrow('--from needs a time');
    expect(() => resolveWindow(demo, { from: '2026-12-03 06:00', to: '2026-12-03 05:00' })).toThrow('the window ends');
  });

  it('keeps the work whose task falls in the window, by the task list\'s rule', () => {
    const w = resolveWindow(demo, { shift: 'day builds' })!;
    const day = windowSheet(demo, w);
    const tasks = tasksInWindow([demo], w.from, w.to);
    // The builds and feeds are exactly the task list's.
    expect(day.preferments.map((b) => b.name).sort()).toEqual(tasks.filter((t) => t.task === 'build').map((t) => t.what.replace(/ \(\d\/\d\)$/, '')).sort());
    expect(day.cultures.length).toBe(tasks.filter((t) => t.task === 'feed').length);
    // The country levain is mixed, divided and shaped on the day shift (it retards overnight): its card is there.
    expect(day.mixes.map((m) => m.formula)).toEqual(tasks.filter((t) => t.task === 'mix').map((t) => t.formula));
    expect(day.mixes.map((m) => m.formula)).toContain('country-levain');
    // The pick list is what is weighed in the window: these builds and mixes, nothing of the night's mixes.
    const weighed = [...day.preferments, ...day.soakers].flatMap((b) => b.ingredients).concat(day.mixes.flatMap((m) => m.ingredients.filter((l) => l.kind !== 'preferment' && l.kind !== 'soaker')));
    expect(day.totals.reduce((a, l) => a + l.grams, 0)).toBeCloseTo(weighed.reduce((a, l) => a + l.grams, 0), 6);
    expect(day.totals.reduce((a, l) => a + l.grams, 0)).toBeLessThan(demo.totals.reduce((a, l) => a + l.grams, 0));
    // Its steps are only those in the window.
    expect(day.timeline.filter((e) => !e.window).every((e) => e.start < w.to && e.end > w.from)).toBe(true);
    const p = presentSheet(day);
    expect(p.title).toBe('Batch sheet · Thursday 3 December 2026 · day builds 2 Dec 10:00–16:00');
  });

  it('puts on the night shift the mixes, their finishes and the small weights of that night', () => {
    const night = windowSheet(demo, resolveWindow(demo, { shift: 'night' })!);
    expect(night.preferments).toEqual([]);
    // The country levain, mixed the day before, bakes on this shift: its card is there with its bake, not its mix.
    const levain = night.timeline.filter((e) => e.formula === 'country-levain');
    expect(night.mixes.map((m) => m.formula)).toContain('country-levain');
    expect(levain.map((e) => e.step)).toContain('bake');
    expect(levain.map((e) => e.step)).not.toContain('mix');
    expect(night.finishes.map((f) => f.ingredient)).toEqual(demo.finishes.map((f) => f.ingredient));
    // Its card shows the weights for reference only: no tick boxes, no blanks.
    const card = presentSheet(night).sections.find((s) => s.key === 'mixes')!.blocks.find((b) => b.title.startsWith('Country levain'))!;
    expect(card.lines[0]).toBe('mixed before this window (2 Dec 10:06–10:14): weights for reference only; its steps in this window below');
    expect(card.table!.tick.every((x) => !x)).toBe(true);
    expect(card.blanks).toBeUndefined();
    // Every card says which scale weighs which line.
    const ciabatta = presentSheet(demo).sections.find((s) => s.key === 'mixes')!.blocks.find((b) => b.title.startsWith('Harbour ciabatta'))!;
    expect(ciabatta.lines).toContain('scales: bench scale for fine salt, instant yeast; platform scale for the rest');
    // The biga (with the small weight) is built the day before: not on this shift.
    expect(night.smallWeights).toEqual([]);
    expect(night.equipment).toEqual(demo.equipment);
  });
});
