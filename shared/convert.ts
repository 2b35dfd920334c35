// Conversions a bench asks for: weights (g, kg, oz, lb), temperatures (°C, °F) and yeast
// (fresh, active dry, instant). Pure; no I/O.
//
// Yeast: one factor per type against fresh yeast, the grams of that yeast that replace 1 g of
// fresh yeast; every pair is derived from those two factors, so a round trip is the identity.
// Defaults from Hamelman, "Bread: A Baker's Book of Techniques and Recipes" (Wiley, 2004),
// "Yeast conversions: fresh to dry": active dry × 0.4, instant × 0.33. A catalog entry of kind
// yeast may set its own `yeast_factor`.
import type { Catalog } from './model.ts';
import type { YeastType } from './schema/shapes.ts';
import { YEAST_TYPES } from './schema/vocabulary.ts';
import { celsiusToFahrenheit, convertMass, fahrenheitToCelsius, MASS_UNITS, type MassUnit, type TemperatureUnit } from './units.ts';

export type YeastFactors = Record<YeastType, number>;

export const HAMELMAN_YEAST_FACTORS: Readonly<YeastFactors> = Object.freeze({ fresh: 1, 'active-dry': 0.4, instant: 0.33 });
export const YEAST_FACTORS_SOURCE = "Hamelman, Bread (Wiley 2004), \"Yeast conversions: fresh to dry\"";

export class ConvertError extends Error {
  constructor(
    message: string,
    readonly expected?: string,
  ) {
    super(message);
    this.name = 'ConvertError';
  }
}

/** The yeast factors, with any `yeast_factor` the catalog sets. Two entries of one type that disagree are an error. */
export function yeastFactorsFrom(catalog: Catalog | undefined): { factors: YeastFactors; fromCatalog: YeastType[] } {
  const factors: YeastFactors = { ...HAMELMAN_YEAST_FACTORS };
  const setBy = new Map<YeastType, string>();
  for (const item of Object.values(catalog ?? {})) {
    if (item.yeast === undefined || item.yeastFactor === undefined) continue;
    const before = setBy.get(item.yeast);
    if (before !== undefined && factors[item.yeast] !== item.yeastFactor) {
      throw new ConvertError(
        `the catalog gives two factors for ${item.yeast} yeast: ${factors[item.yeast]} ("${before}") and ${item.yeastFactor} ("${item.name}")`,
        'one yeast_factor per yeast type',
      );
    }
    if (!(item.yeastFactor > 0) || !Number.isFinite(item.yeastFactor)) {
      throw new ConvertError(`yeast_factor of "${item.name}" must be above 0; got ${item.yeastFactor}`);
    }
    factors[item.yeast] = item.yeastFactor;
    setBy.set(item.yeast, item.name);
  }
  return { factors, fromCatalog: [...setBy.keys()] };
}

/** Grams of `to` yeast that replace `grams` of `from` yeast. */
export function convertYeast(grams: number, from: YeastType, to: YeastType, factors: YeastFactors = HAMELMAN_YEAST_FACTORS): number {
  if (from === to) return grams;
  return (grams / factors[from]) * factors[to];
}

export function yeastRatio(from: YeastType, to: YeastType, factors: YeastFactors = HAMELMAN_YEAST_FACTORS): number {
  return from === to ? 1 : factors[to] / factors[from];
}

// ---- unit names as people type them ----------------------------------------------------

const MASS_NAMES: Record<string, MassUnit> = {
  g: 'g', gram: 'g', grams: 'g', gr: 'g',
  kg: 'kg', kilo: 'kg', kilos: 'kg', kilogram: 'kg', kilograms: 'kg',
  oz: 'oz', ounce: 'oz', ounces: 'oz',
  lb: 'lb', lbs: 'lb', pound: 'lb', pounds: 'lb',
};
const TEMPERATURE_NAMES: Record<string, TemperatureUnit> = {
  c: 'C', '°c': 'C', celsius: 'C', f: 'F', '°f': 'F', fahrenheit: 'F',
};
const YEAST_NAMES: Record<string, YeastType> = {
  fresh: 'fresh', compressed: 'fresh', cake: 'fresh',
  'active-dry': 'active-dry', 'active dry': 'active-dry', activedry: 'active-dry', ady: 'active-dry',
  instant: 'instant', idy: 'instant', 'instant-dry': 'instant',
};

export type UnitKind = 'mass' | 'temperature' | 'yeast';
export type ParsedUnit =
  | { kind: 'mass'; unit: MassUnit }
  | { kind: 'temperature'; unit: TemperatureUnit }
  | { kind: 'yeast'; unit: YeastType };

const UNIT_CHOICES = `weights ${MASS_UNITS.join(', ')}; temperatures C, F; yeast ${YEAST_TYPES.join(', ')}`;

export function parseUnit(text: string): ParsedUnit {
  const key = text.trim().toLowerCase().replace(/\s+/g, ' ').replace(/^° /, '°');
  if (key in MASS_NAMES) return { kind: 'mass', unit: MASS_NAMES[key] };
  if (key in TEMPERATURE_NAMES) return { kind: 'temperature', unit: TEMPERATURE_NAMES[key] };
  if (key in YEAST_NAMES) return { kind: 'yeast', unit: YEAST_NAMES[key] };
  throw new ConvertError(`unknown unit "${text}"`, UNIT_CHOICES);
}

export type Conversion =
  | { kind: 'mass'; value: number; from: MassUnit; to: MassUnit; result: number; factor: number }
  | { kind: 'temperature'; value: number; from: TemperatureUnit; to: TemperatureUnit; result: number }
  | {
      kind: 'yeast';
      value: number;
      /** The weight unit of both value and result. */
      unit: MassUnit;
      from: YeastType;
      to: YeastType;
      result: number;
      factor: number;
      factors: YeastFactors;
    };

export interface ConvertRequest {
  value: number;
  /** Two unit words ("lb", "g") or three for yeast ("g", "fresh", "instant"). */
  units: readonly string[];
  yeastFactors?: YeastFactors;
}

/** `2 lb g`, `26 C F`, `10 g fresh instant` (also `10 fresh instant`, grams). */
export function convert(req: ConvertRequest): Conversion {
  const { value } = req;
  if (!Number.isFinite(value)) throw new ConvertError(`not a number: ${value}`, 'a number such as 2 or 26.5');
  const parsed = req.units.map(parseUnit);
  let massUnit: MassUnit = 'g';
  let pair = parsed;
  if (parsed.length === 3) {
    const [w, a, b] = parsed;
    if (w.kind !== 'mass' || a.kind !== 'yeast' || b.kind !== 'yeast') {
      throw new ConvertError(`three units mean a yeast conversion: a weight unit, then two yeast types; got ${req.units.join(' ')}`, 'e.g. "10 g fresh instant"');
    }
    massUnit = w.unit;
    pair = [a, b];
  } else if (parsed.length !== 2) {
    throw new ConvertError(`give a value and two units (three for yeast); got ${req.units.length} unit(s)`, 'e.g. "2 lb g", "26 C F", "10 g fresh instant"');
  }
  const [from, to] = pair;
  if (from.kind !== to.kind) {
    const what = (k: UnitKind) => (k === 'mass' ? 'a weight' : k === 'temperature' ? 'a temperature' : 'yeast');
    throw new ConvertError(`cannot convert ${what(from.kind)} (${from.unit}) to ${what(to.kind)} (${to.unit})`, UNIT_CHOICES);
  }
  if (from.kind === 'mass' && to.kind === 'mass') {
    if (value < 0) throw new ConvertError(`a weight cannot be negative; got ${value}`);
    return { kind: 'mass', value, from: from.unit, to: to.unit, result: convertMass(value, from.unit, to.unit), factor: convertMass(1, from.unit, to.unit) };
  }
  if (from.kind === 'temperature' && to.kind === 'temperature') {
    const c = from.unit === 'C' ? value : fahrenheitToCelsius(value);
    return { kind: 'temperature', value, from: from.unit, to: to.unit, result: to.unit === 'C' ? c : from.unit === 'F' ? value : celsiusToFahrenheit(c) };
  }
  if (from.kind === 'yeast' && to.kind === 'yeast') {
    if (value < 0) throw new ConvertError(`a weight cannot be negative; got ${value}`);
    const factors = req.yeastFactors ?? { ...HAMELMAN_YEAST_FACTORS };
    return {
      kind: 'yeast',
      value,
      unit: massUnit,
      from: from.unit,
      to: to.unit,
      result: convertYeast(value, from.unit, to.unit, factors),
      factor: yeastRatio(from.unit, to.unit, factors),
      factors,
    };
  }
  throw new ConvertError('unsupported conversion');
}
