// Every task of several plans that falls in a time window ("what to do on this shift"): culture
// feeds, builds, mixes, bench tasks, bakes, cold holds, from each plan's sheet. Pure; no I/O.
import type { Booking, LocalDateTime, Sheet } from '../sheet/types.ts';
import { compareText } from '../text.ts';

export interface ShiftTask {
  /** The plan's date (the day its bread is out). */
  plan: string;
  start: LocalDateTime;
  end: LocalDateTime;
  /** The process step, "build" for a pre-ferment, "soak" for a soaker's window, "feed" for a culture's feed. */
  task: string;
  formula: string;
  /** The mix's label, or the build's name. */
  what: string;
  /** Where: the mixer, the oven and deck, or the bench person; null for waits (bulk, proof, retard...). */
  resource: Booking['resource'] | null;
  temperature: number | null;
  note: string | null;
}

/** A task from `start` to `end` falls in [from, to): it overlaps it, or it is a moment inside it. */
export function inWindow(start: LocalDateTime, end: LocalDateTime, from: LocalDateTime, to: LocalDateTime): boolean {
  return start < to && (end > from || (end === start && start >= from));
}

/** The tasks of the given sheets that overlap [from, to), sorted by start. Times compare as local date-times. */
export function tasksInWindow(sheets: Sheet[], from: LocalDateTime, to: LocalDateTime): ShiftTask[] {
  const out: ShiftTask[] = [];
  const inside = (start: string, end: string) => inWindow(start, end, from, to);
  for (const sheet of sheets) {
    const resourceOf = (e: Sheet['timeline'][number]): Booking['resource'] | null => {
      if (!e.resource) return null;
      if (e.resource === 'bench') return { kind: 'bench', name: 'bench', unit: e.unit ?? null };
      const [kind, name] = e.resource.split(/:(.*)/s);
      return { kind: kind === 'oven' ? 'oven' : 'mixer', name, unit: e.unit ?? null };
    };
    for (const e of sheet.timeline) {
      if (e.window) continue;
      if (!inside(e.start, e.end)) continue;
      out.push({
        plan: sheet.date, start: e.start, end: e.end, task: e.step, formula: e.formula, what: e.label,
        resource: resourceOf(e), temperature: e.temperature ?? null, note: e.note ?? null,
      });
    }
    for (const b of sheet.preferments) {
      const start = b.booked?.start ?? b.mixFrom ?? b.mixUntil;
      const end = b.booked?.end ?? b.mixUntil;
      if (!inside(start, end)) continue;
      out.push({
        plan: sheet.date, start, end, task: 'build', formula: b.formula, what: b.batches > 1 ? `${b.name} (${b.batch}/${b.batches})` : b.name,
        resource: b.booked ? { kind: 'mixer', name: b.booked.mixer, unit: null } : null,
        temperature: b.targetTemperature, note: b.booked ? null : 'mix by hand within this window',
      });
    }
    for (const c of sheet.cultures ?? []) {
      if (!inside(c.at, c.at)) continue;
      out.push({
        plan: sheet.date, start: c.at, end: c.at, task: 'feed', formula: c.uses[0].formula, what: c.feeds > 1 ? `${c.culture} (feed ${c.feed}/${c.feeds})` : c.culture,
        resource: null, temperature: c.temperature,
        note: `${Math.round(c.seed)} g culture + ${Math.round(c.flour.grams)} g ${c.flour.ingredient} + ${Math.round(c.water)} g water; ripe ${c.ripeFrom.slice(5, 16).replace('T', ' ')} to ${c.ripeUntil.slice(5, 16).replace('T', ' ')}`,
      });
    }
    for (const b of sheet.soakers) {
      const start = b.mixFrom ?? b.mixUntil;
      if (!inside(start, b.mixUntil)) continue;
      out.push({
        plan: sheet.date, start, end: b.mixUntil, task: 'soak', formula: b.formula, what: b.name, resource: null,
        temperature: b.holdTemperature, note: 'make within this window',
      });
    }
  }
  return out.sort((a, b) => compareText(a.start, b.start) || compareText(a.end, b.end) || compareText(a.plan, b.plan) || compareText(a.what, b.what));
}
