// The night's schedule: every mix's operations on the mixers, the bench people and the oven decks,
// each order out by its due time where that can be done. Pure; no I/O.
//
// Method (docs/decisions/0009-night-schedule-by-list-scheduling.md): a serial schedule-generation scheme for
// resource-constrained project scheduling (Kolisch, R. 1996, "Serial and parallel
// resource-constrained project scheduling methods revisited: theory and computation", European
// Journal of Operational Research 90(2), 320–333), run backward from each due time:
// - Mixes are taken one at a time by priority: earliest due first, then the longest process.
// - Fresh first: each oven the formula names is tried for an out time in the two hours before the
//   due time before any is tried earlier (outBands).
// - A mix is placed backward: its oven loads as late as they can end by the due time, then its
//   shaping, preshaping, dividing and mixing each as late as the waits between them (their
//   ranges) and the free resources allow. Candidate times are the window's ends, the preferred
//   waits (the plan's `ranges`) and every 5 minutes between. A refused candidate rules out the
//   stretch of end times down to the latest that fits on that resource (next-event search: the
//   search jumps past the bookings, binary-searched in each resource's sorted list, without
//   checking each 5 minutes), and no end is tried before the night's start leaves room for the
//   operations before it. Those stretches are kept for the whole mix and travel up the chain: an
//   end whose window before lies inside one fails too, up to the oven loads.
// - Search with chronological backtracking (a depth-first search over those candidates, across
//   mixes) until every order is on time, within a budget of checks; on a small night it is
//   exhaustive, so an on-time schedule on the 5-minute grid is found whenever one exists. Subtrees
//   that found nothing are remembered per window and per end time, so a neighbouring window does
//   not search them again.
// - When the budget runs out or no on-time schedule exists, a single greedy pass keeps every order
//   it can on time and places the others at the earliest time they can be out.
import { book, Calendar, unbook, type Busy, type Conflict, type Refusal } from './calendar.ts';
import type { Job, Load, Operation, OvenResource, Placement, Problem } from './problem.ts';

export const GRID_MINUTES = 5;
/** Checks the backtracking search may make before it settles for the greedy pass. */
const SEARCH_BUDGET = 20_000;
/** Nights of at most this many mixes get the backtracking search across mixes. */
const EXACT_JOBS = 12;
/** Checks one mix may take in the greedy pass, per attempt. */
const JOB_BUDGET = 6_000;
/** How far past its due time a late order is looked for, minutes. */
const LATE_HORIZON = 48 * 60;

export interface LateJob {
  job: number;
  /** Resource that turned away most on-time placements, with when it was busy. */
  bottleneck: Conflict | null;
  /** The process is longer than the time from the first shift to the due time. */
  tooEarly: boolean;
}

export interface Solution {
  placements: Placement[];
  late: LateJob[];
  calendar: Calendar;
  /** True when the backtracking search found every order on time. */
  exact: boolean;
}

interface Budget {
  left: number;
}

/** Per resource that refused (in the order they first did), its weighed refusals and the latest busy stretch. */
type Tally = (Conflict & { count: number })[];

export interface SolveOptions {
  /**
   * Skip what is known to fail: whole busy stretches per refusal, and ends whose operations before
   * have nowhere to go (default). Off, every candidate is checked on its own; tests compare the two.
   */
  prune?: boolean;
}

export function solve(problem: Problem, options: SolveOptions = {}): Solution {
  const prune = options.prune ?? true;
  const start = nightStart(problem);
  const order = [...problem.jobs].sort(
    (a, b) => a.due - b.due || processLength(b) - processLength(a) || a.id - b.id,
  );

  // Backtracking search for an on-time night (on a big night, one greedy pass is the search).
  const calendar = new Calendar(problem);
  const budget: Budget = { left: order.length <= EXACT_JOBS ? SEARCH_BUDGET : 0 };
  const gens: (Generator<Placement> | undefined)[] = [];
  const chosen: Placement[] = [];
  let i = 0;
  while (i >= 0 && i < order.length && budget.left > 0) {
    gens[i] ??= placeJob(order[i], calendar, start, -Infinity, order[i].due, budget, null, prune);
    const r = gens[i]!.next();
    if (r.done) {
      gens[i] = undefined;
      i--;
      continue;
    }
    chosen[i] = r.value;
    i++;
  }
  if (i === order.length) {
    const placements: Placement[] = [];
    for (const p of chosen) placements[p.job] = p;
    return { placements, late: [], calendar, exact: true };
  }

  // Greedy pass: each mix on time when it can be, else as early as it can be out.
  const greedy = new Calendar(problem);
  const placements: Placement[] = [];
  const late: LateJob[] = [];
  for (const job of order) {
    const tally: Tally = [];
    const onTime = placeJob(job, greedy, start, -Infinity, job.due, { left: JOB_BUDGET }, tally, prune).next();
    if (!onTime.done) {
      placements[job.id] = onTime.value;
      continue;
    }
    greedy.overtime = true;
    // Out by due + 15 min, + 30, + 60, ... until it fits, then halve the step back to the grid.
    const attempt = (by: number) => {
      const r = placeJob(job, greedy, start, job.due + 1, by, { left: JOB_BUDGET }, null, prune);
      const first = r.next();
      r.return(undefined);
      return !first.done;
    };
    let step = 3 * GRID_MINUTES;
    let fails = job.due;
    let fits = job.due + step;
    while (fits < job.due + LATE_HORIZON && !attempt(fits)) {
      fails = fits;
      step *= 2;
      fits = job.due + step;
    }
    while (fits - fails > GRID_MINUTES) {
      const mid = fails + Math.ceil((fits - fails) / 2 / GRID_MINUTES) * GRID_MINUTES;
      if (mid >= fits) break;
      if (attempt(mid)) fits = mid;
      else fails = mid;
    }
    const r = placeJob(job, greedy, start, job.due + 1, fits, { left: JOB_BUDGET }, null, prune).next();
    const found = r.done ? undefined : r.value;
    greedy.overtime = false;
    if (!found) throw new ScheduleError(job.id, `cannot be placed within ${LATE_HORIZON / 60} h of its due time on these resources`);
    placements[job.id] = found;
    let bottleneck: Conflict | null = null;
    let most = 0;
    for (const t of tally) {
      if (t.count > most) {
        most = t.count;
        bottleneck = { kind: t.kind, name: t.name, start: t.start, end: t.end };
      }
    }
    late.push({ job: job.id, bottleneck, tooEarly: start + minimumLength(job) > job.due });
  }
  return { placements, late, calendar: greedy, exact: false };
}

/** A mix that cannot be placed at all: the caller turns it into a located message. */
export class ScheduleError extends Error {
  constructor(
    readonly job: number,
    message: string,
  ) {
    super(message);
    this.name = 'ScheduleError';
  }
}

/** The night starts with the first bench shift: no final mix, bench task or bake before it. */
export function nightStart(problem: Problem): number {
  return Math.min(...problem.shifts.map((s) => s.from));
}

function processLength(job: Job): number {
  return job.operations.reduce((n, op) => n + op.minutes, 0) + job.gaps.reduce((n, g, i) => (i === 0 ? n : n + g.min), 0);
}

/** The shortest the mix can take from the start of its mix to out, with the whole bake in one load. */
export function minimumLength(job: Job): number {
  const last = job.operations[job.operations.length - 1];
  return processLength(job) + (last.kind === 'bake' ? 0 : job.tail.min);
}

/**
 * End times known to fail, as open stretches (every end strictly between `above` and `below`),
 * kept sorted and disjoint: a refusal rules out the stretch its booking blocks, and the search
 * jumps over it without a check for each end.
 */
class Stretches {
  private readonly above: number[] = [];
  private readonly below: number[] = [];

  add(above: number, below: number): void {
    if (!(above < below)) return;
    // The first stretch that ends after `above`; merge every one that overlaps the new one.
    let i = 0;
    while (i < this.below.length && this.below[i] <= above) i++;
    let j = i;
    while (j < this.above.length && this.above[j] < below) {
      above = Math.min(above, this.above[j]);
      below = Math.max(below, this.below[j]);
      j++;
    }
    this.above.splice(i, j - i, above);
    this.below.splice(i, j - i, below);
  }

  /** The index of the stretch holding `t`, or -1. */
  private at(t: number): number {
    let lo = 0;
    let hi = this.below.length;
    while (lo < hi) {
      const mid = (lo + hi) >> 1;
      if (this.below[mid] <= t) lo = mid + 1;
      else hi = mid;
    }
    return lo < this.above.length && this.above[lo] < t ? lo : -1;
  }

  has(t: number): boolean {
    return this.at(t) >= 0;
  }

  /** The lower end of the stretch holding `t` (so the next end to try is at or below it), or NaN. */
  floor(t: number): number {
    const i = this.at(t);
    return i < 0 ? NaN : this.above[i];
  }

  /** The upper end of the stretch holding `t`, or NaN. */
  ceil(t: number): number {
    const i = this.at(t);
    return i < 0 ? NaN : this.below[i];
  }

  /** The stretch holding all of [lo, hi], if one does. */
  holding(lo: number, hi: number): { above: number; below: number } | null {
    const i = this.at(lo);
    return i >= 0 && this.below[i] > hi ? { above: this.above[i], below: this.below[i] } : null;
  }
}

/**
 * End times to try for an operation in [lo, hi]: the preferred one, the latest, every grid step, the
 * earliest. Grid steps inside a stretch of `dead` (the caller adds to it as bookings turn
 * candidates away) are jumped over without being tried.
 */
function* candidates(lo: number, hi: number, preferred: number, dead: Stretches): Generator<number> {
  if (lo > hi) return;
  if (preferred >= lo && preferred <= hi) yield preferred;
  if (hi !== preferred) yield hi;
  for (let t = Math.ceil(hi / GRID_MINUTES) * GRID_MINUTES - GRID_MINUTES; t > lo; t -= GRID_MINUTES) {
    const floor = dead.floor(t);
    if (floor === floor) {
      // Jump to the last grid step at or below the refused stretch.
      t = Math.floor(floor / GRID_MINUTES) * GRID_MINUTES + GRID_MINUTES;
      continue;
    }
    if (t !== preferred) yield t;
  }
  if (lo < hi && lo !== preferred) yield lo;
}

/**
 * Counts a refusal against its resource, weighed by the candidate end times in [lo, hi] it turned
 * away (the search jumps over them without a check each).
 */
function note(tally: Tally | null, c: Refusal, lo: number, hi: number): void {
  if (!tally) return;
  const weight = Math.max(1, Math.round((Math.min(c.below, hi) - Math.max(c.above, lo)) / GRID_MINUTES));
  const t = tally.find((x) => x.kind === c.kind && x.name === c.name);
  if (!t) tally.push({ kind: c.kind, name: c.name, start: c.start, end: c.end, count: weight });
  else {
    t.count += weight;
    // Keep the latest busy stretch: the one nearest the due time.
    if (c.end > t.end) {
      t.start = c.start;
      t.end = c.end;
    }
  }
}

/**
 * Every placement of a job whose out time falls in [outLo, outHi], latest first. While a placement
 * is yielded its bookings are in the calendar; resuming or closing (`return()`) the generator takes
 * them out again.
 */
function* placeJob(
  job: Job, cal: Calendar, nightStart: number, outLo: number, outHi: number, budget: Budget, tally: Tally | null, prune: boolean,
): Generator<Placement> {
  const ops = job.operations;
  const k = ops.length - 1;
  const times: { start: number; end: number }[] = ops.map(() => ({ start: 0, end: 0 }));
  const people = new Map<number, number>();
  // The earliest each operation can end: every operation and shortest wait before it after the
  // night's start. An end before that leaves no room for the mix; it is not tried.
  const earliest: number[] = [];
  ops.forEach((op, i) => earliest.push((i === 0 ? nightStart : earliest[i - 1] + job.gaps[i].min) + op.minutes));
  // Subtrees that yielded nothing, by what they depend on: an operation's window (or one end time
  // of it), and the starts of this mix's mixes after it. Nothing else of this mix matters to them:
  // its loads are on the decks, which the operations before the bake do not use, and its later
  // bench tasks start after them (no wait is negative) on people checked only for overlap, so
  // they never refuse an earlier one. A later mix on the same mixer can (it may stand between an
  // earlier mix and another dough's, changing the clean-down the check asks for), hence its start
  // in the key. Trying the same shaping window for a load on another deck or another bench
  // person, or an end time a neighbouring window already tried, then costs nothing.
  const laterMixes = ops.map((_, i) => ops.flatMap((op, j) => (j > i && op.kind === 'mix' && op.minutes > 0 ? [j] : [])));
  interface Failed {
    /** End times whose subtree yielded nothing. */
    ends: Set<number>;
    /** Windows that yielded nothing, by their latest end, then their earliest. */
    windows: Map<number, Set<number>>;
    /**
     * Stretches of end times that fail: refused by the operation's resource, too early for the
     * operations before it, or whose window before lies inside such a stretch of the operation
     * before (so the bound travels up the chain to the loads).
     */
    dead: Stretches;
  }
  const failedFor = (i: number): Failed => {
    const dead = new Stretches();
    dead.add(-Infinity, earliest[i]);
    return { ends: new Set(), windows: new Map(), dead };
  };
  const plain: Failed[] = ops.map((_, i) => failedFor(i));
  const keyed = new Map<string, Failed>();
  const failedOf = (i: number): Failed => {
    // Unpruned, keyed by every later booking of this mix (the bench people too).
    const js = prune ? laterMixes[i] : ops.flatMap((op, j) => (j > i && op.kind !== 'bake' ? [j] : []));
    if (js.length === 0) return plain[i];
    const key = `${i}|${js.map((j) => `${times[j].start}:${people.get(j) ?? ''}`).join('|')}`;
    let f = keyed.get(key);
    if (!f) keyed.set(key, (f = failedFor(i)));
    return f;
  };
  /**
   * The stretch of ends of operation `i` that fail because, for each, the window of the operation
   * before lies inside one stretch that fails there; null when that is not known. `start`: a start
   * of operation `i` (for the loads, the latest load's).
   */
  const deadBefore = (i: number, start: number, minutes: number): { above: number; below: number } | null => {
    // Only where the operation before does not depend on this one's start (a later mix's start keys it).
    if (!prune || i === 0 || laterMixes[i - 1].length > 0) return null;
    const gap = job.gaps[i];
    const h = plain[i - 1].dead.holding(start - gap.max, start - gap.min);
    return h && { above: h.above + gap.max + minutes, below: h.below + gap.min + minutes };
  };

  /** Every placement of operations `i` and before, operation `i` ending in [lo, hi]. */
  function* before(i: number, lo: number, hi: number, preferred: number, loads: Load[], out: number): Generator<Placement> {
    if (i < 0) {
      yield { job: job.id, operations: times.map((t) => ({ start: t.start, end: t.end })), loads: loads.map((l) => ({ ...l })), people: new Map(people), out };
      return;
    }
    const op = ops[i];
    const failed = failedOf(i);
    // The window's preferred end follows from its latest for every operation, so the two ends key it.
    const windows = failed.windows;
    if (windows.get(hi)?.has(lo)) return;
    const ends = failed.ends;
    // Unpruned, a refusal rules out its stretch for this window only.
    const dead = prune ? failed.dead : new Stretches();
    const from = Math.max(lo, earliest[i]);
    let any = false;
    try {
      for (const end of candidates(from, hi, preferred, dead)) {
        if (dead.has(end) || ends.has(end)) continue;
        const before = deadBefore(i, end - op.minutes, op.minutes);
        if (before) {
          dead.add(before.above, before.below);
          continue;
        }
        if (budget.left-- <= 0) return;
        let found = false;
        for (const p of at(i, end, loads, out, dead, from, hi)) {
          found = any = true;
          yield p;
        }
        // Nothing to book: the first candidate is as good as any.
        if (op.minutes === 0) return;
        if (!found && budget.left > 0) ends.add(end);
      }
    } finally {
      // (Closing the generator after a placement was taken is not a failure.)
      if (!any && budget.left > 0) {
        let los = windows.get(hi);
        if (!los) windows.set(hi, (los = new Set()));
        los.add(lo);
      }
    }
  }

  /** Every placement with operation `i` ending at `end`; a refusal adds to `dead` (`lo`, `hi`: the window, for the tally). */
  function* at(i: number, end: number, loads: Load[], out: number, dead: Stretches, lo: number, hi: number): Generator<Placement> {
    const op = ops[i];
    const gap = job.gaps[i];
    const start = end - op.minutes;
    times[i].start = start;
    times[i].end = end;
    const next = (): Generator<Placement> => before(i - 1, start - gap.max, start - gap.min, start - gap.preferred, loads, out);
    if (op.minutes === 0) {
      yield* next();
      return;
    }
    if (op.kind === 'mix') {
      const c = cal.mixerConflict(job.mixer, start, end, job.allergens, prune);
      if (c) {
        note(tally, c, lo, hi);
        dead.add(c.above, c.below);
        return;
      }
      const b: Busy = { start, end, allergens: job.allergens };
      const list = cal.mixers.get(job.mixer)!;
      book(list, b);
      try {
        yield* next();
      } finally {
        unbook(list, b);
      }
    } else if (op.kind === 'bench') {
      const free = cal.freePeople(start, end);
      if (free.length === 0) {
        const r = cal.benchRefusal(start, end, prune);
        note(tally, r, lo, hi);
        dead.add(r.above, r.below);
        return;
      }
      for (const person of free) {
        const b: Busy = { start, end };
        book(person.busy, b);
        people.set(i, person.unit);
        try {
          yield* next();
        } finally {
          people.delete(i);
          unbook(person.busy, b);
        }
      }
    }
  }

  const last = ops[k];
  if (last.kind !== 'bake') {
    // Nothing baked: the chain's end is its out time; place the last operation from there.
    const tail = job.tail.preferred;
    yield* before(k, outLo - tail, outHi - tail, outHi - tail, [], NaN);
    return;
  }

  const bake: Extract<Operation, { kind: 'bake' }> = last;
  const gap = job.gaps[k];
  const spread = gap.max - gap.min;
  // Fresh first: every oven is tried for an out time in the two hours before the due time before
  // any oven is tried earlier, so a mix goes to another oven near its due time rather than hours
  // early on its first choice (bread is sold fresh). Then each oven in turn, latest first.
  for (const [bandLo, bandHi] of outBands(outLo, outHi, earliest[k])) {
    for (const name of bake.ovens) {
      const oven = cal.ovenByName.get(name)!;
      const perLoad = Math.floor(oven.slots / bake.pieceSlots) * bake.pieceSlots;
      if (perLoad === 0) continue;
      const count = Math.ceil(bake.slots / perLoad);
      const loads: Load[] = [];
      // Per deck, the ends the other mixes' bakes refuse. They hold for every load of this mix (its
      // loads are alike: same minutes, same temperature), so a load after the first does not check a
      // deck again where the first found it taken.
      const taken = Array.from({ length: oven.decks }, () => new Stretches());

      // Loads are placed latest first; each later-placed load starts no later than the one before,
      // and all start within the proof's stretch of one another.
      function* load(j: number): Generator<Placement> {
        if (j === count) {
          const first = loads[count - 1].start;
          const lastStart = loads[0].start;
          const out = loads[0].end;
          times[k].start = first;
          times[k].end = out;
          yield* before(k - 1, lastStart - gap.max, first - gap.min, first - gap.preferred, loads, out);
          return;
        }
        const slots = j === count - 1 ? bake.slots - perLoad * (count - 1) : perLoad;
        const [lo, hi, preferred] =
          j === 0
            ? [bandLo, bandHi, bandHi]
            : [loads[0].start - spread + bake.minutes, loads[j - 1].start + bake.minutes, loads[j - 1].start + bake.minutes];
        // Per deck holding a load of this mix, the stretch of ends its last refusal ruled out; where
        // every deck refuses, the stretch they share is jumped over, and so is every end that leaves
        // no room before the first load for the operations before the bake.
        const above: number[] = Array(oven.decks).fill(Infinity);
        const below: number[] = Array(oven.decks).fill(-Infinity);
        const all = new Stretches();
        const from = Math.max(lo, earliest[k]);
        for (const end of candidates(from, hi, preferred, all)) {
          if (all.has(end)) continue;
          const start = end - bake.minutes;
          if (j === 0) {
            const dead = deadBefore(k, start, bake.minutes);
            if (dead) {
              all.add(dead.above, dead.below);
              continue;
            }
            if (prune && count > 1) {
              // Every load ends within the proof's stretch up to this end, at most `rounds` of them on
              // one deck. On decks the other bakes keep taken all that while none fits: with too few
              // decks left for all the loads, this end fails, and so does every end whose stretch
              // stays inside theirs.
              const rounds = 1 + Math.floor(spread / bake.minutes);
              let free = 0;
              let above = -Infinity;
              let below = Infinity;
              for (const t of taken) {
                const h = t.holding(end - spread, end);
                if (!h) free++;
                else {
                  above = Math.max(above, h.above);
                  below = Math.min(below, h.below);
                }
              }
              if (free * rounds < count) {
                all.add(above + spread, below);
                continue;
              }
            }
          }
          const open: number[] = [];
          // The stretch around `end` that every deck refuses.
          let shared = -Infinity;
          let sharedBelow = Infinity;
          for (let d = 0; d < oven.decks; d++) {
            const mine = end > above[d] && end < below[d];
            const other = taken[d].floor(end);
            if (!mine && other !== other) {
              open.push(d + 1);
              continue;
            }
            const a = mine ? (other === other ? Math.min(above[d], other) : above[d]) : other;
            const b = mine ? (other === other ? Math.max(below[d], taken[d].ceil(end)) : below[d]) : taken[d].ceil(end);
            shared = Math.max(shared, a);
            sharedBelow = Math.min(sharedBelow, b);
          }
          if (open.length === 0) {
            all.add(shared, sharedBelow);
            continue;
          }
          for (const deck of deckOrder(cal, oven, start, bake.temperature, open)) {
            if (budget.left-- <= 0) return;
            const c = cal.deckConflict(oven, deck, start, end, bake.temperature, prune);
            if (c) {
              note(tally, c, from, hi);
              if (prune && loads.every((l) => l.deck !== deck)) taken[deck - 1].add(c.above, c.below);
              else {
                above[deck - 1] = c.above;
                below[deck - 1] = c.below;
              }
              continue;
            }
            const b: Busy = { start, end, temperature: bake.temperature };
            const list = cal.deckList(oven.name, deck);
            book(list, b);
            loads.push({ oven: oven.name, deck, start, end, slots, temperature: bake.temperature });
            try {
              yield* load(j + 1);
            } finally {
              loads.pop();
              unbook(list, b);
            }
            // The loads after the first take their first free place: trying every other place of
            // every load multiplies the search by decks × times per load for little gain.
            if (j > 0) return;
          }
        }
      }
      yield* load(0);
    }
  }
}

/** Out times within this many minutes of the latest are tried on every oven before any earlier one. */
const FRESH_MINUTES = 120;

/**
 * [lo, hi] as two bands of out times, latest first: the last two hours (from a grid step), then
 * the rest; one band when the rest is empty (`floor`: the earliest out there can be).
 */
export function* outBands(lo: number, hi: number, floor: number): Generator<[number, number]> {
  const bottom = Math.floor((hi - FRESH_MINUTES) / GRID_MINUTES) * GRID_MINUTES;
  if (bottom <= Math.max(lo, floor)) {
    yield [lo, hi];
    return;
  }
  yield [bottom, hi];
  yield [lo, bottom - GRID_MINUTES];
}

/** Decks to try: one already at this temperature first, then one cooling down to it, then one heating up. */
function deckOrder(cal: Calendar, oven: OvenResource, start: number, temperature: number | null, open: number[]): number[] {
  // Empty decks are all alike: try only the first of them.
  let emptySeen = false;
  const decks: number[] = [];
  for (const d of open) {
    if (cal.deckList(oven.name, d).length === 0) {
      if (emptySeen) continue;
      emptySeen = true;
    }
    decks.push(d);
  }
  if (decks.length === 1 || temperature === null) return decks;
  const rank = (d: number) => {
    const t = cal.deckBefore(oven.name, d, start);
    return t == null ? 1 : t === temperature ? 0 : t > temperature ? 1 : 2;
  };
  // By rank, then deck number (`open` is in deck order): an insertion sort of a handful.
  const ranks = decks.map(rank);
  for (let a = 1; a < decks.length; a++) {
    const d = decks[a];
    const r = ranks[a];
    let b = a - 1;
    while (b >= 0 && ranks[b] > r) {
      decks[b + 1] = decks[b];
      ranks[b + 1] = ranks[b];
      b--;
    }
    decks[b + 1] = d;
    ranks[b + 1] = r;
  }
  return decks;
}
