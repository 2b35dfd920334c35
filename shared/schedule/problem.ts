// The night as a scheduling problem: resources (mixers, oven decks, bench people) and jobs (one
// per mix: its mixer, bench and oven operations, with the waits between them as ranges).
// Times are whole minutes from the plan date's midnight. Pure; no I/O.
import type { NumberRange } from '../units.ts';

export interface MixerResource {
  name: string;
  /** Minutes to clean it before a dough that lacks an allergen of the dough before. */
  cleanDown: number;
}

export interface OvenResource {
  name: string;
  decks: number;
  slots: number;
  /** °C per minute. */
  heatRate: number;
  coolRate: number;
  steam: boolean;
  fan: boolean;
}

export interface ShiftResource {
  /** Minutes from the plan date's midnight. */
  from: number;
  to: number;
  people: number;
}

export type BenchTask = 'divide' | 'preshape' | 'shape';

export type Operation =
  | { kind: 'mix'; minutes: number }
  | { kind: 'bench'; task: BenchTask; minutes: number }
  | {
      kind: 'bake';
      minutes: number;
      /** °C; null when the formula gives none (then the deck's temperature is not constrained). */
      temperature: number | null;
      /** Slots the whole mix fills. */
      slots: number;
      /** Slots one piece takes (1 unless a piece is bigger than a slot). */
      pieceSlots: number;
      /** Ovens that may bake it, best first. */
      ovens: string[];
    };

export interface Job {
  /** Index into the problem's jobs. */
  id: number;
  mixer: string;
  /** Allergen codes in the dough. */
  allergens: readonly string[];
  /** When the last piece must be out of the oven (or the chain done when nothing is baked). */
  due: number;
  operations: Operation[];
  /**
   * `gaps[i]` is the wait before `operations[i]` (after `operations[i - 1]`): the sum of the
   * process steps between them. `gaps[0]` is unused. `preferred` is the sum of their picked
   * durations (the plan's `ranges`).
   */
  gaps: (NumberRange & { preferred: number })[];
  /** Wait after the last operation when it is not a bake (the chain's end counts as out). */
  tail: NumberRange & { preferred: number };
}

export interface Problem {
  mixers: MixerResource[];
  ovens: OvenResource[];
  shifts: ShiftResource[];
  /** °C a cold deck starts from (the room). */
  room: number;
  jobs: Job[];
}

export type ResourceKind = 'mixer' | 'oven' | 'bench';

export interface Placement {
  job: number;
  /** Start and end of each operation; bakes have one entry per load. */
  operations: { start: number; end: number }[];
  loads: Load[];
  /** Bench people, per bench operation index. */
  people: Map<number, number>;
  /** When the last piece is out (or the chain done). */
  out: number;
}

export interface Load {
  oven: string;
  /** 1-based. */
  deck: number;
  start: number;
  end: number;
  slots: number;
  temperature: number | null;
}

/** Minutes a deck needs to go from one temperature to another. */
export function changeMinutes(oven: OvenResource, from: number | null | undefined, to: number | null | undefined): number {
  if (from == null || to == null || to === from) return 0;
  return Math.ceil(to > from ? (to - from) / oven.heatRate : (from - to) / oven.coolRate);
}
