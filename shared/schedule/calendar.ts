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

/**
 * A refusal with the end times the same reason rules out for an operation of the same length:
 * every end strictly between `above` and `below` is refused too, so a search can jump past them
 * without checking each (the next-event step of the search).
 */
export interface Refusal extends Conflict {
  above: number;
  below: number;
}

const overlaps = (s: number, e: number, b: Busy) => s < b.end && b.start < e;

/**
 * The ends refused because of `list[i]` for an operation of `minutes`: those that end less than
 * `before` minutes ahead of it, or start less than `after` minutes past it. Bounded by its
 * neighbours' starts, so `list[i]` is still the booking the check compares with there.
 */
function ruledOut(list: Busy[], i: number, minutes: number, before: number, after: number): { above: number; below: number } {
  const b = list[i];
  return {
    above: Math.max(b.start - before, list[i - 1]?.start ?? -Infinity),
    below: Math.min(b.end + after + minutes, list[i + 1]?.start ?? Infinity),
  };
}

/**
 * The latest end at or before `end` at which an operation of `minutes` fits between the bookings of
 * a sorted, non-overlapping list (`gapBefore`, `gapAfter`: as for `neighbourConflict`), or
 * -Infinity. Every end after it and up to `end` is refused: a refusal can rule out the whole
 * stretch down to it, not only the booking in the way.
 */
function latestFit(
  list: Busy[], end: number, minutes: number, gapBefore: (b: Busy) => number, gapAfter: (b: Busy) => number,
): number {
  let i = firstStartingAtOrAfter(list, end);
  let hi = end;
  // Ends in (list[i - 1].start, list[i].start] are checked against these two bookings.
  for (;;) {
    const next = list[i];
    const prev = list[i - 1];
    const u = next ? Math.min(hi, next.start - gapBefore(next)) : hi;
    if (!prev) return u;
    if (u > prev.start && u >= prev.end + gapAfter(prev) + minutes) return u;
    hi = prev.start;
    i--;
  }
}

export class Calendar {
  readonly mixers = new Map<string, Busy[]>();
  readonly people: Person[] = [];
  /** Lets the bench run past its last shift (used only to place orders that are late anyway). */
  overtime = false;
  private readonly mixerByName = new Map<string, MixerResource>();
  readonly ovenByName = new Map<string, OvenResource>();
  /** Per oven, each deck's bookings (deck 1 first). */
  private readonly decks = new Map<string, Busy[][]>();

  constructor(problem: Problem) {
    for (const m of problem.mixers) {
      this.mixers.set(m.name, []);
      this.mixerByName.set(m.name, m);
    }
    for (const o of problem.ovens) {
      this.ovenByName.set(o.name, o);
      this.decks.set(o.name, Array.from({ length: o.decks }, () => []));
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

  /**
   * Whether the mix fits on the mixer, and if not why. `wide`: the refusal's `above` is the latest
   * end below that fits (every end down to it is refused), not only the end of the booking in the
   * way; a search that does not count refusals per booking jumps there in one step.
   */
  mixerConflict(mixer: string, start: number, end: number, allergens: readonly string[], wide = false): Refusal | null {
    // The bookings of one mixer never overlap and are kept sorted, so only the neighbours can clash.
    const list = this.mixers.get(mixer) ?? [];
    return neighbourConflict(
      list, start, end, 'mixer', mixer,
      (b) => this.cleanDown(mixer, allergens, b.allergens),
      (b) => this.cleanDown(mixer, b.allergens, allergens),
      wide,
    );
  }

  /** Whether the load fits on the deck, and if not why (`wide`: as for `mixerConflict`). */
  deckConflict(oven: OvenResource, deck: number, start: number, end: number, temperature: number | null, wide = false): Refusal | null {
    const list = this.deckList(oven.name, deck);
    return neighbourConflict(
      list, start, end, 'oven', oven.name,
      (b) => changeMinutes(oven, temperature, b.temperature),
      (b) => changeMinutes(oven, b.temperature, temperature),
      wide,
    );
  }

  /** A deck's bookings, sorted by start (deck 1-based). */
  deckList(oven: string, deck: number): Busy[] {
    return this.decks.get(oven)?.[deck - 1] ?? [];
  }

  /** The temperature the deck bakes at just before `start`, if anything is baked before it. */
  deckBefore(oven: string, deck: number, start: number): number | null | undefined {
    const list = this.deckList(oven, deck);
    let i = firstStartingAtOrAfter(list, start);
    while (i > 0 && list[i - 1].end > start) i--;
    return list[i - 1]?.temperature;
  }

  /**
   * Why nobody on the bench can take the task: the busy stretch, and the ends refused for the same
   * reasons (each person is out of their shift or busy for a stretch around `end`; the stretch all
   * of them share is refused).
   */
  benchRefusal(start: number, end: number, wide = false): Refusal {
    const minutes = end - start;
    let above = -Infinity;
    let below = Infinity;
    for (const p of this.people) {
      const to = this.overtime && p.overtime ? Infinity : p.to;
      let r: { above: number; below: number };
      if (p.from > start) r = { above: -Infinity, below: p.from + minutes };
      else if (end > to) r = { above: to, below: Infinity };
      else {
        const j = firstStartingAtOrAfter(p.busy, end);
        r = ruledOut(p.busy, j - 1, minutes, 0, 0);
      }
      if (wide) {
        // The latest end at or below this one at which this person is free (inside the shift).
        const fit = latestFit(p.busy, Math.min(end, to), minutes, noGap, noGap);
        r.above = fit - minutes >= p.from ? fit : -Infinity;
      }
      above = Math.max(above, r.above);
      below = Math.min(below, r.below);
    }
    return { ...this.benchConflict(start, end), above, below };
  }

  /** Bench people free for the whole task; of people with nothing booked yet on the same shift, only the first. */
  freePeople(start: number, end: number): Person[] {
    const out: Person[] = [];
    for (const p of this.people) {
      const to = this.overtime && p.overtime ? Infinity : p.to;
      if (p.from > start || end > to) continue;
      const j = firstStartingAtOrAfter(p.busy, end);
      if (j > 0 && p.busy[j - 1].end > start) continue;
      // An idle person on the same hours as one already taken is alike.
      if (p.busy.length === 0 && out.some((q) => q.busy.length === 0 && q.from === p.from && q.to === p.to)) continue;
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

/** The booking of a sorted, non-overlapping list that an operation [start, end] clashes with, if any. */
function neighbourConflict(
  list: Busy[], start: number, end: number, kind: ResourceKind, name: string,
  /** Minutes needed between this operation's end and a booking after it. */
  gapBefore: (b: Busy) => number,
  /** Minutes needed between a booking's end and this operation's start. */
  gapAfter: (b: Busy) => number,
  /** Rule out every end down to the latest that fits (see `latestFit`). */
  wide: boolean,
): Refusal | null {
  const i = firstStartingAtOrAfter(list, end);
  const prev = list[i - 1];
  let at = -1;
  if (prev && (prev.end > start || start < prev.end + gapAfter(prev))) at = i - 1;
  else if (i < list.length && list[i].start < end + gapBefore(list[i])) at = i;
  if (at < 0) return null;
  const b = list[at];
  const minutes = end - start;
  const r = ruledOut(list, at, minutes, gapBefore(b), gapAfter(b));
  return { kind, name, start: b.start, end: b.end, above: wide ? latestFit(list, end, minutes, gapBefore, gapAfter) : r.above, below: r.below };
}

const noGap = () => 0;

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
