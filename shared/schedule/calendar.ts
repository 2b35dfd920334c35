// What each resource is doing: the mixers' mixes (with their allergens), the oven decks' loads
// (with their temperatures) and each bench person's tasks, and the checks that a new booking fits.
// Pure; no I/O.
import { changeMinutes, type MixerResource, type OvenResource, type Problem, type ResourceKind } from './problem.ts';

export interface Busy {
  start: number;
  end: number;
  allergens?: readonly string[];
  temperature?: number | null;
}

export interface Person {
  /** 1-based number of the person on the bench. */
  unit: number;
  from: number;
  to: number;
  /** The end of the night's last shift may run over when an order is already late. */
  overtime: boolean;
  busy: Busy[];
}

/** Why a booking did not fit: which resource, and the booking in the way. */
export interface Conflict {
  kind: ResourceKind;
  name: string;
  start: number;
  end: number;
}

const overlaps = (s: number, e: number, b: Busy) => s < b.end && b.start < e;

export class Calendar {
  readonly mixers = new Map<string, Busy[]>();
  readonly decks = new Map<string, Busy[]>();
  readonly people: Person[] = [];
  /** Lets the bench run past its last shift (used only to place orders that are late anyway). */
  overtime = false;
  private readonly mixerByName = new Map<string, MixerResource>();
  readonly ovenByName = new Map<string, OvenResource>();

  constructor(problem: Problem) {
    for (const m of problem.mixers) {
      this.mixers.set(m.name, []);
      this.mixerByName.set(m.name, m);
    }
    for (const o of problem.ovens) {
      this.ovenByName.set(o.name, o);
      for (let d = 1; d <= o.decks; d++) this.decks.set(deckKey(o.name, d), []);
    }
    const lastEnd = Math.max(...problem.shifts.map((s) => s.to));
    problem.shifts.forEach((s, i) => {
      // People of earlier shifts that overlap this one keep their numbers; this shift's come after.
      const offset = problem.shifts.slice(0, i).filter((o) => o.from < s.to && s.from < o.to).reduce((n, o) => n + o.people, 0);
      for (let p = 1; p <= s.people; p++) this.people.push({ unit: offset + p, from: s.from, to: s.to, overtime: s.to === lastEnd, busy: [] });
    });
  }

  /** Minutes to clean the mixer between a dough and the next: when the next lacks an allergen of the first. */
  cleanDown(mixer: string, before: readonly string[] | undefined, after: readonly string[] | undefined): number {
    if (!before || before.every((a) => after?.includes(a))) return 0;
    return this.mixerByName.get(mixer)?.cleanDown ?? 0;
  }

  mixerConflict(mixer: string, start: number, end: number, allergens: readonly string[]): Conflict | null {
    // The bookings of one mixer never overlap and are kept sorted, so only the neighbours can clash.
    const list = this.mixers.get(mixer) ?? [];
    const i = firstStartingAtOrAfter(list, end);
    const prev = list[i - 1];
    const next = list[i];
    if (prev && (prev.end > start || start < prev.end + this.cleanDown(mixer, prev.allergens, allergens))) {
      return { kind: 'mixer', name: mixer, start: prev.start, end: prev.end };
    }
    if (next && next.start < end + this.cleanDown(mixer, allergens, next.allergens)) return { kind: 'mixer', name: mixer, start: next.start, end: next.end };
    return null;
  }

  deckConflict(oven: OvenResource, deck: number, start: number, end: number, temperature: number | null): Conflict | null {
    const list = this.decks.get(deckKey(oven.name, deck)) ?? [];
    const i = firstStartingAtOrAfter(list, end);
    const prev = list[i - 1];
    const next = list[i];
    if (prev && (prev.end > start || start < prev.end + changeMinutes(oven, prev.temperature, temperature))) {
      return { kind: 'oven', name: oven.name, start: prev.start, end: prev.end };
    }
    if (next && next.start < end + changeMinutes(oven, temperature, next.temperature)) return { kind: 'oven', name: oven.name, start: next.start, end: next.end };
    return null;
  }

  /** The temperature the deck bakes at just before `start`, if anything is baked before it. */
  deckBefore(oven: string, deck: number, start: number): number | null | undefined {
    const list = this.decks.get(deckKey(oven, deck)) ?? [];
    let i = firstStartingAtOrAfter(list, start);
    while (i > 0 && list[i - 1].end > start) i--;
    return list[i - 1]?.temperature;
  }

  /** Bench people free for the whole task; of people with nothing booked yet on the same shift, only the first. */
  freePeople(start: number, end: number): Person[] {
    const out: Person[] = [];
    const idle = new Set<string>();
    for (const p of this.people) {
      const to = this.overtime && p.overtime ? Infinity : p.to;
      if (p.from > start || end > to) continue;
      const j = firstStartingAtOrAfter(p.busy, end);
      if (j > 0 && p.busy[j - 1].end > start) continue;
      if (p.busy.length === 0) {
        const key = `${p.from}/${p.to}`;
        if (idle.has(key)) continue;
        idle.add(key);
      }
      out.push(p);
    }
    return out;
  }

  benchConflict(start: number, end: number): Conflict {
    const on = this.people.filter((p) => p.from <= start && end <= p.to);
    const busy = on.flatMap((p) => p.busy.filter((b) => overlaps(start, end, b)));
    if (on.length === 0 || busy.length === 0) return { kind: 'bench', name: 'bench', start, end };
    return { kind: 'bench', name: 'bench', start: Math.min(...busy.map((b) => b.start)), end: Math.max(...busy.map((b) => b.end)) };
  }
}

export const deckKey = (oven: string, deck: number) => `${oven}\u0000${deck}`;

/** Index of the first booking that starts at or after `t` (bookings sorted by start). */
export function firstStartingAtOrAfter(list: Busy[], t: number): number {
  let lo = 0;
  let hi = list.length;
  while (lo < hi) {
    const mid = (lo + hi) >> 1;
    if (list[mid].start < t) lo = mid + 1;
    else hi = mid;
  }
  return lo;
}

/** Adds a booking, keeping the list sorted by start. */
export function book(list: Busy[], b: Busy): void {
  list.splice(firstStartingAtOrAfter(list, b.start), 0, b);
}

/** Removes the one booking `b` from a list. */
export function unbook(list: Busy[], b: Busy): void {
  let i = firstStartingAtOrAfter(list, b.start);
  while (i < list.length && list[i] !== b) i++;
  if (i < list.length) list.splice(i, 1);
}
