// Bench records: what can be recorded on a bake day (the day's sheet gives the targets), and the
// limits a reading must keep. The server checks a record with these, the viewer builds its form
// from the same targets. Pure; no I/O.
import type { SheetMixInputs } from './friction.ts';
import type { LocalDateTime, Sheet, SheetMix } from './sheet/types.ts';

export type RecordKind = 'mix' | 'build';

/** Something on a day's sheet a record can be about. */
export interface RecordTarget {
  /** `harbour-ciabatta/1` (the formula's first mix of the day) or a build's name (`poolish`, `levain/2`). */
  target: string;
  kind: RecordKind;
  /** As people say it: "Harbour ciabatta 1/2", "poolish", "levain 2/2". */
  label: string;
  /** A mix's formula; a build's first formula. */
  formula: string;
  /** Every formula it goes into. */
  formulas: string[];
  mixer: string | null;
  /** °C the sheet aims at, or null. */
  doughTemperature: number | null;
  /** °C of the water the sheet pours, or null. */
  waterTemperature: number | null;
  start: LocalDateTime | null;
  /** What the sheet used for a mix's water (friction is worked back from it); null for builds. */
  inputs: SheetMixInputs | null;
}

/** °C: the dough temperatures a record accepts (a reading outside is a mistyped or broken probe). */
export const DOUGH_TEMPERATURE_RANGE = { min: 0, max: 60 } as const;
/** °C: the water temperatures a record accepts (ice water to boiling, for scalds). */
export const WATER_TEMPERATURE_RANGE = { min: 0, max: 100 } as const;
export const NOTE_MAX = 2000;
export const INITIALS_MAX = 8;
/** Photos per record, and bytes per photo. */
export const PHOTOS_MAX = 6;
export const PHOTO_BYTES_MAX = 10 * 1024 * 1024;

function mixInputs(m: SheetMix): SheetMixInputs | null {
  if (!m.factors) return null;
  return {
    n: m.factors.n,
    room: m.factors.room,
    flour: m.factors.flour,
    preferments: m.factors.preferments.map((p) => p.temperature),
    rise: m.factors.rise,
    doughTemperature: m.doughTemperature,
    waterTemperature: m.waterTemperature,
    water: m.water,
    bassinage: m.bassinage,
  };
}

/**
 * Everything on a day's sheet a record can name: each mix as `<formula>/<n>` (n counts the
 * formula's mixes that day in plan order, 1-based), each build by its name, or `<name>/<k>` when
 * the day makes that name more than once (k in sheet order, the batch number for a build made in
 * batches).
 */
export function recordTargets(sheet: Sheet): RecordTarget[] {
  const out: RecordTarget[] = [];
  const byFormula = new Map<string, SheetMix[]>();
  for (const m of [...sheet.mixes].sort((a, b) => a.order - b.order || a.mixNumber - b.mixNumber)) {
    const list = byFormula.get(m.formula) ?? [];
    list.push(m);
    byFormula.set(m.formula, list);
  }
  for (const [formula, mixes] of byFormula) {
    mixes.forEach((m, i) => {
      out.push({
        target: `${formula}/${i + 1}`,
        kind: 'mix',
        label: `${m.title} ${i + 1}/${mixes.length}`,
        formula,
        formulas: [formula],
        mixer: m.mixer,
        doughTemperature: m.doughTemperature,
        waterTemperature: m.waterTemperature,
        start: m.start,
        inputs: mixInputs(m),
      });
    });
  }
  const builds = [...sheet.preferments, ...sheet.soakers];
  const count = new Map<string, number>();
  for (const b of builds) count.set(b.name, (count.get(b.name) ?? 0) + 1);
  const seen = new Map<string, number>();
  for (const b of builds) {
    const k = (seen.get(b.name) ?? 0) + 1;
    seen.set(b.name, k);
    const many = count.get(b.name)! > 1;
    out.push({
      target: many ? `${b.name}/${k}` : b.name,
      kind: 'build',
      label: many ? `${b.name} ${k}/${count.get(b.name)}` : b.name,
      formula: b.formula,
      formulas: b.formulas,
      mixer: b.booked?.mixer ?? null,
      doughTemperature: b.targetTemperature,
      waterTemperature: b.waterTemperature,
      start: b.booked?.start ?? b.mixFrom ?? b.mixUntil,
      inputs: null,
    });
  }
  return out;
}

/** The target a record names, or a message listing what the day allows. */
export function findTarget(targets: readonly RecordTarget[], name: string): RecordTarget | { error: string } {
  const exact = targets.find((t) => t.target === name);
  if (exact) return exact;
  const batches = targets.filter((t) => t.target.startsWith(`${name}/`) && t.kind === 'build');
  if (batches.length > 0) return { error: `"${name}" is made more than once that day: name one of ${batches.map((t) => t.target).join(', ')}` };
  return { error: `"${name}" is not on that day's sheet; it has ${targets.map((t) => t.target).join(', ')}` };
}
