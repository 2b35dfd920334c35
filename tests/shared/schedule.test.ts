// The night's scheduler (shared/schedule/solve.ts) on random small nights: no resource over its
// capacity, every wait inside its range, and an on-time night found whenever a brute-force search
// over the same 5-minute grid finds one; and the stretch of end times a refused booking rules out
// (the next-event jumps of the search) holds only end times the check refuses too; and the search's
// bounds (whole busy stretches skipped per refusal, ends whose operations before have nowhere to
// go) skip only what would fail: the same night comes out with them and without them.
import fc from 'fast-check';
import { describe, expect, it } from 'vitest';
import { changeMinutes, type Job, type Placement, type Problem } from '#shared/schedule/problem';
import { solve } from '#shared/schedule/solve';
import { book, Calendar } from '#shared/schedule/calendar';

const RUNS = Number(process.env.PANFORM_FUZZ_RUNS ?? 60);
const G = 5;

const arbJob = fc.record({
  mix: fc.constantFrom(5, 10),
  shape: fc.constantFrom(5, 10),
  bake: fc.constantFrom(10, 15, 20),
  temperature: fc.constantFrom(200, 230),
  slots: fc.constantFrom(1, 2),
  bulkMin: fc.constantFrom(0, 5, 10),
  bulkSpread: fc.constantFrom(0, 5, 10),
  proofMin: fc.constantFrom(0, 5, 10),
  proofSpread: fc.constantFrom(0, 5, 10),
  due: fc.integer({ min: 8, max: 20 }).map((n) => n * G),
  egg: fc.boolean(),
});

const arbNight: fc.Arbitrary<Night> = fc.record({
  decks: fc.integer({ min: 1, max: 2 }),
  people: fc.integer({ min: 1, max: 2 }),
  cleanDown: fc.constantFrom(0, 10),
  jobs: fc.array(arbJob, { minLength: 1, maxLength: 3 }),
});

interface GenJob {
  mix: number; shape: number; bake: number; temperature: number; slots: number;
  bulkMin: number; bulkSpread: number; proofMin: number; proofSpread: number; due: number; egg: boolean;
}
interface Night {
  decks: number;
  people: number;
  cleanDown: number;
  jobs: GenJob[];
}

function problemOf(n: Night): Problem {
  return {
    mixers: [{ name: 'spiral', cleanDown: n.cleanDown }],
    ovens: [{ name: 'deck oven', decks: n.decks, slots: 2, heatRate: 5, coolRate: 5, steam: true, fan: false }],
    shifts: [{ from: 0, to: 200, people: n.people }],
    room: 20,
    jobs: n.jobs.map(
      (j, id): Job => ({
        id,
        mixer: 'spiral',
        allergens: j.egg ? ['egg', 'wheat'] : ['wheat'],
        due: j.due,
        operations: [
          { kind: 'mix', minutes: j.mix },
          { kind: 'bench', task: 'shape', minutes: j.shape },
          { kind: 'bake', minutes: j.bake, temperature: j.temperature, slots: j.slots, pieceSlots: 1, ovens: ['deck oven'] },
        ],
        gaps: [
          { min: 0, max: 0, preferred: 0 },
          { min: j.bulkMin, max: j.bulkMin + j.bulkSpread, preferred: j.bulkMin },
          { min: j.proofMin, max: j.proofMin + j.proofSpread, preferred: j.proofMin },
        ],
        tail: { min: 0, max: 0, preferred: 0 },
      }),
    ),
  };
}

interface Slot {
  mix: number;
  shape: number;
  bake: number;
  deck: number;
}

/** Every on-time placement of one job on the grid, ignoring the other jobs. */
function slotsOf(j: GenJob, decks: number): Slot[] {
  const out: Slot[] = [];
  for (let bake = 0; bake + j.bake <= j.due; bake += G) {
    for (let proof = j.proofMin; proof <= j.proofMin + j.proofSpread; proof += G) {
      const shape = bake - proof - j.shape;
      for (let bulk = j.bulkMin; bulk <= j.bulkMin + j.bulkSpread; bulk += G) {
        const mix = shape - bulk - j.mix;
        if (mix < 0) continue;
        for (let deck = 1; deck <= decks; deck++) out.push({ mix, shape, bake, deck });
      }
    }
  }
  return out;
}

/** Brute force: is there any on-time night on the grid? */
function bruteForce(n: Night): boolean {
  const p = problemOf(n);
  const oven = p.ovens[0];
  const options = n.jobs.map((j) => slotsOf(j, n.decks));
  const chosen: Slot[] = [];
  const ok = (): boolean => {
    const k = chosen.length;
    // Mixer: one at a time, a clean-down after an egg dough before one without.
    const mixes = chosen.map((s, i) => ({ from: s.mix, to: s.mix + n.jobs[i].mix, egg: n.jobs[i].egg })).sort((a, b) => a.from - b.from);
    for (let i = 1; i < k; i++) if (mixes[i].from < mixes[i - 1].to + (mixes[i - 1].egg && !mixes[i].egg ? n.cleanDown : 0)) return false;
    // Bench: at most `people` tasks at once.
    const bench = chosen.map((s, i) => [s.shape, s.shape + n.jobs[i].shape]);
    for (const [a] of bench) if (bench.filter(([s, e]) => s <= a && a < e).length > n.people) return false;
    // Decks: one load at a time, with the time to change temperature between.
    for (let d = 1; d <= n.decks; d++) {
      const loads = chosen
        .map((s, i) => ({ s, i }))
        .filter((x) => x.s.deck === d)
        .map((x) => ({ from: x.s.bake, to: x.s.bake + n.jobs[x.i].bake, t: n.jobs[x.i].temperature }))
        .sort((a, b) => a.from - b.from);
      for (let i = 1; i < loads.length; i++) if (loads[i].from < loads[i - 1].to + changeMinutes(oven, loads[i - 1].t, loads[i].t)) return false;
    }
    return true;
  };
  const search = (i: number): boolean => {
    if (i === options.length) return true;
    for (const s of options[i]) {
      chosen.push(s);
      if (ok() && search(i + 1)) return true;
      chosen.pop();
    }
    return false;
  };
  return search(0);
}

/** The rules every schedule keeps, late or not. */
function expectValid(p: Problem, placements: Placement[]): void {
  const oven = p.ovens[0];
  const mixes: { from: number; to: number; allergens: readonly string[] }[] = [];
  const bench: { from: number; to: number; unit: number }[] = [];
  const loads: { from: number; to: number; deck: number; t: number | null; slots: number }[] = [];
  for (const pl of placements) {
    const job = p.jobs[pl.job];
    const [mix, shape] = pl.operations;
    expect(mix.end - mix.start).toBe(job.operations[0].minutes);
    expect(shape.end - shape.start).toBe(job.operations[1].minutes);
    expect(shape.start - mix.end).toBeGreaterThanOrEqual(job.gaps[1].min);
    expect(shape.start - mix.end).toBeLessThanOrEqual(job.gaps[1].max);
    expect(mix.start).toBeGreaterThanOrEqual(0);
    mixes.push({ from: mix.start, to: mix.end, allergens: job.allergens });
    bench.push({ from: shape.start, to: shape.end, unit: pl.people.get(1)! });
    const bake = job.operations[2];
    if (bake.kind !== 'bake') throw new Error('bake expected');
    expect(pl.loads.reduce((n, l) => n + l.slots, 0)).toBe(bake.slots);
    for (const l of pl.loads) {
      expect(l.start - shape.end).toBeGreaterThanOrEqual(job.gaps[2].min);
      expect(l.start - shape.end).toBeLessThanOrEqual(job.gaps[2].max);
      expect(l.slots).toBeLessThanOrEqual(oven.slots);
      loads.push({ from: l.start, to: l.end, deck: l.deck, t: l.temperature, slots: l.slots });
    }
    expect(pl.out).toBe(Math.max(...pl.loads.map((l) => l.end)));
  }
  mixes.sort((a, b) => a.from - b.from);
  for (let i = 1; i < mixes.length; i++) {
    const clean = mixes[i - 1].allergens.some((a) => !mixes[i].allergens.includes(a)) ? p.mixers[0].cleanDown : 0;
    expect(mixes[i].from).toBeGreaterThanOrEqual(mixes[i - 1].to + clean);
  }
  for (const a of bench) for (const b of bench) if (a !== b && a.unit === b.unit) expect(a.from < b.to && b.from < a.to).toBe(false);
  for (const a of bench) expect(a.unit).toBeLessThanOrEqual(p.shifts[0].people);
  for (let d = 1; d <= oven.decks; d++) {
    const on = loads.filter((l) => l.deck === d).sort((a, b) => a.from - b.from);
    for (let i = 1; i < on.length; i++) expect(on[i].from).toBeGreaterThanOrEqual(on[i - 1].to + changeMinutes(oven, on[i - 1].t, on[i].t));
  }
}

describe('solve on random small nights', () => {
  it('never puts a resource over its capacity and keeps every wait in its range', () => {
    fc.assert(
      fc.property(arbNight, (n) => {
        const p = problemOf(n);
        const s = solve(p);
        expectValid(p, s.placements);
        for (const pl of s.placements) {
          const late = s.late.some((l) => l.job === pl.job);
          if (!late) expect(pl.out).toBeLessThanOrEqual(p.jobs[pl.job].due);
        }
      }),
      { numRuns: RUNS },
    );
  });

  it('finds an on-time night whenever a brute-force search finds one', () => {
    fc.assert(
      fc.property(arbNight, (n) => {
        const s = solve(problemOf(n));
        if (bruteForce(n)) expect(s.late, 'brute force found an on-time night').toEqual([]);
        else expect(s.late.length).toBeGreaterThan(0);
      }),
      { numRuns: RUNS },
    );
  });
});

describe('the search bounds skip only what would fail', () => {
  const same = (p: Problem) => {
    const pruned = solve(p);
    const plain = solve(p, { prune: false });
    // Unbounded, the backtracking search can spend its budget of checks before it finds the
    // on-time night the bounded one found (it then settles for the greedy pass): nothing to compare.
    if (pruned.exact && !plain.exact) return;
    expect(pruned.exact).toBe(plain.exact);
    expect(pruned.placements).toEqual(plain.placements);
    expect(pruned.late.map((l) => [l.job, l.tooEarly])).toEqual(plain.late.map((l) => [l.job, l.tooEarly]));
  };
  // Up to 4 slots on decks of 2: a bake of two loads, which must go in within its proof's stretch.
  const arbLoads = (min: number, max: number) =>
    fc.record({
      decks: fc.integer({ min: 2, max: 3 }),
      people: fc.integer({ min: 1, max: 3 }),
      cleanDown: fc.constantFrom(0, 10),
      jobs: fc.array(fc.tuple(arbJob, fc.integer({ min: 1, max: 4 })).map(([j, slots]) => ({ ...j, slots })), { minLength: min, maxLength: max }),
    });
  it('on small nights (the backtracking search)', () => {
    fc.assert(fc.property(arbNight, (n) => same(problemOf(n))), { numRuns: RUNS });
    fc.assert(fc.property(arbLoads(1, 3), (n) => same(problemOf(n))), { numRuns: RUNS });
  });
  it('on nights of 13 to 16 mixes (the greedy pass)', () => {
    fc.assert(fc.property(arbLoads(13, 16), (n) => same(problemOf(n))), { numRuns: Math.ceil(RUNS / 2) });
  });
  it('where a dough is mixed twice (a second mix after shaping, on the same mixer)', () => {
    // The later mix can stand between an earlier one and another dough's, changing the clean-down:
    // what failed before it is remembered with its start.
    const twice = (p: Problem): Problem => ({
      ...p,
      jobs: p.jobs.map((j) => ({
        ...j,
        operations: [j.operations[0], j.operations[1], { kind: 'mix', minutes: 5 }, j.operations[2]],
        gaps: [j.gaps[0], j.gaps[1], { min: 0, max: 10, preferred: 5 }, j.gaps[2]],
      })),
    });
    fc.assert(fc.property(arbLoads(1, 3), (n) => same(twice(problemOf(n)))), { numRuns: RUNS });
    fc.assert(fc.property(arbLoads(13, 15), (n) => same(twice(problemOf(n)))), { numRuns: Math.ceil(RUNS / 3) });
  });
});

describe('a refusal rules out only end times the check refuses too', () => {
  // The search jumps over the stretch a refusal gives (next-event search); this holds it to the
  // check itself: every end inside the stretch is refused by the same check.
  const arbBooking = fc.record({ start: fc.integer({ min: 0, max: 40 }).map((n) => n * 5), minutes: fc.constantFrom(5, 10, 15, 20), egg: fc.boolean(), hot: fc.boolean() });
  it('on a mixer (with clean-downs), an oven deck (with temperature changes) and the bench', () => {
    fc.assert(
      fc.property(fc.array(arbBooking, { maxLength: 8 }), fc.integer({ min: 0, max: 440 }), fc.constantFrom(5, 7.5, 10, 25), fc.boolean(), (raw, end, minutes, egg) => {
        const problem: Problem = {
          mixers: [{ name: 'spiral', cleanDown: 10 }],
          ovens: [{ name: 'deck oven', decks: 1, slots: 2, heatRate: 5, coolRate: 2, steam: true, fan: false }],
          shifts: [{ from: 20, to: 400, people: 1 }],
          room: 20,
          jobs: [],
        };
        const cal = new Calendar(problem);
        const oven = problem.ovens[0];
        const allergens = (e: boolean) => (e ? ['egg', 'wheat'] : ['wheat']);
        const temperature = (h: boolean) => (h ? 230 : 190);
        for (const b of raw) {
          const s = b.start;
          const e = b.start + b.minutes;
          if (!cal.mixerConflict('spiral', s, e, allergens(b.egg))) book(cal.mixers.get('spiral')!, { start: s, end: e, allergens: allergens(b.egg) });
          if (!cal.deckConflict(oven, 1, s, e, temperature(b.hot))) book(cal.deckList(oven.name, 1), { start: s, end: e, temperature: temperature(b.hot) });
          if (cal.freePeople(s, e).length > 0) book(cal.people[0].busy, { start: s, end: e });
        }
        const inside = (r: { above: number; below: number }) => {
          const out: number[] = [];
          for (let t = Math.max(r.above, end - 200) + 0.5; t < Math.min(r.below, end + 200); t += 0.5) out.push(t);
          return out;
        };
        // Narrow (the booking in the way) and wide (every end down to the latest that fits, which
        // does fit).
        for (const wide of [false, true]) {
          const mixer = cal.mixerConflict('spiral', end - minutes, end, allergens(egg), wide);
          if (mixer) for (const t of inside(mixer)) expect(cal.mixerConflict('spiral', t - minutes, t, allergens(egg)), `mixer end ${t}`).not.toBeNull();
          if (mixer && wide && mixer.above > -Infinity) expect(cal.mixerConflict('spiral', mixer.above - minutes, mixer.above, allergens(egg))).toBeNull();
          const deck = cal.deckConflict(oven, 1, end - minutes, end, temperature(egg), wide);
          if (deck) for (const t of inside(deck)) expect(cal.deckConflict(oven, 1, t - minutes, t, temperature(egg)), `deck end ${t}`).not.toBeNull();
          if (deck && wide && deck.above > -Infinity) expect(cal.deckConflict(oven, 1, deck.above - minutes, deck.above, temperature(egg))).toBeNull();
          if (cal.freePeople(end - minutes, end).length === 0) {
            const bench = cal.benchRefusal(end - minutes, end, wide);
            for (const t of inside(bench)) expect(cal.freePeople(t - minutes, t), `bench end ${t}`).toEqual([]);
            if (wide && bench.above > -Infinity) expect(cal.freePeople(bench.above - minutes, bench.above).length).toBeGreaterThan(0);
          }
        }
      }),
      { numRuns: RUNS * 4 },
    );
  });
});

describe('fresh first', () => {
  // Two one-deck ovens; the first (the mix's first choice) is taken for the three hours before the
  // due time. The mix goes to the second oven and is out at its due time, not baked early on the first.
  const job = (id: number, due: number, ovens: string[], bake: number): Job => ({
    id,
    mixer: 'spiral',
    allergens: ['wheat'],
    due,
    operations: [
      { kind: 'mix', minutes: 10 },
      { kind: 'bench', task: 'shape', minutes: 10 },
      { kind: 'bake', minutes: bake, temperature: 230, slots: 1, pieceSlots: 1, ovens },
    ],
    gaps: [
      { min: 0, max: 0, preferred: 0 },
      { min: 30, max: 30, preferred: 30 },
      { min: 30, max: 60, preferred: 30 },
    ],
    tail: { min: 0, max: 0, preferred: 0 },
  });
  const problem: Problem = {
    mixers: [{ name: 'spiral', cleanDown: 0 }],
    ovens: [
      { name: 'deck oven', decks: 1, slots: 1, heatRate: 5, coolRate: 5, steam: true, fan: false },
      { name: 'rack oven', decks: 1, slots: 1, heatRate: 5, coolRate: 5, steam: true, fan: false },
    ],
    shifts: [{ from: 0, to: 1440, people: 2 }],
    room: 20,
    // Job 0 (placed first: the longer process) holds the deck oven from 05:00 to 08:00; job 1, a
    // 20-minute bake due at 08:00 too, names the deck oven first: there it could be out by 05:00.
    jobs: [job(0, 480, ['deck oven'], 180), job(1, 480, ['deck oven', 'rack oven'], 20)],
  };

  it('tries every oven near the due time before baking early on the first', () => {
    const { placements, late } = solve(problem);
    expect(late).toEqual([]);
    expect(placements[1].loads.map((l) => l.oven)).toEqual(['rack oven']);
    expect(placements[1].out).toBe(480);
    expect(placements[0].loads.map((l) => [l.oven, l.start, l.end])).toEqual([['deck oven', 300, 480]]);
  });
});
