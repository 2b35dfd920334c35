// The timeline as a chart: one row per build and per mix, a bar per step, hour ticks. The HTML
// page draws it as SVG and the PDF with vector shapes, from this one model. Pure; no I/O.
import { clockOf, localDateTime, minuteOf } from './time.ts';
import type { Sheet, TimelineEntry, TimelineStep } from './types.ts';

export interface ChartBar {
  step: TimelineStep;
  from: number;
  to: number;
  /** A window to do the step in (a build), not a fixed slot. */
  window: boolean;
  /** Fold times, minutes. */
  folds: number[];
  /** The timeline entry drawn (its times, temperature and label for a tooltip). */
  entry: TimelineEntry;
}

export interface ChartRow {
  label: string;
  bars: ChartBar[];
}

export interface ChartTick {
  minute: number;
  /** "04:00" */
  label: string;
  /** "3 Dec" on the first tick and where the day changes. */
  day?: string;
}

export interface ChartModel {
  /** Minutes from the plan date's midnight. */
  from: number;
  to: number;
  rows: ChartRow[];
  ticks: ChartTick[];
  /** The first bake out of the oven. */
  readyBy: number;
  /** Steps cut off at the right edge (long cooling), so the chart stays readable. */
  clipped: boolean;
}

/** Step colours, shared by the HTML and the PDF so the legend reads the same. */
export const STEP_COLOURS: Partial<Record<TimelineStep, string>> & { other: string } = {
  build: '#d9ead3',
  soak: '#fce5cd',
  autolyse: '#cfe2f3',
  mix: '#1f4e79',
  bulk: '#6fa8dc',
  fold: '#3d85c6',
  divide: '#674ea7',
  preshape: '#8e7cc3',
  rest: '#b4a7d6',
  shape: '#8e7cc3',
  proof: '#f6b26b',
  retard: '#9fc5e8',
  bake: '#cc0000',
  cool: '#b7b7b7',
  other: '#999999',
};

export const LEGEND: TimelineStep[] = ['build', 'soak', 'autolyse', 'mix', 'bulk', 'proof', 'retard', 'bake', 'cool'];

export function colourOf(step: TimelineStep): string {
  return STEP_COLOURS[step] ?? STEP_COLOURS.other;
}

export interface ChartRange {
  /** Minutes from the plan date's midnight. */
  from: number;
  to: number;
}

/**
 * The timeline chart. Without a range it covers everything from the first build window to the
 * last bake out; with one, only the rows that have a bar in it.
 */
export function chartModel(sheet: Sheet, range?: ChartRange): ChartModel {
  const rows = new Map<string, ChartRow>();
  for (const e of sheet.timeline) {
    const key = e.window ? `b:${e.label}:${e.formula}` : `m:${e.order}:${e.mixNumber}`;
    let row = rows.get(key);
    if (!row) rows.set(key, (row = { label: e.window ? `${e.label} (${e.step})` : e.label, bars: [] }));
    row.bars.push({
      step: e.step,
      from: e.startMinute,
      to: e.endMinute,
      window: Boolean(e.window),
      folds: (e.folds ?? []).map((f) => minuteOf(f, sheet.date)),
      entry: e,
    });
  }
  const all = sheet.timeline;
  const lastEnd = Math.max(...all.map((e) => e.endMinute));
  let from: number;
  let to: number;
  if (range) {
    ({ from, to } = range);
  } else {
    from = Math.min(...all.map((e) => e.startMinute));
    // The chart ends at the last bake out (plus a quarter hour); cooling runs off the edge.
    const lastBake = Math.max(-Infinity, ...all.filter((e) => e.step === 'bake').map((e) => e.endMinute));
    to = Number.isFinite(lastBake) ? Math.min(lastEnd, lastBake + 15) : lastEnd;
  }
  const start = Math.floor(from / 60) * 60;
  const end = Math.ceil(Math.max(to, from + 60) / 60) * 60;
  const hours = (end - start) / 60;
  const step = hours <= 12 ? 60 : hours <= 24 ? 120 : hours <= 48 ? 240 : 480;
  const ticks: ChartTick[] = [];
  let lastDay = '';
  for (let m = Math.ceil(start / step) * step; m <= end; m += step) {
    const at = localDateTime(sheet.date, m);
    const day = at.slice(0, 10);
    ticks.push({ minute: m, label: clockOf(at), ...(day !== lastDay ? { day: dayLabel(day) } : {}) });
    lastDay = day;
  }
  const readyBy = minuteOf(sheet.readyBy, sheet.date);
  const shown = [...rows.values()].filter((r) => r.bars.some((b) => b.to > start && b.from < end));
  return { from: start, to: end, rows: shown, ticks, readyBy, clipped: lastEnd > end };
}

/**
 * The production morning, when the whole timeline is too long to read in one chart (more than
 * 14 hours): from the first mix on the plan's date to the last bake out. Undefined otherwise.
 */
export function productionRange(sheet: Sheet): ChartRange | undefined {
  const whole = chartModel(sheet);
  if (whole.to - whole.from <= 14 * 60) return undefined;
  const mixes = sheet.timeline.filter((e) => e.step === 'mix' && e.startMinute >= 0);
  const bakes = sheet.timeline.filter((e) => e.step === 'bake');
  if (mixes.length === 0 || bakes.length === 0) return undefined;
  const from = Math.min(...mixes.map((e) => e.startMinute));
  const to = Math.max(...bakes.map((e) => e.endMinute)) + 15;
  return to - from < whole.to - whole.from - 60 ? { from, to } : undefined;
}

const MONTHS = ['Jan', 'Feb', 'Mar', 'Apr', 'May', 'Jun', 'Jul', 'Aug', 'Sep', 'Oct', 'Nov', 'Dec'];

function dayLabel(date: string): string {
  const [, m, d] = date.split('-').map(Number);
  return `${d} ${MONTHS[m - 1]}`;
}
