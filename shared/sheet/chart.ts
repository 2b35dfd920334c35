// The timeline as a chart: one row per build and per mix, a bar per step, hour ticks. The HTML
// page draws it as SVG and the PDF with vector shapes, from this one model. Pure; no I/O.
import { clockOf, dayMonth, localDateTime, minuteOf } from './time.ts';
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

/**
 * Panform's timeline palette: one colour per kind of work, from the viewer's own warm tones.
 * Each colour has its own lightness (CIE L* about 10 apart), so the bars stay apart printed in
 * grey and for readers who do not tell red from green or blue from yellow; builds are also
 * dashed (a window, not a slot) and folds are marks. tests/shared/sheet-palette.test.ts checks
 * it. The HTML, the PDF and the viewer all draw with these, and every one is in the legend.
 */
export type StepGroup = 'build' | 'mix' | 'bake' | 'cold' | 'bench' | 'proof' | 'rise' | 'cool';

export interface PaletteEntry {
  group: StepGroup;
  colour: string;
  /** The legend's words. */
  label: string;
  /** Ink that reads on the colour (the viewer writes step names inside wide bars). */
  ink: string;
}

/** In the legend's order: the order of the night. */
export const PALETTE: PaletteEntry[] = [
  { group: 'build', colour: '#eef3e6', label: 'build or soak (window)', ink: '#2b1e15' },
  { group: 'mix', colour: '#4a2412', label: 'mix, autolyse', ink: '#fffaf2' },
  { group: 'rise', colour: '#e0a93a', label: 'bulk fermentation, bench rest', ink: '#2b1e15' },
  { group: 'bench', colour: '#6a8c3a', label: 'divide, preshape, shape', ink: '#fffaf2' },
  { group: 'proof', colour: '#c78a5a', label: 'proof', ink: '#2b1e15' },
  { group: 'cold', colour: '#1c5fb8', label: 'retard', ink: '#fffaf2' },
  { group: 'bake', colour: '#8e2a14', label: 'bake', ink: '#fffaf2' },
  { group: 'cool', colour: '#dcd3c3', label: 'cool, other', ink: '#2b1e15' },
];

const GROUP_OF: Record<TimelineStep, StepGroup> = {
  build: 'build',
  soak: 'build',
  autolyse: 'mix',
  mix: 'mix',
  bulk: 'rise',
  fold: 'rise',
  rest: 'rise',
  divide: 'bench',
  preshape: 'bench',
  shape: 'bench',
  proof: 'proof',
  retard: 'cold',
  bake: 'bake',
  cool: 'cool',
  other: 'cool',
};

export function groupOf(step: TimelineStep): StepGroup {
  return GROUP_OF[step];
}

export function paletteOf(step: TimelineStep): PaletteEntry {
  const group = GROUP_OF[step];
  return PALETTE.find((p) => p.group === group)!;
}

export function colourOf(step: TimelineStep): string {
  return paletteOf(step).colour;
}

/** The palette entries a chart uses, in legend order (a legend names every colour drawn). */
export function legendOf(m: ChartModel): PaletteEntry[] {
  const used = new Set(m.rows.flatMap((r) => r.bars.map((b) => GROUP_OF[b.step])));
  return PALETTE.filter((p) => used.has(p.group));
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
    ticks.push({ minute: m, label: clockOf(at), ...(day !== lastDay ? { day: dayMonth(day) } : {}) });
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

