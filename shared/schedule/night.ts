// The plan's mixes as a scheduling problem (defaults filled in and said), solved, and turned back
// into the sheet's timeline, bookings and orders. Pure; no I/O.
import type { Formula, Mixer, Oven, Plan, Shift, Step } from '../model.ts';
import { pickFromRange, type NumberRange } from '../units.ts';
import { clockMinutes, localDateTime, minuteOf, shortTime } from '../sheet/time.ts';
import { SheetError, type Booking, type LocalDateTime, type OrderOutcome, type TimelineEntry } from '../sheet/types.ts';
import { compareCodeUnits, compareText } from '../text.ts';
import { book, type Calendar, type Busy } from './calendar.ts';
import {
  BUILD_MIX_MINUTES, DEFAULT_BENCH, DEFAULT_CLEAN_DOWN_MINUTES, DEFAULT_COOL_RATE, DEFAULT_HEAT_RATE, DEFAULT_OVEN,
  DEFAULT_SECONDS_PER_PIECE, SLOT_DOUGH_GRAMS,
} from './defaults.ts';
import { changeMinutes, type BenchTask, type Job, type Operation, type OvenResource, type Placement, type Problem } from './problem.ts';
import { GRID_MINUTES, minimumLength, nightStart, ScheduleError, solve, type LateJob } from './solve.ts';

/** One mix of the plan, as build.ts splits the orders. */
export interface NightMix {
  order: number;
  formula: Formula;
  mixer: Mixer;
  mixNumber: number;
  of: number;
  pieces: number;
  pieceGrams: number;
  /** As on the timeline: "<title> <n>/<of>". */
  label: string;
  allergens: readonly string[];
}

export interface ScheduledMix {
  mixStart: number;
  mixEnd: number;
  entries: TimelineEntry[];
}

export interface Night {
  ovens: Oven[];
  bench: Shift[];
  mixes: ScheduledMix[];
  orders: OrderOutcome[];
  /** Late orders first (with their reasons), then assumptions and cautions about the schedule. */
  warnings: string[];
  /** Bookings of the mixes; builds, clean-downs and deck changes are added by `finishBookings`. */
  bookings: Booking[];
  calendar: Calendar;
  problem: Problem;
  /** Minute the night starts (first bench shift). */
  start: number;
}

/** A cool this long is a rest before slicing or selling (common practice: rye breads rest 12–24 h), not just a cool on the rack. */
const LONG_COOL_MINUTES = 120;

const BENCH_TASKS = new Set<Step['step']>(['divide', 'preshape', 'shape']);

interface Chain {
  job: Job;
  /** Per process step: the operation it is, or null for a wait. Steps inside the oven block point at the bake. */
  opOf: (number | null)[];
  steps: Step[];
  /** Rounded picked minutes per step. */
  picks: number[];
  firstBake: number;
  lastBake: number;
}

export function scheduleNight(plan: Plan, mixes: NightMix[]): Night {
  const date = plan.date;
  const at = (m: number) => localDateTime(date, m);
  const warnings: string[] = [];
  const assumed: string[] = [];

  // ---- resources, defaults said ---------------------------------------------------------------
  let ovens: Oven[];
  if (plan.ovens) ovens = plan.ovens;
  else {
    ovens = [DEFAULT_OVEN.value];
    assumed.push(`the plan lists no ovens: assumed ${DEFAULT_OVEN.value.name}, ${DEFAULT_OVEN.source}; list them under ovens:`);
  }
  const noHeat = ovens.filter((o) => o.heatRate === undefined).map((o) => o.name);
  const noCool = ovens.filter((o) => o.coolRate === undefined).map((o) => o.name);
  if (noHeat.length) assumed.push(`heat ${DEFAULT_HEAT_RATE.value} °C/min for ${noHeat.join(', ')} (default; ${DEFAULT_HEAT_RATE.source})`);
  if (noCool.length) assumed.push(`cool ${DEFAULT_COOL_RATE.value} °C/min for ${noCool.join(', ')} (default; ${DEFAULT_COOL_RATE.source})`);
  const ovenResources: OvenResource[] = ovens.map((o) => ({
    name: o.name, decks: o.decks, slots: o.slots, steam: o.steam, fan: o.fan,
    heatRate: o.heatRate ?? DEFAULT_HEAT_RATE.value, coolRate: o.coolRate ?? DEFAULT_COOL_RATE.value,
  }));
  const dueOf = (i: number) => clockMinutes(plan.orders[i].due ?? plan.readyBy);
  let bench: Shift[];
  if (plan.bench) bench = plan.bench;
  else {
    const first = Math.min(...plan.orders.map((_, i) => dueOf(i)));
    const last = Math.max(...plan.orders.map((_, i) => dueOf(i)));
    const from = at(first - DEFAULT_BENCH.hoursBeforeFirstDue * 60);
    bench = [{ date: from.slice(0, 10), from: from.slice(11), to: at(last).slice(11), people: DEFAULT_BENCH.people }];
    assumed.push(
      `the plan lists no bench shifts: assumed ${DEFAULT_BENCH.people} people from ${shortTime(from, date)} to ${shortTime(at(last), date)} (${DEFAULT_BENCH.source}); list them under bench:`,
    );
  }
  const shifts = bench.map((b) => {
    const from = minuteOf(`${b.date}T${b.from}`, date);
    let to = minuteOf(`${b.date}T${b.to}`, date);
    if (to <= from) to += 1440;
    return { from, to, people: b.people };
  });
  const mixerCleanDefault = plan.mixers.filter((m) => m.cleanDownMinutes === undefined).map((m) => m.name);
  const problem: Problem = {
    mixers: plan.mixers.map((m) => ({ name: m.name, cleanDown: m.cleanDownMinutes ?? DEFAULT_CLEAN_DOWN_MINUTES.value })),
    ovens: ovenResources,
    shifts,
    room: plan.conditions.room,
    jobs: [],
  };
  const start = nightStart(problem);

  // ---- jobs -------------------------------------------------------------------------------------
  const chains = mixes.map((m, id) => chainOf(m, id, plan, ovenResources, dueOf(m.order), warnings));
  problem.jobs = chains.map((c) => c.job);
  const defaultsUsed = { perSlot: new Set<string>(), seconds: new Set<string>() };
  for (const m of mixes) {
    for (const s of m.formula.process) {
      if (s.step === 'bake' && s.perSlot === undefined) defaultsUsed.perSlot.add(m.formula.id);
      if (BENCH_TASKS.has(s.step) && s.secondsPerPiece === undefined) defaultsUsed.seconds.add(m.formula.id);
    }
  }
  if (defaultsUsed.perSlot.size) {
    assumed.push(`pieces per oven slot for ${[...defaultsUsed.perSlot].join(', ')}: ${SLOT_DOUGH_GRAMS.value / 1000} kg of dough per slot (default; ${SLOT_DOUGH_GRAMS.source}); give the bake step per_slot`);
  }
  if (defaultsUsed.seconds.size) {
    const d = DEFAULT_SECONDS_PER_PIECE;
    assumed.push(
      `bench seconds per piece for ${[...defaultsUsed.seconds].join(', ')}: divide ${d.divide.value} s, preshape ${d.preshape.value} s, shape ${d.shape.value} s (defaults; ${d.shape.source.replace(/:.*/, '')}); give the step seconds_per_piece`,
    );
  }
  for (const [i, o] of plan.orders.entries()) {
    if (dueOf(i) <= start) {
      throw new SheetError(
        `order ${i + 1} (${o.formula}) is due at ${o.due ?? plan.readyBy}, before the bench's first shift starts (${shortTime(at(start), date)}), so nothing can be made by then; give a later due time or an earlier shift`,
      );
    }
  }

  // ---- solve ----------------------------------------------------------------------------------------
  let solution;
  try {
    solution = solve(problem);
  } catch (e) {
    if (e instanceof ScheduleError) {
      const m = mixes[e.job];
      throw new SheetError(`order ${m.order + 1} (${m.formula.id}) mix ${m.mixNumber}/${m.of} ${e.message}; check its bench steps against the shifts and its bake against the ovens`);
    }
    throw e;
  }

  // ---- back to the sheet -------------------------------------------------------------------------
  const bookings: Booking[] = [];
  const scheduled = mixes.map((m, id) => timelineOf(m, chains[id], solution.placements[id], at, bookings));

  const orders: OrderOutcome[] = plan.orders.map((o, i) => {
    const outs = solution.placements.filter((p) => mixes[p.job].order === i).map((p) => p.out);
    const out = Math.max(...outs);
    const due = dueOf(i);
    return { formula: o.formula, pieces: o.pieces, due: at(due), out: at(out), late: Math.max(0, Math.round(out - due)) };
  });
  const lateWarnings = lateReasons(solution.late, mixes, chains, orders, plan, at, start);
  // A long cool (a rye rested before slicing) must be over by the due time for the product to be sold.
  for (const [i, o] of plan.orders.entries()) {
    const c = chains.find((x) => mixes[x.job.id].order === i)!;
    const coolMin = c.steps.slice(c.lastBake + 1).filter((s) => s.step === 'cool' && s.minutes).reduce((n, s) => n + s.minutes!.min, 0);
    const out = minuteOf(orders[i].out, date);
    if (c.lastBake >= 0 && coolMin >= LONG_COOL_MINUTES && out + coolMin > dueOf(i)) {
      warnings.push(
        `order ${i + 1} (${o.formula}) must cool at least ${hours(coolMin)} after the bake: out at ${shortTime(orders[i].out, date)}, it is ready at ${shortTime(at(out + coolMin), date)} at the earliest, after its due time (${o.due ?? plan.readyBy}); bake it the day before or order it for a later day`,
      );
    }
  }
  if (mixerCleanDefault.length) {
    assumed.push(`clean-down ${DEFAULT_CLEAN_DOWN_MINUTES.value} min for ${mixerCleanDefault.join(', ')} (default; ${DEFAULT_CLEAN_DOWN_MINUTES.source}) when a dough without an allergen follows one with it; give the mixer clean_down`);
  }
  return {
    ovens: ovens.map((o, i) => ({ ...o, heatRate: ovenResources[i].heatRate, coolRate: ovenResources[i].coolRate })),
    bench,
    mixes: scheduled,
    orders,
    warnings: [...lateWarnings, ...warnings, ...assumed],
    bookings,
    calendar: solution.calendar,
    problem,
    start,
  };
}

const hours = (minutes: number) => (minutes % 60 === 0 ? `${minutes / 60} h` : minutes < 120 ? `${Math.round(minutes)} min` : `${(minutes / 60).toFixed(1)} h`);

function rounded(r: NumberRange | undefined, pick: Plan['ranges']): number {
  if (!r) return 0;
  const p = Math.round(pickFromRange(r, pick));
  return Math.min(Math.max(p, r.min), r.max);
}

function chainOf(m: NightMix, id: number, plan: Plan, ovens: OvenResource[], due: number, warnings: string[]): Chain {
  const f = m.formula;
  let steps = f.process;
  if (!steps.some((s) => s.step === 'mix')) {
    if (m.mixNumber === 1 && m.order === plan.orders.findIndex((o) => o.formula === f.id)) {
      warnings.push(`${f.id} has no mix step in its process; its mixes are placed at the start of the process and take no mixer time`);
    }
    steps = [{ step: 'mix', minutes: { min: 0, max: 0 } }, ...steps];
  }
  const picks = steps.map((s) => rounded(s.minutes, plan.ranges));
  const firstBake = steps.findIndex((s) => s.step === 'bake');
  const lastBake = steps.findLastIndex((s) => s.step === 'bake');
  const operations: Operation[] = [];
  const gaps: Job['gaps'] = [{ min: 0, max: 0, preferred: 0 }];
  const opOf: (number | null)[] = [];
  let wait = { min: 0, max: 0, preferred: 0 };
  const push = (op: Operation) => {
    if (operations.length > 0) gaps.push(wait);
    wait = { min: 0, max: 0, preferred: 0 };
    operations.push(op);
  };
  steps.forEach((s, i) => {
    if (firstBake >= 0 && i > firstBake && i <= lastBake) {
      opOf.push(operations.length - 1);
      return;
    }
    if (s.step === 'mix') push({ kind: 'mix', minutes: Math.ceil(picks[i]) });
    else if (BENCH_TASKS.has(s.step)) {
      const task = s.step as BenchTask;
      const seconds = s.secondsPerPiece ?? DEFAULT_SECONDS_PER_PIECE[task].value;
      push({ kind: 'bench', task, minutes: Math.ceil((m.pieces * seconds) / 60) });
    } else if (i === firstBake) {
      const proof = operations.length > 0 ? wait.max - wait.min : 0;
      push(bakeOperation(m, steps.slice(firstBake, lastBake + 1), picks.slice(firstBake, lastBake + 1), plan, ovens, proof));
    } else {
      opOf.push(null);
      if (operations.length > 0) {
        wait.min += s.minutes?.min ?? 0;
        wait.max += s.minutes?.max ?? 0;
        wait.preferred += picks[i];
      }
      return;
    }
    opOf.push(operations.length - 1);
  });
  return {
    job: { id, mixer: m.mixer.name, allergens: m.allergens, due, operations, gaps, tail: wait },
    opOf, steps, picks, firstBake, lastBake,
  };
}

function bakeOperation(m: NightMix, block: Step[], picks: number[], plan: Plan, ovens: OvenResource[], stretch: number): Operation {
  const bake = block[0];
  const perSlot = bake.perSlot ?? Math.max(1, Math.floor(SLOT_DOUGH_GRAMS.value / m.pieceGrams));
  const pieceSlots = perSlot >= 1 ? 1 : Math.ceil(1 / perSlot - 1e-9);
  const slots = perSlot >= 1 ? Math.ceil(m.pieces / perSlot - 1e-9) : m.pieces * pieceSlots;
  const o = plan.orders[m.order];
  const where = `order ${m.order + 1} (${m.formula.id})`;
  let eligible: OvenResource[];
  if (o.oven !== undefined) {
    const named = ovens.find((x) => x.name === o.oven);
    if (!named) throw new SheetError(`${where} names oven "${o.oven}", which the plan does not list; ovens: ${ovens.map((x) => x.name).join(', ')}`);
    eligible = [named];
  } else {
    const onSole = bake.vessel === 'deck' || bake.vessel === 'stone';
    const steam = block.some((s) => s.steam);
    eligible = ovens.filter((x) => (!onSole || !x.fan) && (!steam || x.steam));
    if (eligible.length === 0) eligible = ovens;
  }
  const fits = eligible.filter((x) => x.slots >= pieceSlots);
  if (fits.length === 0) {
    throw new SheetError(
      `${where}: one piece takes ${pieceSlots} oven slots (per_slot ${perSlot}), more than a deck of ${eligible.map((x) => `${x.name} (${x.slots})`).join(', ')} holds`,
    );
  }
  // The loads of one mix all go in while its proof can stretch: one round per deck, plus one more
  // each time a bake fits in the stretch.
  const minutes = Math.ceil(picks.reduce((a, b) => a + b, 0));
  const rounds = 1 + (minutes > 0 ? Math.floor(stretch / minutes) : 0);
  const holds = (x: OvenResource) => x.decks * rounds * Math.floor(x.slots / pieceSlots) * pieceSlots;
  if (!fits.some((x) => holds(x) >= slots)) {
    const best = fits.reduce((a, b) => (holds(b) > holds(a) ? b : a));
    throw new SheetError(
      `${where}: mix ${m.mixNumber}/${m.of} fills ${slots} oven slots (${m.pieces} pieces, ${perSlot} per slot), but the wait before its bake can stretch only ${stretch} min, so at most ${holds(best)} slots can go in (${best.name}: ${best.decks} × ${best.slots}); give the proof a range (e.g. 45-60), split the order into smaller mixes, set per_slot, or list a bigger oven`,
    );
  }
  return {
    kind: 'bake',
    minutes,
    temperature: bake.temperature ?? null,
    slots,
    pieceSlots,
    ovens: fits.map((x) => x.name),
  };
}

/** Spreads an actual wait over its steps: each starts at its pick, the nearest to the next operation stretches or shrinks first. */
function spread(steps: Step[], picks: number[], total: number): number[] {
  const d = [...picks];
  let diff = total - d.reduce((a, b) => a + b, 0);
  for (let i = d.length - 1; i >= 0 && diff !== 0; i--) {
    const r = steps[i].minutes ?? { min: 0, max: 0 };
    const room = diff > 0 ? r.max - d[i] : d[i] - r.min;
    const by = Math.min(Math.abs(diff), Math.max(0, room));
    d[i] += diff > 0 ? by : -by;
    diff += diff > 0 ? -by : by;
  }
  // Whatever cannot be spread within the ranges stays on the last step (never happens on a valid placement).
  if (diff !== 0 && d.length > 0) d[d.length - 1] += diff;
  return d;
}

function timelineOf(
  m: NightMix, c: Chain, p: Placement, at: (m: number) => LocalDateTime, bookings: Booking[],
): ScheduledMix {
  const entries: TimelineEntry[] = [];
  const f = m.formula;
  const entry = (i: number, from: number, to: number, extra: Partial<TimelineEntry> = {}) => {
    const step = c.steps[i];
    const e: TimelineEntry = {
      formula: f.id, label: m.label, step: step.step, order: m.order, mixNumber: m.mixNumber,
      start: at(from), end: at(to), startMinute: from, endMinute: to, minutes: to - from,
    };
    if (step.temperature !== undefined) e.temperature = step.temperature;
    if (step.step === 'retard') e.cold = true;
    if (step.steam || (step.step === 'bake' && /steam/i.test(step.note ?? ''))) e.steam = true;
    if (step.vessel) e.vessel = step.vessel;
    if (step.covered !== undefined) e.covered = step.covered;
    if (step.note) e.note = step.note;
    if (step.folds) e.folds = Array.from({ length: step.folds.count }, (_, k) => at(from + step.folds!.every * (k + 1)));
    entries.push(Object.assign(e, extra));
  };
  const ops = c.job.operations;
  // Steps before the first operation, backward from it.
  const firstOp = c.opOf.findIndex((x) => x !== null);
  let t = p.operations[0].start;
  for (let i = firstOp - 1; i >= 0; i--) {
    entry(i, t - c.picks[i], t);
    t -= c.picks[i];
  }
  let waits: number[] = [];
  for (let i = firstOp; i < c.steps.length; i++) {
    const op = c.opOf[i];
    if (op === null) {
      waits.push(i);
      continue;
    }
    if (c.firstBake >= 0 && i > c.firstBake && i <= c.lastBake) continue;
    if (waits.length) {
      const from = p.operations[op - 1].end;
      const d = spread(waits.map((w) => c.steps[w]), waits.map((w) => c.picks[w]), p.operations[op].start - from);
      let u = from;
      waits.forEach((w, k) => {
        entry(w, u, u + d[k]);
        u += d[k];
      });
      waits = [];
    }
    const o = ops[op];
    const time = p.operations[op];
    if (o.kind === 'mix') {
      entry(i, time.start, time.end, o.minutes > 0 ? { resource: `mixer:${m.mixer.name}` } : {});
      if (o.minutes > 0) bookings.push(booking({ kind: 'mixer', name: m.mixer.name, unit: null }, 'mix', m, time.start, time.end, at));
    } else if (o.kind === 'bench') {
      const unit = p.people.get(op);
      entry(i, time.start, time.end, unit !== undefined ? { resource: 'bench', unit } : {});
      if (unit !== undefined) bookings.push(booking({ kind: 'bench', name: 'bench', unit }, o.task, m, time.start, time.end, at));
    } else {
      const loads = [...p.loads].sort((a, b) => a.start - b.start || compareText(a.oven, b.oven) || a.deck - b.deck);
      loads.forEach((l, k) => {
        const note = [loads.length > 1 ? `load ${k + 1} of ${loads.length}` : '', c.steps[i].note ?? ''].filter(Boolean).join('; ');
        entry(i, l.start, l.end, { resource: `oven:${l.oven}`, unit: l.deck, slots: l.slots, ...(note ? { note } : {}) });
        bookings.push({
          ...booking({ kind: 'oven', name: l.oven, unit: l.deck }, 'bake', m, l.start, l.end, at),
          slots: l.slots,
          temperature: l.temperature,
        });
      });
    }
  }
  // Steps after the last operation, forward from it.
  let u = c.firstBake >= 0 ? p.out : p.operations[ops.length - 1].end;
  for (const w of waits) {
    entry(w, u, u + c.picks[w]);
    u += c.picks[w];
  }
  const mixOp = p.operations[0];
  return { mixStart: mixOp.start, mixEnd: mixOp.end, entries };
}

function booking(
  resource: Booking['resource'], task: string, m: NightMix | null, start: number, end: number, at: (m: number) => LocalDateTime,
): Booking {
  return {
    resource, task, formula: m?.formula.id ?? null, mix: m?.label ?? null, start: at(start), end: at(end), slots: null, temperature: null,
  };
}

function lateReasons(
  late: LateJob[], mixes: NightMix[], chains: Chain[], orders: OrderOutcome[], plan: Plan, at: (m: number) => LocalDateTime, start: number,
): string[] {
  const out: string[] = [];
  const seen = new Set<number>();
  const when = (m: number) => shortTime(at(m), plan.date);
  for (const l of late) {
    const m = mixes[l.job];
    if (seen.has(m.order)) continue;
    seen.add(m.order);
    const o = orders[m.order];
    if (o.late === 0) continue;
    const order = plan.orders[m.order];
    const ways: string[] = [];
    let why: string;
    if (l.tooEarly) {
      const need = minimumLength(chains[l.job].job);
      why = `from mix to out it takes at least ${hours(need)}, and the night starts at ${when(start)}`;
      ways.push(`start earlier: a bench shift from ${when(chains[l.job].job.due - need)}`);
      if (m.formula.preferments.length > 0) ways.push('start its builds earlier to match');
    } else if (l.bottleneck) {
      const b = l.bottleneck;
      const busy = `${when(b.start)}–${when(b.end)}`;
      if (b.kind === 'oven') {
        why = `oven "${b.name}" is full around ${busy}`;
        ways.push('another deck or another oven', 'move another bake off that oven');
      } else if (b.kind === 'bench') {
        why = `the bench is fully taken around ${busy}`;
        ways.push(`another person on the bench around ${when(b.start)}`, 'a longer shift');
      } else {
        why = `mixer "${b.name}" is busy around ${busy}`;
        ways.push('another mixer', 'start a build earlier so the mix can move');
      }
    } else {
      why = 'the night has no room for it before its due time';
      ways.push('another oven', 'another person on the bench');
    }
    ways.push(`a later due time (${when(minuteOf(o.out, plan.date))})`);
    out.push(
      `LATE: order ${m.order + 1} (${order.formula}, ${order.pieces} pieces${order.customer ? ` for ${order.customer}` : ''}) is due at ${when(minuteOf(o.due, plan.date))} but can be out at ${when(minuteOf(o.out, plan.date))} at the earliest, ${o.late} min late. Bottleneck: ${why}. Ways out: ${ways.join('; ')}.`,
    );
  }
  return out;
}

/** A pre-ferment build to book on a mixer: its end must fall in [from, until] (ripe at every use). */
export interface BuildToBook {
  name: string;
  formula: string;
  grams: number;
  allergens: readonly string[];
  from: number;
  until: number;
}

/** Books each build on the smallest mixer that takes it, as late in its window as a mixer is free. */
export function bookBuilds(night: Night, plan: Plan, builds: BuildToBook[], at: (m: number) => LocalDateTime): ({ mixer: string; start: number; end: number } | null)[] {
  const minutes = BUILD_MIX_MINUTES.value;
  const mixers = [...plan.mixers].sort((a, b) => a.capacityGrams - b.capacityGrams);
  let assumedSaid = false;
  return builds.map((b) => {
    const fit = mixers.filter((m) => b.grams <= m.capacityGrams * (1 + 1e-9) && (m.minimumGrams === undefined || b.grams >= m.minimumGrams * (1 - 1e-9)));
    if (fit.length === 0) {
      night.warnings.push(`${b.name} (${b.formula}, ${Math.round(b.grams)} g) is outside every mixer's range (capacity and minimum); mix it by hand between ${shortTime(at(b.from), plan.date)} and ${shortTime(at(b.until), plan.date)}`);
      return null;
    }
    // Someone on the bench mixes it: a time inside a shift first, any time in the window after that.
    const inShift = (end: number) => night.problem.shifts.some((s) => s.from <= end - minutes && end <= s.to);
    for (const needShift of [true, false]) {
      for (let end = b.until; end >= b.from; end = end === b.until ? Math.ceil(b.until / GRID_MINUTES) * GRID_MINUTES - GRID_MINUTES : end - GRID_MINUTES) {
        if (needShift && !inShift(end)) continue;
        for (const mixer of fit) {
          if (night.calendar.mixerConflict(mixer.name, end - minutes, end, b.allergens)) continue;
          book(night.calendar.mixers.get(mixer.name)!, { start: end - minutes, end, allergens: b.allergens });
          night.bookings.push({ ...booking({ kind: 'mixer', name: mixer.name, unit: null }, 'build', null, end - minutes, end, at), formula: b.formula, mix: b.name });
          if (!assumedSaid) {
            assumedSaid = true;
            night.warnings.push(`builds take ${minutes} min on a mixer (default; ${BUILD_MIX_MINUTES.source})`);
          }
          return { mixer: mixer.name, start: end - minutes, end };
        }
      }
    }
    night.warnings.push(`${b.name} (${b.formula}): no mixer is free to mix it between ${shortTime(at(b.from), plan.date)} and ${shortTime(at(b.until), plan.date)}; mix it by hand`);
    return null;
  });
}

/** Adds the clean-downs between mixes and the decks' heating and cooling, and sorts the bookings. */
export function finishBookings(night: Night, at: (m: number) => LocalDateTime): Booking[] {
  const extra: Booking[] = [];
  for (const [name, list] of night.calendar.mixers) {
    const sorted = [...list].sort((a, b) => a.start - b.start);
    for (let i = 1; i < sorted.length; i++) {
      const clean = night.calendar.cleanDown(name, sorted[i - 1].allergens, sorted[i].allergens);
      if (clean > 0) extra.push(booking({ kind: 'mixer', name, unit: null }, 'clean-down', null, sorted[i - 1].end, sorted[i - 1].end + clean, at));
    }
  }
  for (const oven of night.problem.ovens) {
    for (let d = 1; d <= oven.decks; d++) {
      const sorted = night.calendar.deckList(oven.name, d);
      let before: number | null = night.problem.room;
      let end = -Infinity;
      for (const b of sorted) {
        const t = b.temperature ?? null;
        const change = changeMinutes(oven, before, t);
        if (change > 0 && t !== null && before !== null) {
          const from = Number.isFinite(end) ? end : b.start - change;
          extra.push({ ...booking({ kind: 'oven', name: oven.name, unit: d }, t > before ? 'heat' : 'cool', null, from, from + change, at), temperature: t });
        }
        if (t !== null) before = t;
        end = b.end;
      }
    }
  }
  return [...night.bookings, ...extra].sort(
    (a, b) => compareCodeUnits(a.start, b.start) || compareText(a.resource.kind, b.resource.kind) || compareText(a.resource.name, b.resource.name) || (a.resource.unit ?? 0) - (b.resource.unit ?? 0),
  );
}
