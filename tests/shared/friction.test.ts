// Friction learned from the bench (shared/friction.ts): one mix's rise worked back from its
// measured dough temperature, the robust median with outliers, the proposal and its wording,
// and the record targets of a day's sheet (shared/records.ts).
import { describe, expect, it } from 'vitest';
import {
  dayRange, FRICTION_MINIMUM, frictionTable, median, mixFriction, proposeFriction, robustRise, type CurrentRise, type RiseReading, type SheetMixInputs,
} from '#shared/friction';
import { findTarget, recordTargets } from '#shared/records';
import { buildSheet } from '#shared/sheet/build';
import { DEMO_PLANS, sheetInput } from './sheet-fixtures.ts';

const straight: SheetMixInputs = { n: 3, room: 22, flour: 20, preferments: [], rise: 4, doughTemperature: 24, waterTemperature: 18, water: 700, bassinage: null };

describe('one mix\'s friction', () => {
  // The multiplier method worked backwards (J. Hamelman, "Bread: A Baker's Book of Techniques and
  // Recipes", Wiley 2004, appendix on desired dough temperature; from memory, page not checked):
  // friction factor = n × measured − (room + flour + water + each pre-ferment); rise = factor ÷ n.
  it('works back a straight dough by hand: 3 × 25 − (22 + 20 + 14) = 19, rise 19 ÷ 3', () => {
    const f = mixFriction(straight, { doughTemperature: 25, waterTemperature: 14 })!;
    expect(f.friction).toBeCloseTo(19, 12);
    expect(f.rise).toBeCloseTo(19 / 3, 12);
    expect(f).toMatchObject({ n: 3, waterTemperature: 14, waterFrom: 'measured' });
  });

  it('counts a pre-ferment as a fourth factor: 4 × 25 − (22 + 20 + 20 + 14) = 24, rise 6', () => {
    const f = mixFriction({ ...straight, n: 4, preferments: [20] }, { doughTemperature: 25, waterTemperature: 14 })!;
    expect(f.friction).toBeCloseTo(24, 12);
    expect(f.rise).toBeCloseTo(6, 12);
  });

  it('takes the sheet\'s water when the bench wrote none', () => {
    const f = mixFriction(straight, { doughTemperature: 24 })!;
    // 3 × 24 − (22 + 20 + 18) = 12: the dough came off at its aim, so the rise is the file's 4
    expect(f.rise).toBeCloseTo(4, 12);
    expect(f.waterFrom).toBe('sheet');
  });

  it('weighs a bassinage in: 650 g at 10 °C and 50 g at 30 °C make 700 g at 8000 ÷ 700 °C', () => {
    const f = mixFriction({ ...straight, bassinage: { grams: 50, temperature: 30 } }, { doughTemperature: 24, waterTemperature: 10 })!;
    // hand-worked: whole water (650 × 10 + 50 × 30) ÷ 700 = 11.4286 °C; 3 × 24 − (22 + 20 + 11.4286) = 18.5714
    expect(f.friction).toBeCloseTo(72 - 42 - 8000 / 700, 12);
    expect(f.waterTemperature).toBe(10);
  });

  it('has nothing to say without any water temperature', () => {
    expect(mixFriction({ ...straight, waterTemperature: null }, { doughTemperature: 24 })).toBeNull();
  });

  it.each(DEMO_PLANS.map((p) => [p]))('gives back the plan\'s own rise for every mix of %s made as printed', (plan) => {
    // The sheet's water is worked out from the plan's rise (dough-water.ts); a dough coming off at
    // its aim with that water must give that rise again, bassinage and pre-ferments included.
    const sheet = buildSheet(sheetInput(plan));
    const targets = recordTargets(sheet).filter((t) => t.kind === 'mix' && t.inputs && t.inputs.waterTemperature !== null && t.inputs.doughTemperature !== null);
    expect(targets.length).toBeGreaterThan(3);
    for (const t of targets) {
      const f = mixFriction(t.inputs!, { doughTemperature: t.inputs!.doughTemperature!, waterTemperature: t.inputs!.waterTemperature })!;
      expect(f.rise).toBeCloseTo(t.inputs!.rise, 9);
    }
  });
});

describe('the robust median', () => {
  const r = (rise: number, i: number): RiseReading => ({ recordId: i + 1, date: `2026-11-${String(12 + i).padStart(2, '0')}`, rise });

  it('takes the middle value, or the mean of the two middle ones', () => {
    expect(median([3, 1, 2])).toBe(2);
    expect(median([4, 1, 3, 2])).toBe(2.5);
  });

  it('sets apart a reading further than 3 scaled MADs (Leys et al. 2013; from memory)', () => {
    // hand-worked: median 5; |deviations| 1, 0.5, 0, 0.5, 7 → MAD 0.5, scaled 1.4826 × 0.5 = 0.7413;
    // limit 3 × 0.7413 = 2.224: 12 is 7 away, an outlier; the rest's median is (4.5 + 5) ÷ 2
    const out = robustRise([4, 4.5, 5, 5.5, 12].map(r));
    expect(out.outliers.map((o) => o.rise)).toEqual([12]);
    expect(out.rise).toBe(4.75);
    expect(out.scaledMad).toBeCloseTo(0.7413, 4);
  });

  it('does not make outliers of readings within a thermometer\'s half degree of identical ones', () => {
    // MAD 0 (three equal readings): the floor of 0.5 gives a limit of 1.5
    const out = robustRise([4, 4, 4, 5.4].map(r));
    expect(out.outliers).toEqual([]);
    expect(robustRise([4, 4, 4, 5.6].map(r)).outliers.map((o) => o.rise)).toEqual([5.6]);
  });
});

describe('the proposal', () => {
  const current: CurrentRise = { rise: 13 / 3, riseFrom: 'friction', plan: '2026-12-03', path: 'formulas/plans/2026-12-03.yaml' };
  const readings = (rises: number[]): RiseReading[] => rises.map((rise, i) => ({ recordId: i + 1, date: ['2026-11-12', '2026-11-19', '2026-11-20', '2026-11-26', '2026-11-27', '2026-11-28'][i], rise }));
  const key = { mixer: 'spiral', formula: 'harbour-ciabatta', title: 'Harbour ciabatta' };

  it(`waits for ${FRICTION_MINIMUM} mixes`, () => {
    const p = proposeFriction(key, readings([5, 5]), current);
    expect(p).toMatchObject({ status: 'too few', rise: null, friction: null, change: null, basis: 'from 2 mixes, 12–19 Nov' });
  });

  it('proposes the median with its basis and the line to change, leaving the file alone', () => {
    const p = proposeFriction(key, readings([5, 5.5, 4.5, 5, 9.5, 5]), current);
    expect(p.status).toBe('propose');
    expect(p.rise).toBe(5);
    expect(p.friction).toBe(15);
    expect(p.outliers.map((o) => o.recordId)).toEqual([5]);
    expect(p.basis).toBe('from 6 mixes, 12–28 Nov (1 left out as an outlier)');
    expect(p.change).toBe('in formulas/plans/2026-12-03.yaml, mixer spiral: friction: 13 °C becomes friction: 15 °C');
    expect(current.rise).toBe(13 / 3);
  });

  it('says the file agrees within half a degree, and speaks the line\'s own word', () => {
    expect(proposeFriction(key, readings([4.5, 4.5, 4.5]), current).status).toBe('agrees');
    const p = proposeFriction(key, readings([2, 2, 2]), { ...current, rise: 4, riseFrom: 'rise' });
    expect(p.change).toBe('in formulas/plans/2026-12-03.yaml, mixer spiral: rise: 4 °C becomes rise: 2 °C');
  });

  it('names days across months and years', () => {
    expect(dayRange('2026-11-28', '2026-12-03')).toBe('28 Nov – 3 Dec');
    expect(dayRange('2026-12-30', '2027-01-02')).toBe('30 Dec 2026 – 2 Jan 2027');
    expect(dayRange('2026-12-03', '2026-12-03')).toBe('3 Dec');
  });

  it('groups records per mixer and formula', () => {
    const rec = (id: number, mixer: string, formula: string, dough: number) => ({
      recordId: id, date: '2026-12-03', mixer, formula, title: formula, inputs: { ...straight }, doughTemperature: dough, waterTemperature: 18,
    });
    const table = frictionTable([rec(1, 'spiral', 'b', 25), rec(2, 'small spiral', 'a', 24), rec(3, 'spiral', 'b', 25), rec(4, 'spiral', 'b', 25)], () => null);
    expect(table.map((p) => [p.mixer, p.formula, p.mixes, p.status])).toEqual([['small spiral', 'a', 1, 'too few'], ['spiral', 'b', 3, 'propose']]);
    expect(table[1].rise).toBeCloseTo(5, 12);
    expect(table[1].change).toBe('in the plan, mixer spiral: add rise: 5 °C');
  });
});

describe('record targets', () => {
  const sheet = buildSheet(sheetInput(DEMO_PLANS[0]));
  const targets = recordTargets(sheet);

  it('names each mix by formula and its number that day, and each build by its name', () => {
    const names = targets.map((t) => t.target);
    expect(names).toContain('harbour-ciabatta/1');
    expect(names).toContain('harbour-ciabatta/2');
    expect(names).toContain('poolish');
    // The demo day makes levain in two batches.
    expect(names).toContain('levain/1');
    expect(names).toContain('levain/2');
    expect(targets.find((t) => t.target === 'harbour-ciabatta/2')?.label).toBe('Harbour ciabatta 2/2');
  });

  it('refuses a name the sheet does not have, listing what it has', () => {
    expect(findTarget(targets, 'levain')).toEqual({ error: expect.stringMatching(/made more than once that day: name one of levain\/1, levain\/2/) });
    expect(findTarget(targets, 'harbour-tin-loaf/1')).toEqual({ error: expect.stringMatching(/not on that day's sheet/) });
  });
});
