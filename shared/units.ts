// Units of weight, temperature, percent and time, as bakers write them. Pure; no I/O.
//
// Exact definitions (International yard and pound agreement, 1959; NIST SP 811 App. B.8):
//   1 lb = 453.592 37 g exactly; 1 oz = 1/16 lb = 28.349 523 125 g exactly.
// Temperatures: t/°F = 1.8·t/°C + 32. A temperature *difference* (a mixer's friction) converts
// by the factor 5/9 alone, without the offset.

export const GRAMS_PER_POUND = 453.59237;
export const GRAMS_PER_OUNCE = GRAMS_PER_POUND / 16;

export type MassUnit = 'g' | 'kg' | 'oz' | 'lb';
export type TemperatureUnit = 'C' | 'F';
export type UnitSystem = 'metric' | 'us';

export const MASS_UNITS: readonly MassUnit[] = ['g', 'kg', 'oz', 'lb'];
export const UNIT_SYSTEMS: readonly UnitSystem[] = ['metric', 'us'];
export const isUnitSystem = (v: unknown): v is UnitSystem => (UNIT_SYSTEMS as readonly unknown[]).includes(v);
/** °F goes with US customary weights, °C with metric. */
export const temperatureUnitOf = (system: UnitSystem): TemperatureUnit => (system === 'us' ? 'F' : 'C');
const GRAMS_PER: Record<MassUnit, number> = { g: 1, kg: 1000, oz: GRAMS_PER_OUNCE, lb: GRAMS_PER_POUND };

/** A problem with a value as written; `expected` says what would have been accepted. */
export class QuantityError extends Error {
  constructor(
    message: string,
    readonly expected: string,
  ) {
    super(message);
    this.name = 'QuantityError';
  }
}

export function toGrams(value: number, unit: MassUnit): number {
  return value * GRAMS_PER[unit];
}
export function fromGrams(grams: number, unit: MassUnit): number {
  return grams / GRAMS_PER[unit];
}
export function convertMass(value: number, from: MassUnit, to: MassUnit): number {
  return from === to ? value : fromGrams(toGrams(value, from), to);
}

export function celsiusToFahrenheit(c: number): number {
  return c * 1.8 + 32;
}
export function fahrenheitToCelsius(f: number): number {
  return (f - 32) / 1.8;
}
/** A temperature difference in °F as °C-degrees: 5/9, no offset. */
export function fahrenheitDeltaToCelsius(df: number): number {
  return df / 1.8;
}
export function celsiusDeltaToFahrenheit(dc: number): number {
  return dc * 1.8;
}

const NUMBER = '(-?[0-9]+(?:\\.[0-9]+)?)';
const MASS_RE = new RegExp(`^\\s*${NUMBER}\\s*(g|kg|oz|lb)\\s*$`, 'i');
const TEMPERATURE_RE = new RegExp(`^\\s*${NUMBER}\\s*°?\\s*(C|F)\\s*$`, 'i');
const TEMPERATURE_RANGE_RE = new RegExp(`^\\s*${NUMBER}\\s*(?:[-–]\\s*${NUMBER}\\s*)?°?\\s*(C|F)\\s*$`, 'i');
const PERCENT_RE = new RegExp(`^\\s*${NUMBER}\\s*%?\\s*$`);
const RANGE_RE = /^\s*([0-9]+(?:\.[0-9]+)?)\s*(?:[-–]\s*([0-9]+(?:\.[0-9]+)?))?\s*$/;

/** "320 g", "0.32 kg", "11 oz", "2 lb" → grams. A bare number is refused: a weight needs its unit. */
export function parseMass(text: string | number): number {
  if (typeof text === 'string') {
    const m = MASS_RE.exec(text);
    if (m) {
      const unit = m[2].toLowerCase() as MassUnit;
      return toGrams(Number(m[1]), unit);
    }
  }
  throw new QuantityError(
    `not a weight: ${JSON.stringify(text)}`,
    'a number and a unit, one of g, kg, oz, lb (e.g. "320 g")',
  );
}

export interface Temperature {
  value: number;
  unit: TemperatureUnit;
}

/** "25 °C", "77°F", "25 C" → °C. */
export function parseTemperature(text: string | number): number {
  const t = parseTemperatureWithUnit(text);
  return t.unit === 'C' ? t.value : fahrenheitToCelsius(t.value);
}

export function parseTemperatureWithUnit(text: string | number): Temperature {
  if (typeof text === 'string') {
    const m = TEMPERATURE_RE.exec(text);
    if (m) return { value: Number(m[1]), unit: m[2].toUpperCase() as TemperatureUnit };
  }
  throw new QuantityError(
    `not a temperature: ${JSON.stringify(text)}`,
    'a number and °C or °F (e.g. "25 °C")',
  );
}

/** "25 °C" → {25, 25}; "25-26 °C" or "77–79 °F" → a range in °C, smaller end first. */
export function parseTemperatureRange(text: string | number): NumberRange {
  if (typeof text === 'string') {
    const m = TEMPERATURE_RANGE_RE.exec(text);
    if (m) {
      const c = (v: number) => (m[3].toUpperCase() === 'C' ? v : fahrenheitToCelsius(v));
      const a = c(Number(m[1]));
      const b = m[2] === undefined ? a : c(Number(m[2]));
      if (b >= a) return { min: a, max: b };
      throw new QuantityError(`temperature range runs backwards: ${JSON.stringify(text)}`, 'the lower temperature first (e.g. "25-26 °C")');
    }
  }
  throw new QuantityError(`not a temperature or range: ${JSON.stringify(text)}`, 'a temperature such as "25 °C" or a range such as "25-26 °C"');
}

/** The middle of a range: what a range of temperatures is aimed at. */
export function middleOf(r: NumberRange): number {
  return (r.min + r.max) / 2;
}

/** "25 °C", or "25–26 °C" for a range. */
export function formatTemperatureRange(r: NumberRange, unit: TemperatureUnit = 'C', decimals = 1): string {
  if (r.min === r.max) return formatTemperature(r.min, unit, decimals);
  const v = (c: number) => (unit === 'C' ? c : celsiusToFahrenheit(c)).toFixed(decimals);
  return `${v(r.min)}–${v(r.max)} °${unit}`;
}

/** A temperature difference such as a mixer's friction: "13 °C" → 13; "20 °F" → 11.11 (no offset). */
export function parseTemperatureDelta(text: string | number): number {
  const t = parseTemperatureWithUnit(text);
  return t.unit === 'C' ? t.value : fahrenheitDeltaToCelsius(t.value);
}

/** "4 °C/min" → 4; "7.2 °F/min" → 4 (°C per minute). */
export function parseRate(text: string): number {
  const m = /^\s*([0-9]+(?:\.[0-9]+)?)\s*°?\s*(C|F)\s*\/\s*min\s*$/i.exec(text);
  if (!m) throw new QuantityError(`not a rate of temperature change: ${JSON.stringify(text)}`, 'degrees per minute (e.g. "4 °C/min")');
  const v = Number(m[1]);
  return m[2].toUpperCase() === 'C' ? v : fahrenheitDeltaToCelsius(v);
}

/** "2 %" or 2 → 2 (percent, not a fraction). */
export function parsePercent(text: string | number): number {
  if (typeof text === 'number' && Number.isFinite(text)) return text;
  if (typeof text === 'string') {
    const m = PERCENT_RE.exec(text);
    if (m) return Number(m[1]);
  }
  throw new QuantityError(`not a percentage: ${JSON.stringify(text)}`, 'a number with % (e.g. "2 %")');
}

export interface NumberRange {
  min: number;
  max: number;
}

/** 12, "12", "10-14", "10–14" → {min, max}. */
export function parseRange(text: string | number): NumberRange {
  if (typeof text === 'number' && Number.isFinite(text) && text >= 0) return { min: text, max: text };
  if (typeof text === 'string') {
    const m = RANGE_RE.exec(text);
    if (m) {
      const a = Number(m[1]);
      const b = m[2] === undefined ? a : Number(m[2]);
      if (b >= a) return { min: a, max: b };
      throw new QuantityError(`range runs backwards: ${JSON.stringify(text)}`, 'the smaller number first (e.g. "10-14")');
    }
  }
  throw new QuantityError(`not a number or range: ${JSON.stringify(text)}`, 'a number or a range such as "10-14"');
}

export type RangePick = 'short' | 'mid' | 'long';
export function pickFromRange(r: NumberRange, pick: RangePick = 'mid'): number {
  return pick === 'short' ? r.min : pick === 'long' ? r.max : (r.min + r.max) / 2;
}

/**
 * Command-line weight: "28.47 kg", "900g", "2 lb"; a bare number is grams.
 */
export function parseMassArgument(text: string): number {
  if (/^\s*[0-9]+(\.[0-9]+)?\s*$/.test(text)) return Number(text);
  return parseMass(text);
}

/** Command-line temperature: "25", "25C", "77 °F"; a bare number is in `defaultUnit`. */
export function parseTemperatureArgument(text: string, defaultUnit: TemperatureUnit = 'C'): number {
  if (/^\s*-?[0-9]+(\.[0-9]+)?\s*$/.test(text)) {
    const v = Number(text);
    return defaultUnit === 'C' ? v : fahrenheitToCelsius(v);
  }
  return parseTemperature(text);
}

export function parseTemperatureDeltaArgument(text: string, defaultUnit: TemperatureUnit = 'C'): number {
  if (/^\s*-?[0-9]+(\.[0-9]+)?\s*$/.test(text)) {
    const v = Number(text);
    return defaultUnit === 'C' ? v : fahrenheitDeltaToCelsius(v);
  }
  return parseTemperatureDelta(text);
}

// ---- display rounding (only ever when printed) ------------------------------------------

export interface Resolution {
  /** Step for lines at or above `fineBelow` grams; default 1 g. */
  coarse: number;
  /** Step for lines below `fineBelow`; default 0.1 g. */
  fine: number;
  fineBelow: number;
}
export const DEFAULT_RESOLUTION: Resolution = { coarse: 1, fine: 0.1, fineBelow: 100 };

/**
 * A scale resolution as written on the command line: "1", "1,0.1" or "1,0.1,100" (coarse step,
 * fine step, and the weight in grams below which the fine step applies).
 */
export function parseResolution(text: string): Resolution {
  const parts = text.split(',').map((p) => p.trim());
  const nums = parts.map(Number);
  if (parts.length < 1 || parts.length > 3 || parts.some((p) => p === '') || nums.some((n) => !Number.isFinite(n) || n <= 0)) {
    throw new QuantityError(`not a scale resolution: ${JSON.stringify(text)}`, 'grams above 0: "1", "1,0.1" or "1,0.1,100" (step, fine step, fine below)');
  }
  return {
    coarse: nums[0],
    fine: nums[1] ?? Math.min(nums[0], DEFAULT_RESOLUTION.fine),
    fineBelow: nums[2] ?? DEFAULT_RESOLUTION.fineBelow,
  };
}

function decimalsOf(step: number): number {
  const s = String(step);
  const i = s.indexOf('.');
  return i < 0 ? 0 : s.length - i - 1;
}

/** Rounds to the scale's resolution: 1 g, and 0.1 g below 100 g unless configured. */
export function roundGrams(grams: number, res: Resolution = DEFAULT_RESOLUTION): number {
  const step = Math.abs(grams) < res.fineBelow ? res.fine : res.coarse;
  const r = Math.round(grams / step) * step;
  return Number(r.toFixed(decimalsOf(step)));
}

/** "1 234 g", "56.3 g", or in kg for large amounts when `kgFrom` is set. */
export function formatGrams(grams: number, res: Resolution = DEFAULT_RESOLUTION): string {
  const step = Math.abs(grams) < res.fineBelow ? res.fine : res.coarse;
  const r = roundGrams(grams, res);
  return `${groupThousands(r.toFixed(decimalsOf(step)))} g`;
}

export function formatMass(grams: number, system: UnitSystem, res: Resolution = DEFAULT_RESOLUTION): string {
  if (system === 'metric') return formatGrams(grams, res);
  const sign = grams < 0 ? '-' : '';
  const totalOz = Math.abs(grams) / GRAMS_PER_OUNCE;
  // Under 1 oz: three decimals (yeast, spices); otherwise hundredths, carried into pounds so
  // that 15.999 oz prints as 1 lb 0.00 oz, never as 16.00 oz.
  if (totalOz < 1) return `${sign}${totalOz.toFixed(3)} oz`;
  const hundredths = Math.round(totalOz * 100);
  const lb = Math.floor(hundredths / 1600);
  const ozText = ((hundredths - lb * 1600) / 100).toFixed(2);
  return lb > 0 ? `${sign}${lb} lb ${ozText} oz` : `${sign}${ozText} oz`;
}

/**
 * A weight in its own unit, rounded as a person reads it: grams to the scale's resolution
 * (1 g, 0.1 g below 100 g), kilograms and pounds to the thousandth (about a gram and half a gram),
 * ounces to the hundredth (three decimals under 1 oz, as formatMass prints them).
 */
export function roundMassIn(value: number, unit: MassUnit): number {
  if (unit === 'g') return roundGrams(value);
  const decimals = unit === 'oz' ? (Math.abs(value) < 1 ? 3 : 2) : 3;
  return Number(value.toFixed(decimals));
}

/** A temperature or temperature difference to a tenth of a degree, as thermometers show it. */
export function roundDegrees(value: number): number {
  return Number(value.toFixed(1));
}

function groupThousands(s: string): string {
  const [int, frac] = s.split('.');
  const neg = int.startsWith('-');
  const digits = neg ? int.slice(1) : int;
  const grouped = digits.replace(/\B(?=(\d{3})+(?!\d))/g, '\u202f');
  return (neg ? '-' : '') + grouped + (frac !== undefined ? `.${frac}` : '');
}

export function formatTemperature(celsius: number, unit: TemperatureUnit = 'C', decimals = 1): string {
  const v = unit === 'C' ? celsius : celsiusToFahrenheit(celsius);
  return `${v.toFixed(decimals)} °${unit}`;
}

export function formatPercent(p: number, decimals = 1): string {
  return `${Number(p.toFixed(decimals))} %`;
}
