// Which of the day's record targets (GET /api/plans/:date/records → targets) a sheet card is.
// The server names them (shared rule, docs/api.md); the viewer only finds the one for a card.
import type { SheetBuild, SheetMix } from '#shared/sheet/types';
import type { RecordTarget } from './api/types.ts';

export function targetForMix(targets: readonly RecordTarget[], mix: SheetMix): RecordTarget | undefined {
  const mixes = targets.filter((t) => t.kind === 'mix' && t.formula === mix.formula);
  if (mixes.some((t) => t.order !== undefined)) return mixes.find((t) => t.order === mix.order && t.mixNumber === mix.mixNumber);
  const same = mixes.filter((t) => t.start === mix.start && (t.mixer === null || t.mixer === mix.mixer));
  return same.length === 1 ? same[0] : undefined;
}

export function targetForBuild(targets: readonly RecordTarget[], build: SheetBuild): RecordTarget | undefined {
  const builds = targets.filter((t) => t.kind === 'build');
  if (builds.some((t) => t.name !== undefined)) return builds.find((t) => t.name === build.name && (t.batch ?? 1) === build.batch);
  const name = build.batches > 1 ? `${build.name}/${build.batch}` : build.name;
  return builds.find((t) => t.target === name);
}
