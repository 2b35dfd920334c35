// The water (or other liquid) for one mix of one formula: the one home of the rules that `scale`,
// `sheet`, the API and the viewer share. Pure; no I/O.
//
// Conventions (docs/arithmetic.md, "Dough temperature"; the arithmetic itself is in temperature.ts):
// - Each pre-ferment counts at its own temperature: the one measured tonight when given, else its
//   ripening temperature (the middle of a range), else the temperature it was built at, else the
//   plan's `conditions.preferment`, else the room's.
// - The desired dough temperature is the formula's (the middle of a range), unless one is given.
// - The liquid tempered is the final dough's water; a dough without water tempers its other
//   liquid instead (an ingredient of 80 % water or more, such as milk) by the same method. The
//   method sums temperatures and weighs nothing, so that liquid's specific heat is not counted,
//   as water's and flour's are not. Milk takes no ice: ice would add water to the formula.
// - Bassinage: water held back and added late has its own amount and temperature. The method's
//   water temperature is the whole water's; the main water makes up the rest of the heat:
//   main = (W·T − b·T_b) / (W − b), W all the final dough's water, b the bassinage. The ice is
//   counted in the main water only.
// - A build's water: m·T − (room + flour + the seed culture), m = 3, or 4 with a seed; no friction
//   (a build is mixed briefly). The seed counts at the plan's pre-ferment default, else the room's.
import { lookupIngredient, type Catalog, type Formula, type Preferment } from './model.ts';
import type { ScaleResult } from './scale.ts';
import {
  computeIce, computeWaterTemperature, describeTemperature, HOT_WATER_CELSIUS, SPECIFIC_HEAT_OF_WATER, WARM_WATER_ADVICE,
  WARM_WATER_CELSIUS,
} from './temperature.ts';
import type { NumberRange, TemperatureUnit } from './units.ts';

/** Where a pre-ferment's temperature in the water sum came from. */
export type PrefermentTemperatureSource = 'measured' | 'ripening' | 'build' | 'plan default' | 'room';

export interface PrefermentTemperature {
  name: string;
  /** °C */
  temperature: number;
  source: PrefermentTemperatureSource;
}

/** What a pre-ferment's temperature is taken from, besides the formula. */
export interface PrefermentReadings {
  /** °C, measured tonight; wins over everything. */
  measured?: number;
  /** °C, the plan's `conditions.preferment`: only for a build that gives no temperature of its own. */
  planDefault?: number;
  /** °C: the last resort. */
  room: number;
}

/** The temperature a pre-ferment counts at in the water sum, and where it came from. */
export function prefermentTemperature(p: Preferment, r: PrefermentReadings): PrefermentTemperature {
  const at = (temperature: number, source: PrefermentTemperatureSource) => ({ name: p.name, temperature, source });
  if (r.measured !== undefined) return at(r.measured, 'measured');
  if (p.ripenTemperature !== undefined) return at(p.ripenTemperature, 'ripening');
  if (p.temperature !== undefined) return at(p.temperature, 'build');
  if (r.planDefault !== undefined) return at(r.planDefault, 'plan default');
  return at(r.room, 'room');
}

/** Whole milk's specific heat, J/(g·K), for the note only (ASHRAE Handbook—Refrigeration, "Thermal Properties of Foods"; from memory). */
export const WHOLE_MILK_SPECIFIC_HEAT = 3.9;
/** An ingredient of at least this much water (percent) can be a dough's liquid when it has no water. */
export const LIQUID_WATER_CONTENT = 80;

export interface MixConditions {
  /** °C */
  room: number;
  /** °C */
  flour: number;
  /** °C; with it, the ice is worked out. */
  tap?: number;
  /** °C-degrees: the mixer's rise. */
  rise: number;
  /** °C: the plan's `conditions.preferment`. */
  prefermentDefault?: number;
  /** °C, measured tonight, in the formula's pre-ferment order (undefined: not measured). */
  measured?: readonly (number | undefined)[];
  /** °C: a desired dough temperature other than the formula's. */
  ddt?: number;
}

export interface MixWater {
  /** °C: what the mix aims at (the middle of the formula's range). */
  desiredDoughTemperature: number;
  /** °C: the formula's range; null when one temperature or the DDT was given. */
  doughTemperatureRange: NumberRange | null;
  factors: number;
  room: number;
  flour: number;
  /** °C-degrees */
  rise: number;
  /** n × rise */
  frictionFactor: number;
  preferments: PrefermentTemperature[];
  /** The liquid tempered: water, or another liquid when the dough has no water; null when it has neither. */
  liquid: {
    names: string[];
    kind: 'water' | 'other';
    /** g in the final dough, all of it (bassinage included). */
    grams: number;
    /** The method's temperature for all of it, °C. */
    temperature: number;
  } | null;
  /** What is poured at the start of the mix: the liquid less any bassinage; null without a liquid. */
  main: {
    grams: number;
    /** °C */
    temperature: number;
    /** g; null without a tap temperature, 0 for a liquid other than water. */
    ice: number | null;
    tapWater: number | null;
    iceShare: number | null;
  } | null;
  /** Water held back for late in the mix. */
  bassinage: { grams: number; percent: number; temperature: number } | null;
  /** Whether the liquid's specific heat is counted, and why not. */
  specificHeat: string;
  /** False when the main liquid would have to be below 0 °C. */
  reachable: boolean;
  /** Problems: a target ice cannot reach, water hot enough to scald or too warm for yeast. */
  warnings: string[];
  /** How to get there: ice, warming above the tap, no ice in milk. */
  advice: string[];
}

/** What the sheet and the helper say about the convention, once. */
export const FRICTION_CONVENTION = "multiplier method, friction = n × the mixer's rise";

function specificHeatNote(kind: 'water' | 'other', names: string[]): string {
  if (kind === 'water') return 'not counted: the method sums temperatures, not heat';
  return `not counted: the method sums temperatures, not heat, so ${names.join(' and ')} is tempered as water would be (whole milk holds about ${WHOLE_MILK_SPECIFIC_HEAT} J/(g·K) against water's ${SPECIFIC_HEAT_OF_WATER}; ASHRAE Handbook—Refrigeration, "Thermal Properties of Foods", from memory)`;
}

/** The final dough's liquid: its water lines, else its watery lines (milk). */
function findLiquid(formula: Formula, scaled: ScaleResult, catalog: Catalog): { names: string[]; kind: 'water' | 'other'; grams: number } | null {
  const own = scaled.finalDough.filter((l) => l.source === 'ingredient');
  const water = own.filter((l) => lookupIngredient(catalog, l.ingredient).kind === 'water');
  if (water.length > 0) return { names: water.map((l) => l.ingredient), kind: 'water', grams: water.reduce((a, l) => a + l.grams, 0) };
  const flours = new Set(formula.flour.map((l) => l.ingredient));
  const other = own.filter((l) => !flours.has(l.ingredient) && lookupIngredient(catalog, l.ingredient).water >= LIQUID_WATER_CONTENT);
  if (other.length > 0) return { names: other.map((l) => l.ingredient), kind: 'other', grams: other.reduce((a, l) => a + l.grams, 0) };
  return null;
}

/**
 * The water (or milk) for one mix: the pre-ferments at their own temperatures, the friction from
 * the mixer's rise, the bassinage apart, the ice. Never throws for an unreachable target: the
 * sheet must still print; `reachable` and the warnings say so. Throws only for a formula with no
 * desired dough temperature and none given.
 */
export function planMixWater(formula: Formula, scaled: ScaleResult, catalog: Catalog, c: MixConditions, unit: TemperatureUnit = 'C'): MixWater {
  const ddt = c.ddt ?? formula.doughTemperature;
  if (ddt === undefined) throw new RangeError(`${formula.id} has no dough_temperature`);
  const range = c.ddt === undefined && formula.doughTemperatureRange && formula.doughTemperatureRange.min !== formula.doughTemperatureRange.max
    ? formula.doughTemperatureRange
    : null;
  const preferments = formula.preferments.map((p, i) =>
    prefermentTemperature(p, { measured: c.measured?.[i], planDefault: c.prefermentDefault, room: c.room }));
  const w = computeWaterTemperature({ ddt, room: c.room, flour: c.flour, rise: c.rise, preferments: preferments.map((p) => p.temperature) });
  const t = (v: number) => describeTemperature(v, unit);
  const warnings: string[] = [];
  const found = findLiquid(formula, scaled, catalog);
  const base = {
    desiredDoughTemperature: ddt, doughTemperatureRange: range, factors: w.factors, room: c.room, flour: c.flour,
    rise: c.rise, frictionFactor: w.frictionFactor, preferments,
  };
  if (!found) {
    warnings.push('no water or milk in the final dough to temper: its temperature follows the flour, the room and the pre-ferments');
    return { ...base, liquid: null, main: null, bassinage: null, specificHeat: specificHeatNote('water', []), reachable: true, warnings, advice: [] };
  }
  const liquid = { ...found, temperature: w.water };

  let bassinage: MixWater['bassinage'] = null;
  if (formula.bassinage) {
    const grams = (scaled.flour * formula.bassinage.percent) / 100;
    if (found.kind !== 'water' || grams >= found.grams) {
      warnings.push(`the bassinage (${formula.bassinage.percent} %) needs more water than the final dough's water; it is left out of the sum`);
    } else {
      bassinage = { grams, percent: formula.bassinage.percent, temperature: formula.bassinage.temperature };
    }
  }
  const mainGrams = found.grams - (bassinage?.grams ?? 0);
  const mainTemperature = bassinage ? (found.grams * w.water - bassinage.grams * bassinage.temperature) / mainGrams : w.water;
  const what = found.kind === 'water' ? (bassinage ? 'the main water' : 'the water') : found.names.join(' and ');

  let reachable = true;
  if (mainTemperature < 0) {
    reachable = false;
    warnings.push(
      `${what} would have to be ${t(mainTemperature)}, below the ${unit === 'C' ? '0 °C' : '32 °F'} that ice can bring it to; chill the flour or pre-ferment, or mix for less rise`,
    );
  } else if (mainTemperature > HOT_WATER_CELSIUS) {
    warnings.push(`${what} would have to be ${t(mainTemperature)}: hot enough to scald and to harm the yeast; check the readings, or warm the flour or the room instead`);
  } else if (mainTemperature > WARM_WATER_CELSIUS) {
    warnings.push(`${what} will be ${t(mainTemperature)}, ${WARM_WATER_ADVICE}`);
  }

  const advice: string[] = [];
  let ice: number | null = null;
  let tapWater: number | null = null;
  let iceShare: number | null = null;
  if (found.kind === 'other') {
    ice = 0;
    if (reachable) advice.push(`bring ${what} to ${t(mainTemperature)}; no ice in it (ice would add water)`);
  } else if (c.tap !== undefined) {
    const split = computeIce(mainGrams, c.tap, Math.max(0, mainTemperature));
    ({ ice, tapWater, iceShare } = split);
    if (split.ice > 0) {
      advice.push('use clean food-grade ice, weigh it with the water, and let it melt in the mix; count it as part of the water');
    } else if (mainTemperature > c.tap) {
      advice.push(`${what} must be warmer than the tap (${t(c.tap)}): warm it to ${t(mainTemperature)}`);
    }
  }
  return {
    ...base,
    liquid,
    main: { grams: mainGrams, temperature: mainTemperature, ice, tapWater, iceShare },
    bassinage,
    specificHeat: specificHeatNote(found.kind, found.names),
    reachable,
    warnings,
    advice,
  };
}

export interface BuildWater {
  /** °C */
  waterTemperature: number;
  factors: number;
  /** °C: the seed culture's temperature, when the build has one. */
  seed: number | null;
}

/** A build's water: m·T − (room + flour + seed), m = 3 or 4 with a seed culture; no friction. */
export function planBuildWater(target: number, c: { room: number; flour: number; seed?: number }): BuildWater {
  const w = computeWaterTemperature({ ddt: target, room: c.room, flour: c.flour, rise: 0, preferments: c.seed === undefined ? [] : [c.seed] });
  return { waterTemperature: w.water, factors: w.factors, seed: c.seed ?? null };
}
