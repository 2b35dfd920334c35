// Dough temperature: the water temperature for a desired dough temperature (DDT), the ice to
// add when that water must be colder than the tap, and a mixer's rise worked back from a
// measured dough. Pure; no I/O.
//
// Conventions (docs/arithmetic.md, "Dough temperature"):
// - The multiplier method (J. Hamelman, "Bread: A Baker's Book of Techniques and Recipes", Wiley,
//   appendix on desired dough temperature; from memory, page not checked): the dough comes off the
//   mixer at the average of its n factor temperatures plus what the mixing adds, so
//   water = n·DDT − (room + flour + each pre-ferment + friction factor), where n counts room,
//   flour, water and each pre-ferment: 3 without a pre-ferment, 4 with one, 5 with two ...
// - Friction is defined once, per mixer, as the baker measures it: the RISE, how much warmer the
//   dough comes off the mixer than the average of its factors. In a sum of n temperatures the
//   friction factor is n × rise (the method's own algebra: n·DDT = Σ factors + n·rise). A friction
//   factor found on a straight dough (3 factors) converts to rise = factor ÷ 3.
// - Friction is a temperature *difference*; because n counts the water too, the method gives the
//   same water in °C and in °F as long as the rise converts by 5/9 without the offset.
// - ice (at 0 °C) for W grams of water in all, tap water at T_tap, combined water at T_w (°C):
//   ice = W·(T_tap − T_w) / (T_tap + L/c); tap water = W − ice. From the heat balance
//   (W − I)·c·(T_tap − T_w) = I·L + I·c·T_w: the tap water melts the ice and warms the meltwater.
// - rise from a measured dough: rise = actual − (room + flour + water + each pre-ferment) / n.

/**
 * Latent heat of fusion of ice at 0 °C, J/g: 333.55 (CRC Handbook of Chemistry and Physics,
 * "Enthalpy of fusion" table, water 6.01 kJ/mol at 0 °C over 18.015 g/mol; from memory).
 */
export const LATENT_HEAT_OF_FUSION_OF_ICE = 333.55;
/**
 * Specific heat of liquid water, J/(g·K): 4.186, the 15 °C calorie (4.1855 J, NIST SP 811, Guide for
 * the Use of the SI, Appendix B.8, "calorie (15 °C)") rounded; within 0.2 % from 0 to 40 °C.
 */
export const SPECIFIC_HEAT_OF_WATER = 4.186;
/**
 * A hand mix's rise, °C-degrees: about 1 °C, i.e. a straight-dough friction factor of about 3 °C
 * (5 °F). Common practice; used when a hand "mixer" gives no rise of its own.
 */
export const HAND_MIXING_RISE = 1;
/** Above this the water is hot enough to scald and to harm yeast (common practice). */
export const HOT_WATER_CELSIUS = 50;
/** Above this the water is too warm to pour onto yeast, though the dough is fine (common practice). */
export const WARM_WATER_CELSIUS = 40;
/** What the bench is told about water that is warm but not scalding. */
export const WARM_WATER_ADVICE = 'too warm to pour straight onto yeast or a culture: mix the water into the flour first';

/** Target water that cannot be reached, or inputs that make no sense. */
export class TemperatureError extends Error {
  constructor(
    message: string,
    /** °C: the water temperature that could not be reached, when that is the problem. */
    readonly water?: number,
  ) {
    super(message);
    this.name = 'TemperatureError';
  }
}

/** A temperature for a message, in the scale the baker works in. */
export function describeTemperature(celsius: number, unit: 'C' | 'F' = 'C'): string {
  return `${(unit === 'C' ? celsius : celsius * 1.8 + 32).toFixed(1)} °${unit}`;
}

function unreachable(water: number, unit: 'C' | 'F'): TemperatureError {
  return new TemperatureError(
    `the water would have to be ${describeTemperature(water, unit)}, below the ${unit === 'C' ? '0 °C' : '32 °F'} that ice can bring it to; chill the flour or pre-ferment, or lower the friction`,
    water,
  );
}

export interface DoughTemperatureInputs {
  /** Desired dough temperature. */
  ddt: number;
  room: number;
  flour: number;
  /** One temperature per pre-ferment going into the dough (none for a straight dough). */
  preferments: readonly number[];
  /** The mixer's rise: a temperature difference in the same scale's degrees. */
  rise: number;
}

export interface WaterTemperature {
  /** Water temperature, in the inputs' scale. */
  water: number;
  /** n: room, flour, water and each pre-ferment. */
  factors: number;
  /** n × rise */
  frictionFactor: number;
  /** n·DDT */
  total: number;
  /** room + flour + pre-ferments + friction factor */
  known: number;
}

/** The friction factor in a sum of `factors` temperatures: n × the mixer's rise. */
export function frictionFactor(rise: number, factors: number): number {
  return rise * factors;
}

function requireFinite(name: string, v: number): void {
  if (!Number.isFinite(v)) throw new TemperatureError(`${name} must be a number; got ${v}`);
}

/** n·DDT − (room + flour + pre-ferments + n·rise). Works in °C or °F (rise as a difference). */
export function computeWaterTemperature(i: DoughTemperatureInputs): WaterTemperature {
  for (const [name, v] of [['desired dough temperature', i.ddt], ['room temperature', i.room], ['flour temperature', i.flour], ["mixer's rise", i.rise]] as const) {
    requireFinite(name, v);
  }
  i.preferments.forEach((p, k) => requireFinite(`pre-ferment ${k + 1} temperature`, p));
  const factors = 3 + i.preferments.length;
  const total = factors * i.ddt;
  const ff = frictionFactor(i.rise, factors);
  let known = i.room + i.flour + ff;
  for (const p of i.preferments) known += p;
  return { water: total - known, factors, frictionFactor: ff, total, known };
}

export interface FrictionInputs {
  /** The dough temperature measured at the end of the mix. */
  measured: number;
  room: number;
  flour: number;
  water: number;
  preferments: readonly number[];
}

export interface MeasuredFriction {
  /** The mixer's rise, the one figure to keep: actual − the factors' average. */
  rise: number;
  /** n for this dough. */
  factors: number;
  /** n × rise: the friction factor of this dough's sum. */
  frictionFactor: number;
  /** 3 × rise: the same mixer's friction factor for a straight dough. */
  straightDoughFactor: number;
}

/** A mixer's rise from a measured dough: actual − (room + flour + water + pre-ferments) / n. */
export function computeFriction(i: FrictionInputs): MeasuredFriction {
  for (const [name, v] of [['measured dough temperature', i.measured], ['room temperature', i.room], ['flour temperature', i.flour], ['water temperature', i.water]] as const) {
    requireFinite(name, v);
  }
  i.preferments.forEach((p, k) => requireFinite(`pre-ferment ${k + 1} temperature`, p));
  const factors = 3 + i.preferments.length;
  let known = i.room + i.flour + i.water;
  for (const p of i.preferments) known += p;
  const ff = factors * i.measured - known;
  const rise = ff / factors;
  return { rise, factors, frictionFactor: ff, straightDoughFactor: frictionFactor(rise, 3) };
}

export interface IceConstants {
  /** J/g */
  latentHeat: number;
  /** J/(g·K) */
  specificHeat: number;
}
export const ICE_CONSTANTS: IceConstants = { latentHeat: LATENT_HEAT_OF_FUSION_OF_ICE, specificHeat: SPECIFIC_HEAT_OF_WATER };

export interface IceSplit {
  /** Ice at 0 °C, g. */
  ice: number;
  /** Tap water, g. */
  tapWater: number;
  /** Ice per gram of total water. */
  iceShare: number;
}

/**
 * How much of `water` grams must be ice (at 0 °C) so that tap water at `tap` °C and the ice
 * together come to `target` °C. No ice when the tap is already cold enough. Throws when the
 * target is below 0 °C (ice at 0 °C cannot bring water below 0 °C).
 */
export function computeIce(water: number, tap: number, target: number, k: IceConstants = ICE_CONSTANTS): IceSplit {
  requireFinite('water weight', water);
  requireFinite('tap water temperature', tap);
  requireFinite('water temperature', target);
  if (water < 0) throw new TemperatureError(`water weight must be 0 g or more; got ${water} g`);
  if (target < 0) throw unreachable(target, 'C');
  if (target >= tap) return { ice: 0, tapWater: water, iceShare: 0 };
  const share = (tap - target) / (tap + k.latentHeat / k.specificHeat);
  return { ice: water * share, tapWater: water - water * share, iceShare: share };
}

export interface WaterPlanInputs extends DoughTemperatureInputs {
  /** Tap water temperature, °C; with `waterGrams`, the ice is worked out. */
  tap?: number;
  /** All the water the dough takes, g. */
  waterGrams?: number;
}

export interface WaterPlan {
  /** °C */
  waterTemperature: number;
  factors: number;
  /** n × rise, in the sum above. */
  frictionFactor: number;
  /** g; null when the tap temperature or the water weight is not given. */
  ice: number | null;
  /** g; null likewise. */
  tapWater: number | null;
  /** Ice per gram of water; null without a tap temperature. */
  iceShare: number | null;
  /** Cautions for the bench (ice, hot water). */
  warnings: string[];
}

/**
 * Water temperature and, given the tap, the ice. All temperatures in °C; `unit` is the scale the
 * messages speak. Throws when the target cannot be reached.
 */
export function planWater(i: WaterPlanInputs, unit: 'C' | 'F' = 'C'): WaterPlan {
  const w = computeWaterTemperature(i);
  const t = (c: number) => describeTemperature(c, unit);
  const warnings: string[] = [];
  if (w.water < 0) throw unreachable(w.water, unit);
  if (w.water > HOT_WATER_CELSIUS) {
    warnings.push(
      `the water would have to be ${t(w.water)}: hot enough to scald and to harm the yeast; check the inputs, or warm the flour or the room instead`,
    );
  } else if (w.water > WARM_WATER_CELSIUS) {
    warnings.push(`the water will be ${t(w.water)}, ${WARM_WATER_ADVICE}`);
  }
  let ice: number | null = null;
  let tapWater: number | null = null;
  let iceShare: number | null = null;
  if (i.tap !== undefined) {
    const split = computeIce(i.waterGrams ?? 0, i.tap, w.water);
    iceShare = split.iceShare;
    if (i.waterGrams !== undefined) {
      ice = split.ice;
      tapWater = split.tapWater;
    }
    if (split.iceShare > 0) {
      warnings.push('use clean food-grade ice, weigh it with the water, and let it melt in the mix; count it as part of the water');
    } else if (w.water > i.tap) {
      warnings.push(`the water must be warmer than the tap (${t(i.tap)}): warm it to ${t(w.water)}`);
    }
  }
  return { waterTemperature: w.water, factors: w.factors, frictionFactor: w.frictionFactor, ice, tapWater, iceShare, warnings };
}
