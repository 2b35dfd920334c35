// Number formats for printed tables. Rounding happens here, at the edge, and nowhere else.
import { formatMass, formatTemperature, type Resolution, type TemperatureUnit, type UnitSystem } from '#shared/units';

export interface PrintUnits {
  system: UnitSystem;
  resolution: Resolution;
  temperature: TemperatureUnit;
}

export function weight(grams: number, u: PrintUnits): string {
  return formatMass(grams, u.system, u.resolution);
}

/** A baker's percentage: up to three decimals, trailing zeros dropped ("0.35 %", "100 %"). */
export function percent(p: number, decimals = 3): string {
  return `${Number(p.toFixed(decimals))} %`;
}

export function temperature(celsius: number, u: PrintUnits): string {
  return formatTemperature(celsius, u.temperature, 1);
}

/** A temperature difference (friction) in the printing scale's degrees. */
export function temperatureDelta(celsiusDegrees: number, u: PrintUnits): string {
  const v = u.temperature === 'C' ? celsiusDegrees : celsiusDegrees * 1.8;
  return `${v.toFixed(1)} °${u.temperature}`;
}
