// Which of the day's record targets (GET /api/plans/:date/records → targets, named by the server
// with shared/records.ts recordTargets) a sheet card is: the same formula (or build name), the
// same start, the same mixer. A card that matches none or several gets no record button.
import type { SheetBuild, SheetMix } from '#shared/sheet/types';
import type { RecordTarget } from './api/types.ts';

type Target = Pick<RecordTarget, 'target' | 'kind' | 'formula' | 'mixer' | 'start'>;

function one<T>(list: T[]): T | undefined {
  return list.length === 1 ? list[0] : undefined;
}

export function targetForMix<T extends Target>(targets: readonly T[], mix: SheetMix): T | undefined {
  return one(targets.filter((t) => t.kind === 'mix' && t.formula === mix.formula && t.start === mix.start && (t.mixer === null || t.mixer === mix.mixer)));
}

/** A build's start as the server gives it: its booked start, else the start (or end) of its window. */
export function buildStart(build: SheetBuild): string {
  return build.booked?.start ?? build.mixFrom ?? build.mixUntil;
}

export function targetForBuild<T extends Target>(targets: readonly T[], build: SheetBuild): T | undefined {
  const named = targets.filter((t) => t.kind === 'build' && (t.target === build.name || t.target.startsWith(`${build.name}/`)));
  return one(named.length <= 1 ? named : named.filter((t) => t.formula === build.formula && t.start === buildStart(build)));
}
