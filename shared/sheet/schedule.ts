// The timeline: every mix's process steps placed on the plan's clock, scheduled backward from the
// plan's `ready_by`. Pure; no clock.
//
// Rules (docs/batch-sheet.md):
// - Each mix goes through its formula's process steps one after the other, with no gaps; a step's
//   range uses its midpoint unless the plan says `ranges: short` or `long`; a step without a
//   duration (divide, say) takes no time on the timeline.
// - The oven takes one bake at a time. A mix's oven time runs from its first bake step's start to
//   its last bake step's end. The first mix to bake (in the plan's order of orders and mixes)
//   comes out of the oven at `ready_by`; every later mix goes in when the one before comes out, or
//   later when its mixer is busy.
// - A mixer mixes one dough at a time: when a mix would overlap another on the same mixer, that
//   mix (and its whole chain, bake included) moves later to the first time the mixer is free.
// - Cold holds (`retard`) are steps like the others: they take their picked duration and are
//   marked cold. A process without a bake step ends at `ready_by` (or later if its mixer is busy).
import type { Formula, Step } from '../model.ts';
import { pickFromRange, type RangePick } from '../units.ts';

export interface ChainStep {
  step: Step;
  minutes: number;
  /** Minutes from the start of the chain. */
  offset: number;
  /** Added by the scheduler when the formula's process has no mix step. */
  implicit?: boolean;
}

export interface Chain {
  steps: ChainStep[];
  /** Offset of the anchor: the first bake's start, or the chain's end when nothing is baked. */
  anchor: number;
  /** Minutes in the oven (first bake start to last bake end); 0 when nothing is baked. */
  oven: number;
  length: number;
}

/** The process as a chain of timed steps. */
export function processChain(f: Formula, ranges: RangePick, warnings: string[]): Chain {
  const steps: ChainStep[] = [];
  let t = 0;
  if (!f.process.some((s) => s.step === 'mix')) {
    warnings.push(`${f.id} has no mix step in its process; its mixes are placed at the start of the process and take no mixer time`);
    steps.push({ step: { step: 'mix', minutes: { min: 0, max: 0 } }, minutes: 0, offset: 0, implicit: true });
  }
  for (const s of f.process) {
    const minutes = s.minutes ? pickFromRange(s.minutes, ranges) : 0;
    steps.push({ step: s, minutes, offset: t });
    t += minutes;
  }
  const bakes = steps.filter((s) => s.step.step === 'bake');
  if (bakes.length === 0) return { steps, anchor: t, oven: 0, length: t };
  const first = bakes[0];
  const last = bakes[bakes.length - 1];
  return { steps, anchor: first.offset, oven: last.offset + last.minutes - first.offset, length: t };
}

export interface Job {
  chain: Chain;
  mixer: string;
}

export interface Placed {
  /** Minute (from the plan date's midnight) at which the chain starts. */
  start: number;
}

interface Interval {
  from: number;
  to: number;
}

const overlaps = (a: Interval, b: Interval) => a.from < b.to && b.from < a.to;

/**
 * Places jobs in the given order (the order of baking). Returns each chain's start minute.
 * `readyBy` is in minutes from the plan date's midnight.
 */
export function scheduleJobs(jobs: Job[], readyBy: number): Placed[] {
  const busy = new Map<string, Interval[]>();
  let ovenFree: number | undefined;
  const out: Placed[] = [];
  for (const job of jobs) {
    const { chain } = job;
    const baked = chain.oven > 0 || chain.steps.some((s) => s.step.step === 'bake');
    // The anchor is the oven start (baked) or the chain's end (not baked).
    const earliest = baked ? (ovenFree ?? readyBy - chain.oven) : readyBy;
    const mixes = chain.steps
      .filter((s) => s.step.step === 'mix')
      .map((s) => ({ rel: s.offset - chain.anchor, minutes: s.minutes }));
    const taken = busy.get(job.mixer) ?? [];
    const fits = (anchor: number) =>
      mixes.every((m) => m.minutes === 0 || !taken.some((b) => overlaps(b, { from: anchor + m.rel, to: anchor + m.rel + m.minutes })));
    const candidates = [earliest];
    for (const b of taken) for (const m of mixes) if (b.to - m.rel > earliest) candidates.push(b.to - m.rel);
    // This one always fits: every mix step starts after the mixer's last busy interval ends.
    if (taken.length > 0 && mixes.length > 0) {
      candidates.push(Math.max(earliest, Math.max(...taken.map((b) => b.to)) - Math.min(...mixes.map((m) => m.rel))));
    }
    candidates.sort((a, b) => a - b);
    const anchor = candidates.find(fits) ?? candidates[candidates.length - 1];
    for (const m of mixes) if (m.minutes > 0) taken.push({ from: anchor + m.rel, to: anchor + m.rel + m.minutes });
    busy.set(job.mixer, taken);
    if (baked) ovenFree = anchor + chain.oven;
    out.push({ start: anchor - chain.anchor });
  }
  return out;
}
