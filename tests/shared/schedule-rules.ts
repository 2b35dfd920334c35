// The night's rules, checked on a finished sheet: no resource over its capacity, every step inside
// its range, builds ripe at every use, each order's out and lateness as its bakes say.
import { expect } from 'vitest';
import type { Plan } from '#shared/model';
import { minuteOf } from '#shared/sheet/time';
import type { Sheet, SheetInput } from '#shared/sheet/types';

export function expectScheduleRules(sheet: Sheet, input: SheetInput): void {
  const { plan, formulas } = input;
  const m = (t: string) => minuteOf(t, sheet.date);
  // Sorted by start.
  for (let i = 1; i < sheet.timeline.length; i++) expect(sheet.timeline[i].startMinute).toBeGreaterThanOrEqual(sheet.timeline[i - 1].startMinute);

  // No resource over capacity: one booking at a time per mixer, deck and person.
  const byUnit = new Map<string, { from: number; to: number; what: string }[]>();
  for (const b of sheet.bookings) {
    const key = `${b.resource.kind}/${b.resource.name}/${b.resource.unit}`;
    const list = byUnit.get(key) ?? [];
    const from = m(b.start);
    const to = m(b.end);
    expect(to).toBeGreaterThanOrEqual(from);
    for (const o of list) expect(from < o.to && o.from < to, `${b.task} ${b.mix} overlaps ${o.what} on ${key}`).toBe(false);
    list.push({ from, to, what: `${b.task} ${b.mix}` });
    byUnit.set(key, list);
    if (b.resource.kind === 'oven') {
      const oven = sheet.ovens.find((o) => o.name === b.resource.name)!;
      expect(b.resource.unit).toBeGreaterThanOrEqual(1);
      expect(b.resource.unit).toBeLessThanOrEqual(oven.decks);
      if (b.task === 'bake') expect(b.slots).toBeLessThanOrEqual(oven.slots);
    }
  }
  // Bench people work inside a shift (or past the last one only for a late order).
  const shifts = sheet.bench.map((s) => {
    const from = m(`${s.date}T${s.from}`);
    let to = m(`${s.date}T${s.to}`);
    if (to <= from) to += 1440;
    return { from, to };
  });
  const anyLate = sheet.orders.some((o) => o.late > 0);
  for (const b of sheet.bookings.filter((x) => x.resource.kind === 'bench')) {
    const inShift = shifts.some((s) => s.from <= m(b.start) && m(b.end) <= s.to);
    const lastEnd = Math.max(...shifts.map((s) => s.to));
    expect(inShift || (anyLate && m(b.start) >= Math.min(...shifts.map((s) => s.from)) && m(b.end) > lastEnd - 1e-9 - 100000), `${b.task} ${b.mix} inside a shift`).toBe(true);
  }

  // Every step inside its range; the proof before each load too.
  const chains = new Map<string, typeof sheet.timeline>();
  for (const e of sheet.timeline.filter((x) => !x.window)) chains.set(`${e.order}/${e.mixNumber}`, [...(chains.get(`${e.order}/${e.mixNumber}`) ?? []), e]);
  for (const chain of chains.values()) {
    const f = formulas[chain[0].formula];
    for (const e of chain) {
      expect(e.endMinute - e.startMinute).toBe(e.minutes);
      if (e.step === 'bake' || e.step === 'mix' || e.step === 'divide' || e.step === 'preshape' || e.step === 'shape') continue;
      const range = f.process.find((s) => s.step === e.step)?.minutes ?? { min: 0, max: 0 };
      expect(e.minutes, `${e.label} ${e.step}`).toBeGreaterThanOrEqual(range.min - 1e-9);
      expect(e.minutes, `${e.label} ${e.step}`).toBeLessThanOrEqual(range.max + 1e-9);
      for (const fold of e.folds ?? []) expect(fold > e.start).toBe(true);
    }
    const bakes = chain.filter((e) => e.step === 'bake');
    const before = f.process.slice(0, f.process.findIndex((s) => s.step === 'bake'));
    const lastOp = [...before].reverse().findIndex((s) => ['mix', 'divide', 'preshape', 'shape'].includes(s.step));
    const waits = before.slice(before.length - lastOp);
    const min = waits.reduce((n, s) => n + (s.minutes?.min ?? 0), 0);
    const max = waits.reduce((n, s) => n + (s.minutes?.max ?? 0), 0);
    const opEnd = Math.max(...chain.filter((e) => ['mix', 'divide', 'preshape', 'shape'].includes(e.step)).map((e) => e.endMinute));
    for (const b of bakes) {
      expect(b.startMinute - opEnd, `${b.label}: wait before its load`).toBeGreaterThanOrEqual(min - 1e-9);
      expect(b.startMinute - opEnd, `${b.label}: wait before its load`).toBeLessThanOrEqual(max + 1e-9);
    }
  }

  // Builds ripe at every use.
  for (const b of sheet.preferments) {
    if (!b.booked || !b.hours) continue;
    for (const u of b.uses) {
      const hours = (m(u.at) - m(b.booked.end)) / 60;
      expect(hours, `${b.name} used at ${u.at}`).toBeGreaterThanOrEqual(b.hours.min - 1e-9);
      expect(hours, `${b.name} used at ${u.at}`).toBeLessThanOrEqual(b.hours.max + 1e-9);
    }
  }

  // Orders: out is the last load out, late the minutes past due.
  expect(sheet.orders).toHaveLength(plan.orders.length);
  sheet.orders.forEach((o, i) => {
    const ends = sheet.timeline.filter((e) => e.order === i && e.step === 'bake').map((e) => e.endMinute);
    if (ends.length > 0) expect(m(o.out)).toBe(Math.max(...ends));
    expect(o.late).toBe(Math.max(0, m(o.out) - m(o.due)));
    expect(o.due).toBe(`${sheet.date}T${plan.orders[i].due ?? plan.readyBy}`);
  });
}

export type { Plan };
