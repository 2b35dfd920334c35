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
    for (const b of this.mixers.get(mixer) ?? []) {
      const clash =
        overlaps(start, end, b) ||
        (b.end <= start && start < b.end + this.cleanDown(mixer, b.allergens, allergens)) ||
        (end <= b.start && b.start < end + this.cleanDown(mixer, allergens, b.allergens));
      if (clash) return { kind: 'mixer', name: mixer, start: b.start, end: b.end };
    }
    return null;
  }

  deckConflict(oven: OvenResource, deck: number, start: number, end: number, temperature: number | null): Conflict | null {
    for (const b of this.decks.get(deckKey(oven.name, deck)) ?? []) {
      const t = b.temperature;
      const clash =
        overlaps(start, end, b) ||
        (b.end <= start && start < b.end + changeMinutes(oven, t, temperature)) ||
        (end <= b.start && b.start < end + changeMinutes(oven, temperature, t));
      if (clash) return { kind: 'oven', name: oven.name, start: b.start, end: b.end };
    }
    return null;
  }

  /** The temperature the deck bakes at just before `start`, if anything is baked before it. */
  deckBefore(oven: string, deck: number, start: number): number | null | undefined {
    let best: Busy | undefined;
    for (const b of this.decks.get(deckKey(oven, deck)) ?? []) if (b.end <= start && (!best || b.end > best.end)) best = b;
    return best?.temperature;
  }

  /** Bench people free for the whole task; of people with nothing booked yet on the same shift, only the first. */
  freePeople(start: number, end: number): Person[] {
    const out: Person[] = [];
    const idle = new Set<string>();
    for (const p of this.people) {
      const to = this.overtime && p.overtime ? Infinity : p.to;
      if (p.from > start || end > to || p.busy.some((b) => overlaps(start, end, b))) continue;
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

/** Removes the one booking `b` from a list (bookings are undone in reverse order, so it is near the end). */
export function unbook(list: Busy[], b: Busy): void {
  const i = list.lastIndexOf(b);
  if (i >= 0) list.splice(i, 1);
}
