// The units a person reads the viewer in: metric (g, kg, °C) or US customary (oz, lb, °F), with
// the CLI's exact conversions and rounding (shared/units.ts formatMass, formatTemperature).
// Kept on this device (localStorage, so the first paint is right) and on the account (the app
// shell copies the account's choice here once it is known, so every device follows it).
import { useMemo, useSyncExternalStore } from 'react';
import { celsiusDeltaToFahrenheit, celsiusToFahrenheit, fahrenheitDeltaToCelsius, fahrenheitToCelsius, formatMass, formatTemperature, isUnitSystem, temperatureUnitOf, type TemperatureUnit, type UnitSystem } from '#shared/units';
import { celsius, grams, pieceWeight, weight } from './format.ts';

const KEY = 'panform.units';
const listeners = new Set<() => void>();
let current: UnitSystem | null = null;

function read(): UnitSystem {
  if (current) return current;
  let stored: string | null = null;
  try {
    stored = typeof localStorage === 'undefined' ? null : localStorage.getItem(KEY);
  } catch {
    // Storage refused (private mode): metric until the account says otherwise.
  }
  current = isUnitSystem(stored) ? stored : 'metric';
  return current;
}

/** Remember the choice on this device and redraw every figure. */
export function setDeviceUnitSystem(system: UnitSystem): void {
  if (system === read()) return;
  current = system;
  try {
    localStorage.setItem(KEY, system);
  } catch {
    // Not kept on the device; the account still has it.
  }
  for (const l of listeners) l();
}

function subscribe(listener: () => void): () => void {
  listeners.add(listener);
  return () => listeners.delete(listener);
}

export interface Units {
  system: UnitSystem;
  /** An ingredient line: "1 234 g" or "2 lb 11.53 oz". */
  grams: (g: number) => string;
  /** A large total: "28.5 kg" or "62 lb 13.28 oz". */
  weight: (g: number) => string;
  /** A piece: "320 g" or "11.29 oz". */
  pieceWeight: (g: number) => string;
  /** A temperature given in °C, shown in °C or °F. */
  temperature: (c: number, decimals?: number) => string;
  /** A temperature difference (a mixer's friction) given in °C-degrees: ×1.8 for °F, no offset. */
  degrees: (dc: number) => string;
}

export function unitsFor(system: UnitSystem): Units {
  if (system === 'metric') return { system, grams, weight, pieceWeight, temperature: celsius, degrees: (dc) => `${Number(dc.toFixed(1))} °C` };
  const us = (g: number) => formatMass(g, 'us');
  return {
    system,
    grams: us,
    weight: us,
    pieceWeight: us,
    temperature: (c, decimals = 1) => formatTemperature(c, temperatureUnitOf(system), decimals),
    degrees: (dc) => `${Number(celsiusDeltaToFahrenheit(dc).toFixed(1))} °F`,
  };
}

/** A temperature typed into a form in °C or °F (`temperatureUnitOf` the person's units), kept in °C. */
export interface TemperatureInput {
  unit: 'C' | 'F';
  /** The typed number → °C (to 0.01 °C, so a typed °F figure comes back as typed). */
  fromTyped: (v: number) => number;
  /** A kept °C → the figure to show in the field (to 0.1 °F). */
  toTyped: (c: number | null | undefined) => number | null | undefined;
  /** "0 to 60 °C" or "32 to 140 °F", for a message. */
  range: (loC: number, hiC: number) => string;
  /** A typed difference (a mixer's rise, in °F-degrees for US customary) → °C-degrees. */
  deltaFromTyped: (v: number) => number;
  /** °C-degrees → the difference to show in the field. */
  deltaToTyped: (dc: number) => number;
}

export function temperatureInput(unit: TemperatureUnit): TemperatureInput {
  if (unit === 'C') {
    return { unit: 'C', fromTyped: (v) => v, toTyped: (c) => c, range: (lo, hi) => `${lo} to ${hi} °C`, deltaFromTyped: (v) => v, deltaToTyped: (dc) => dc };
  }
  return {
    unit: 'F',
    fromTyped: (v) => Math.round(fahrenheitToCelsius(v) * 100) / 100,
    toTyped: (c) => (c == null ? c : Math.round(celsiusToFahrenheit(c) * 10) / 10),
    range: (lo, hi) => `${celsiusToFahrenheit(lo)} to ${celsiusToFahrenheit(hi)} °F`,
    deltaFromTyped: (v) => Math.round(fahrenheitDeltaToCelsius(v) * 100) / 100,
    deltaToTyped: (dc) => Math.round(celsiusDeltaToFahrenheit(dc) * 100) / 100,
  };
}

export function useUnitSystem(): UnitSystem {
  return useSyncExternalStore(subscribe, read, () => 'metric');
}

export function useUnits(): Units {
  const system = useUnitSystem();
  return useMemo(() => unitsFor(system), [system]);
}
