// The sheet cut to one shift or time window (panform sheet --from/--to or --shift, and the
// server's sheet routes): the work whose task falls in the window, by the same rule as the task
// list of `panform shift` (shared/schedule/window.ts).
//
// Rules (docs/batch-sheet.md, "One shift"):
// - Culture feeds, builds and soakers: those whose task (the feed, the build's booking or window)
//   falls in the window.
// - Mix cards: every mix with a step in the window; its card lists only those steps.
// - Pick list: what is weighed in the window: the kept builds, and the mixes whose mix step falls
//   in it; finishes: the mixes whose shape, proof or bake falls in it.
// - Timeline and bookings: what overlaps the window. Orders, equipment (a fact of the whole
//   night), cautions and warnings stay whole.
// Pure; no I/O.
import { inWindow } from '../schedule/window.ts';
import type { IngredientKind } from '../schema/shapes.ts';
import { pickLines, sheetFinishes } from './pick.ts';
import { parseLocalDateTime, shiftDate } from './time.ts';
import { SheetError, type LocalDateTime, type Sheet, type SheetLine, type SheetWindow } from './types.ts';

const CLOCK = /^([01]\d|2[0-3]):[0-5]\d$/;

/**
 * A time as given for a window: "YYYY-MM-DD HH:MM", or a bare "HH:MM" on the plan's night: from
 * 12:00 on, the evening before the plan's date; before 12:00, the plan's date.
 */
export function windowTime(text: string, planDate: string, what: string): LocalDateTime {
  const t = text.trim();
  const full = parseLocalDateTime(t);
  if (full) return full;
  if (!CLOCK.test(t)) throw new SheetError(`${what} needs a time "HH:MM" or "YYYY-MM-DD HH:MM"; got "${text}"`);
  return `${t >= '12:00' ? shiftDate(planDate, -1) : planDate}T${t}`;
}

export interface WindowAsk {
  from?: string;
  to?: string;
  shift?: string;
}

/** The window asked for, or null for the whole night. Throws SheetError with what to change. */
export function resolveWindow(sheet: Pick<Sheet, 'date' | 'bench'>, ask: WindowAsk): SheetWindow | null {
  if (ask.shift !== undefined) {
    if (ask.from !== undefined || ask.to !== undefined) throw new SheetError('a shift gives its own times: give --shift, or --from and --to, not both');
    const named = sheet.bench.filter((b) => b.name !== undefined);
    const s = sheet.bench.find((b) => b.name === ask.shift);
    if (!s) {
      throw new SheetError(
        named.length === 0
          ? `the plan names no shifts; give its bench shifts a name (bench: - { name: night, ... }) or use --from and --to`
          : `the plan has no shift "${ask.shift}"; its shifts: ${named.map((b) => b.name).join(', ')}`,
      );
    }
    const to = s.to > s.from ? s.date : shiftDate(s.date, 1);
    return { from: `${s.date}T${s.from}`, to: `${to}T${s.to}`, name: s.name };
  }
  if (ask.from === undefined && ask.to === undefined) return null;
  if (ask.from === undefined || ask.to === undefined) throw new SheetError('a window needs both --from and --to');
  const from = windowTime(ask.from, sheet.date, '--from');
  let to = windowTime(ask.to, sheet.date, '--to');
  // A bare end not after the start is the next day (22:00 to 06:00).
  if (to <= from && CLOCK.test(ask.to.trim())) to = `${shiftDate(to.slice(0, 10), 1)}T${to.slice(11)}`;
  if (to <= from) throw new SheetError(`the window ends (${to.replace('T', ' ')}) before it starts (${from.replace('T', ' ')})`);
  return { from, to };
}

/** The sheet with only the work of the window. */
export function windowSheet(sheet: Sheet, window: SheetWindow): Sheet {
  const { from, to } = window;
  const inside = (start: string, end: string) => inWindow(start, end, from, to);
  const preferments = sheet.preferments.filter((b) => inside(b.booked?.start ?? b.mixFrom ?? b.mixUntil, b.booked?.end ?? b.mixUntil));
  const soakers = sheet.soakers.filter((b) => inside(b.mixFrom ?? b.mixUntil, b.mixUntil));
  const cultures = sheet.cultures.filter((c) => inside(c.at, c.at));
  const steps = sheet.timeline.filter((e) => !e.window && inside(e.start, e.end));
  const has = (m: Sheet['mixes'][number], kinds?: string[]) =>
    steps.some((e) => e.order === m.order && e.mixNumber === m.mixNumber && (!kinds || kinds.includes(e.step)));
  const mixes = sheet.mixes.filter((m) => has(m));
  const mixed = mixes.filter((m) => has(m, ['mix']));
  const finished = mixes.filter((m) => has(m, ['shape', 'proof', 'bake']));
  const buildLabel = (b: Sheet['preferments'][number]) => (b.batches > 1 ? `${b.name} (${b.batch}/${b.batches})` : b.name);
  const builds = new Set([...preferments, ...soakers].map((b) => `${b.formula}:${buildLabel(b)}`));
  const timeline = sheet.timeline.filter((e) => (e.window ? builds.has(`${e.formula}:${e.label}`) : inside(e.start, e.end)));
  const totals = pickLines([...[...preferments, ...soakers].flatMap((b) => b.ingredients), ...mixed.flatMap((m) => m.ingredients)].filter(weighed));
  const formulas = new Set(mixes.map((m) => m.formula));
  const labels = new Set(mixes.map((m) => `${m.title} ${m.mixNumber}/${m.of}`));
  return {
    ...sheet,
    preferments,
    soakers,
    cultures,
    mixes,
    timeline,
    bookings: sheet.bookings.filter((b) => inside(b.start, b.end)),
    totals,
    finishes: sheetFinishes(finished),
    smallWeights: sheet.smallWeights.filter((w) => (w.where === 'mix' ? labels.has(w.label) : builds.has(`${w.formula}:${w.label}`))),
    formulas: sheet.formulas.filter((f) => formulas.has(f.formula)),
    window,
  };
}

/** A line weighed as it is (a pre-ferment or soaker line of a mix is weighed when its build is made). */
function weighed(l: SheetLine): l is SheetLine & { kind: IngredientKind } {
  return l.kind !== 'preferment' && l.kind !== 'soaker';
}
