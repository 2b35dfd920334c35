// Friction learned from the bench: each recorded mix gives its mixer's rise for that dough, worked
// back from the dough temperature measured off the mixer and the inputs the sheet used that day;
// per mixer × formula, enough mixes give a proposal. Pure; no I/O, no clock (dates are passed in).
//
// Conventions (docs/arithmetic.md, "Friction learned from the bench"):
// - One mix's rise: computeFriction (temperature.ts), the multiplier method worked backwards:
//   rise = actual − (room + flour + water + each pre-ferment) / n. The room, flour and pre-ferment
//   temperatures are those the sheet used for that mix (kept with the record). The water is the
//   one the bench wrote down; without it, the sheet's (a mix made as printed).
// - With a bassinage, the bench writes the main water's temperature; the method's water is the
//   whole water's: T = ((W − b)·T_main + b·T_b) / W (the inverse of dough-water.ts).
// - The proposal is the median of the mixes' rises once at least FRICTION_MINIMUM mixes are kept.
//   A mix further than OUTLIER_MADS scaled median absolute deviations from the median is shown as
//   an outlier and left out (the MAD rule: Leys et al., "Detecting outliers: Do not use standard
//   deviation around the mean, use absolute deviation around the median", Journal of Experimental
//   Social Psychology 49 (2013) 764–766, which calls 3 "very conservative"; from memory). The
//   scaled MAD is 1.4826 × MAD (the normal-consistency constant, same source), floored at
//   MAD_FLOOR so that identical readings do not make every other reading an outlier.
// - The file's value is never changed here: a proposal names the plan line the baker edits.
import { computeFriction } from './temperature.ts';
import { dayMonth } from './sheet/time.ts';

/** Mixes needed before a rise is proposed (common practice: three readings before trusting a figure). */
export const FRICTION_MINIMUM = 3;
/** How many scaled MADs from the median make an outlier (Leys et al. 2013; from memory). */
export const OUTLIER_MADS = 3;
/** 1 / Φ⁻¹(3/4): makes the MAD estimate the standard deviation of normal data (Leys et al. 2013; from memory). */
export const MAD_SCALE = 1.4826;
/**
 * °C-degrees: the least scaled MAD counted, about a probe thermometer's ±0.5 °C (common practice):
 * readings this close are the same reading.
 */
export const MAD_FLOOR = 0.5;
/**
 * °C-degrees of rise: a proposal differing from the file by less than this "agrees". A rise off by
 * δ puts the dough off by δ, so this is the thermometer's own ±0.5 °C (common practice).
 */
export const PROPOSE_DIFFERENCE = 0.5;

/** What the sheet used for one mix, kept with its record. °C; grams. */
export interface SheetMixInputs {
  /** 3 + the pre-ferments. */
  n: number;
  room: number;
  flour: number;
  /** Each pre-ferment's temperature in the sum, formula order. */
  preferments: number[];
  /** The mixer's rise on that day's plan. */
  rise: number;
  /** The sheet's desired dough temperature, or null. */
  doughTemperature: number | null;
  /** The sheet's temperature for the water poured at the start (main water), or null. */
  waterTemperature: number | null;
  /** All the water of the mix (bassinage included). */
  water: number;
  bassinage: { grams: number; temperature: number } | null;
}

export interface MixFriction {
  /** °C-degrees: this mix's rise. */
  rise: number;
  /** n × rise: the friction factor in this dough's sum. */
  friction: number;
  n: number;
  /** °C: the main water's temperature used in the sum. */
  waterTemperature: number;
  waterFrom: 'measured' | 'sheet';
}

/**
 * One mix's rise from its measured dough temperature; null when neither the bench nor the sheet
 * gives a water temperature (a dough without a liquid to temper).
 */
export function mixFriction(inputs: SheetMixInputs, measured: { doughTemperature: number; waterTemperature?: number | null }): MixFriction | null {
  const main = measured.waterTemperature ?? inputs.waterTemperature;
  if (main === null || main === undefined) return null;
  const b = inputs.bassinage;
  const whole = b && inputs.water > b.grams ? ((inputs.water - b.grams) * main + b.grams * b.temperature) / inputs.water : main;
  const f = computeFriction({ measured: measured.doughTemperature, room: inputs.room, flour: inputs.flour, water: whole, preferments: inputs.preferments });
  return {
    rise: f.rise,
    friction: f.frictionFactor,
    n: f.factors,
    waterTemperature: main,
    waterFrom: measured.waterTemperature === null || measured.waterTemperature === undefined ? 'sheet' : 'measured',
  };
}

export function median(values: readonly number[]): number {
  if (values.length === 0) throw new RangeError('the median of no values');
  const s = [...values].sort((a, b) => a - b);
  const mid = Math.floor(s.length / 2);
  return s.length % 2 === 1 ? s[mid] : (s[mid - 1] + s[mid]) / 2;
}

/** One recorded mix's rise, for the proposal. */
export interface RiseReading {
  recordId: number;
  /** The bake day, yyyy-mm-dd. */
  date: string;
  rise: number;
}

export interface RobustRise {
  /** The median of the kept readings; null when none. */
  rise: number | null;
  kept: RiseReading[];
  outliers: RiseReading[];
  /** Scaled MAD of all readings (before the floor). */
  scaledMad: number | null;
}

/** The median rise with outliers (further than OUTLIER_MADS scaled MADs) set apart. */
export function robustRise(readings: readonly RiseReading[]): RobustRise {
  if (readings.length === 0) return { rise: null, kept: [], outliers: [], scaledMad: null };
  const m = median(readings.map((r) => r.rise));
  const scaledMad = MAD_SCALE * median(readings.map((r) => Math.abs(r.rise - m)));
  const limit = OUTLIER_MADS * Math.max(scaledMad, MAD_FLOOR);
  const kept = readings.filter((r) => Math.abs(r.rise - m) <= limit);
  const outliers = readings.filter((r) => Math.abs(r.rise - m) > limit);
  return { rise: median(kept.map((r) => r.rise)), kept, outliers, scaledMad };
}

/** The value the plan file gives today for a mixer. */
export interface CurrentRise {
  rise: number;
  /** As model.ts Mixer.riseFrom: the line says `rise`, or `friction` (÷ 3), or the hand default. */
  riseFrom: 'rise' | 'friction' | 'hand default';
  /** The plan it comes from (yyyy-mm-dd) and its file. */
  plan: string;
  path: string;
}

export type ProposalStatus = 'propose' | 'agrees' | 'too few';

export interface FrictionProposal {
  mixer: string;
  formula: string;
  title: string;
  /** Mixes recorded (hidden and corrected-away rows not counted). */
  mixes: number;
  /** Mixes the median is taken over. */
  used: number;
  outliers: RiseReading[];
  /** °C-degrees: the median rise; null with too few mixes. */
  rise: number | null;
  /** 3 × rise: the straight-dough friction factor, as a plan's `friction:` says it. */
  friction: number | null;
  /** First and last bake day counted. */
  from: string | null;
  to: string | null;
  /** "from 6 mixes, 12–28 Nov". */
  basis: string;
  current: CurrentRise | null;
  status: ProposalStatus;
  /** The line the baker changes to accept it; null unless status is `propose`. */
  change: string | null;
}

/** "12–28 Nov", "28 Nov – 3 Dec", "30 Dec 2026 – 2 Jan 2027", "3 Dec" for yyyy-mm-dd days. */
export function dayRange(from: string, to: string): string {
  if (from === to) return dayMonth(from);
  if (from.slice(0, 4) !== to.slice(0, 4)) return `${dayMonth(from)} ${from.slice(0, 4)} – ${dayMonth(to)} ${to.slice(0, 4)}`;
  if (from.slice(5, 7) !== to.slice(5, 7)) return `${dayMonth(from)} – ${dayMonth(to)}`;
  return `${Number(from.slice(8, 10))}–${dayMonth(to)}`;
}

/** Rounds a temperature difference for a file line: to 0.5 °C-degree. */
const half = (v: number) => Math.round(v * 2) / 2;
const fmt = (v: number) => `${Number.isInteger(v) ? v : v.toFixed(1)} °C`;

/** The proposal for one mixer × formula from its readings and the file's current value. */
export function proposeFriction(
  key: { mixer: string; formula: string; title: string },
  readings: readonly RiseReading[],
  current: CurrentRise | null,
): FrictionProposal {
  const sorted = [...readings].sort((a, b) => a.date.localeCompare(b.date) || a.recordId - b.recordId);
  const r = robustRise(sorted);
  const from = sorted[0]?.date ?? null;
  const to = sorted.at(-1)?.date ?? null;
  const word = (k: number) => `${k} ${k === 1 ? 'mix' : 'mixes'}`;
  let basis = from && to ? `from ${word(sorted.length)}, ${dayRange(from, to)}` : 'no mixes recorded';
  if (r.outliers.length > 0) basis += ` (${r.outliers.length} left out as ${r.outliers.length === 1 ? 'an outlier' : 'outliers'})`;
  const enough = r.kept.length >= FRICTION_MINIMUM && r.rise !== null;
  const rise = enough ? r.rise : null;
  let status: ProposalStatus = 'too few';
  let change: string | null = null;
  if (rise !== null) {
    status = current && Math.abs(rise - current.rise) < PROPOSE_DIFFERENCE ? 'agrees' : 'propose';
    if (status === 'propose') {
      // Words, not an arrow: the printed sheet's fonts have no arrow.
      const where = current ? `in ${current.path}, mixer ${key.mixer}: ` : `in the plan, mixer ${key.mixer}: `;
      change = current?.riseFrom === 'rise'
        ? `${where}rise: ${fmt(half(current.rise))} becomes rise: ${fmt(half(rise))}`
        : current?.riseFrom === 'friction'
          ? `${where}friction: ${fmt(half(current.rise * 3))} becomes friction: ${fmt(half(rise * 3))}`
          : `${where}add rise: ${fmt(half(rise))}`;
    }
  }
  return {
    ...key,
    mixes: sorted.length,
    used: r.kept.length,
    outliers: r.outliers,
    rise,
    friction: rise === null ? null : rise * 3,
    from,
    to,
    basis,
    current,
    status,
    change,
  };
}

/** A stored mix record as the friction table needs it. */
export interface FrictionRecord {
  recordId: number;
  date: string;
  mixer: string;
  formula: string;
  title: string;
  inputs: SheetMixInputs;
  doughTemperature: number;
  waterTemperature: number | null;
}

/**
 * The friction table: one proposal per mixer × formula with records, sorted by mixer then formula.
 * `currentOf` gives the file's value for a mixer (null when no plan has it).
 */
export function frictionTable(records: readonly FrictionRecord[], currentOf: (mixer: string) => CurrentRise | null): FrictionProposal[] {
  const groups = new Map<string, { key: { mixer: string; formula: string; title: string }; readings: RiseReading[] }>();
  for (const rec of records) {
    const f = mixFriction(rec.inputs, rec);
    if (!f) continue;
    const id = `${rec.mixer}\u0000${rec.formula}`;
    let g = groups.get(id);
    if (!g) groups.set(id, (g = { key: { mixer: rec.mixer, formula: rec.formula, title: rec.title }, readings: [] }));
    g.readings.push({ recordId: rec.recordId, date: rec.date, rise: f.rise });
  }
  return [...groups.values()]
    .map((g) => proposeFriction(g.key, g.readings, currentOf(g.key.mixer)))
    .sort((a, b) => a.mixer.localeCompare(b.mixer) || a.formula.localeCompare(b.formula));
}
