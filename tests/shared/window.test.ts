// tasksInWindow: the tasks of several plans that fall in one shift, in time order, from each
// plan's sheet, with builds at their booked time and earlier days' work under their own date.
import { describe, expect, it } from 'vitest';
import { buildSheet } from '#shared/sheet/build';
import { tasksInWindow } from '#shared/schedule/window';
import { DEMO_PLANS, sheetInput } from './sheet-fixtures.ts';

describe('tasksInWindow', () => {
  const sheets = DEMO_PLANS.map((p) => buildSheet(sheetInput(p)));

  it('lists the evening builds for tomorrow and the work already running, sorted by start', () => {
    const tasks = tasksInWindow(sheets, '2026-12-02T10:00', '2026-12-02T18:00');
    expect(tasks.length).toBeGreaterThan(0);
    for (let i = 1; i < tasks.length; i++) expect(tasks[i].start >= tasks[i - 1].start).toBe(true);
    for (const t of tasks) expect(t.start < '2026-12-02T18:00' && t.end > '2026-12-02T10:00').toBe(true);
    // The country levain for 3 December is mixed, shaped and put in the cold room the day before.
    const levain = tasks.filter((t) => t.plan === '2026-12-03' && t.formula === 'country-levain').map((t) => t.task);
    expect(levain).toEqual(expect.arrayContaining(['mix', 'bulk', 'shape', 'retard']));
    const poolish = tasks.find((t) => t.task === 'build' && t.what === 'poolish' && t.plan === '2026-12-03')!;
    expect(poolish.resource?.kind).toBe('mixer');
    const sheet = sheets[0];
    expect(poolish.start).toBe(sheet.preferments.find((b) => b.name === 'poolish')!.booked!.start);
  });

  it('takes every plan in the window, each task under the plan it is for', () => {
    const tasks = tasksInWindow(sheets, '2026-12-02T23:00', '2026-12-03T16:00');
    expect(new Set(tasks.map((t) => t.plan))).toEqual(new Set(['2026-12-03', '2026-12-04']));
    // 3 December's bakes, and 4 December's mixes the day before
    expect(tasks.some((t) => t.plan === '2026-12-03' && t.task === 'bake' && t.resource?.kind === 'oven')).toBe(true);
    expect(tasks.some((t) => t.plan === '2026-12-04' && t.task === 'mix')).toBe(true);
  });

  it('is empty for a window with no work', () => {
    expect(tasksInWindow(sheets, '2030-01-01T00:00', '2030-01-02T00:00')).toEqual([]);
  });
});
