// `panform temp`: the water temperature for a desired dough temperature, the ice when the tap is
// too warm, or (with --measured) a mixer's friction worked back from a measured dough.
// A thin shell over shared/temperature.ts.
import { Command } from 'commander';
import { computeFriction, planWater, TemperatureError, type WaterPlan } from '#shared/temperature';
import {
  celsiusDeltaToFahrenheit, celsiusToFahrenheit, parseMassArgument, parseTemperatureArgument, parseTemperatureDeltaArgument, QuantityError,
  type TemperatureUnit,
} from '#shared/units';
import { InputError, UsageError } from '../errors.ts';
import { fitText } from '../print/width.ts';
import type { TempData } from '../print/temp.ts';

interface RawOptions {
  ddt?: string;
  room?: string;
  flour?: string;
  friction?: string;
  rise?: string;
  preferment?: string[];
  tap?: string;
  water?: string;
  measured?: string;
  waterTemp?: string;
  fahrenheit?: boolean;
  json?: boolean;
}

export type TempOptions =
  | {
      mode: 'water';
      unit: TemperatureUnit;
      json: boolean;
      /** All °C; the rise in °C-degrees. */
      ddt: number;
      room: number;
      flour: number;
      /** The mixer's rise: --rise, or --friction (a straight-dough friction factor) ÷ 3. */
      rise: number;
      preferments: number[];
      tap?: number;
      waterGrams?: number;
    }
  | {
      mode: 'friction';
      unit: TemperatureUnit;
      json: boolean;
      measured: number;
      room: number;
      flour: number;
      water: number;
      preferments: number[];
    };

function temperatureFlag(flag: string, text: string, unit: TemperatureUnit, delta = false): number {
  try {
    return delta ? parseTemperatureDeltaArgument(text, unit) : parseTemperatureArgument(text, unit);
  } catch (e) {
    if (e instanceof QuantityError) throw new UsageError(`${flag}: ${e.message}`, `expected ${e.expected}; a bare number is °${unit}`);
    throw e;
  }
}

function requireFlags(o: RawOptions, names: (keyof RawOptions)[], why: string): void {
  const flag = (k: string) => `--${k.replace(/[A-Z]/g, (c) => `-${c.toLowerCase()}`)}`;
  const missing = names.filter((k) => o[k] === undefined).map(flag);
  if (missing.length > 0) throw new UsageError(`${why} needs ${missing.join(', ')}`, 'see `panform temp --help` for an example');
}

export function toTempOptions(o: RawOptions): TempOptions {
  const unit: TemperatureUnit = o.fahrenheit ? 'F' : 'C';
  const t = (flag: string, v: string) => temperatureFlag(flag, v, unit);
  const preferments = (o.preferment ?? []).map((v) => t('--preferment', v));
  if (o.measured !== undefined) {
    if (o.ddt !== undefined || o.friction !== undefined || o.rise !== undefined || o.tap !== undefined || o.water !== undefined) {
      throw new UsageError('--measured works the friction out; it cannot be used with --ddt, --friction, --rise, --tap or --water');
    }
    requireFlags(o, ['room', 'flour', 'waterTemp'], 'working out the friction');
    return {
      mode: 'friction', unit, json: !!o.json, preferments,
      measured: t('--measured', o.measured), room: t('--room', o.room!), flour: t('--flour', o.flour!), water: t('--water-temp', o.waterTemp!),
    };
  }
  if (o.waterTemp !== undefined) throw new UsageError('--water-temp goes with --measured (to work out the friction)');
  if (o.friction !== undefined && o.rise !== undefined) throw new UsageError('give --friction or --rise, not both', '--rise 4.3 is the same mixer as --friction 13 (13 ÷ 3)');
  requireFlags(o, ['ddt', 'room', 'flour', o.rise !== undefined ? 'rise' : 'friction'], 'the water temperature');
  if (o.water !== undefined && o.tap === undefined) throw new UsageError('--water needs --tap (the ice depends on the tap water temperature)');
  let waterGrams: number | undefined;
  if (o.water !== undefined) {
    const text = o.water.trim();
    try {
      waterGrams = text.startsWith('-') ? NaN : parseMassArgument(text);
    } catch (e) {
      if (e instanceof QuantityError) throw new UsageError(`--water: ${e.message}`, `expected ${e.expected}, or a bare number of grams`);
      throw e;
    }
    if (!(waterGrams >= 0) || !Number.isFinite(waterGrams)) throw new UsageError(`--water must be a weight of 0 or more; got ${text}`);
  }
  return {
    mode: 'water', unit, json: !!o.json, preferments,
    ddt: t('--ddt', o.ddt!), room: t('--room', o.room!), flour: t('--flour', o.flour!),
    rise: o.rise !== undefined ? temperatureFlag('--rise', o.rise, unit, true) : temperatureFlag('--friction', o.friction!, unit, true) / 3,
    tap: o.tap === undefined ? undefined : t('--tap', o.tap),
    waterGrams,
  };
}

export type { TempData } from '../print/temp.ts';

export function collectTemp(o: TempOptions): TempData {
  const out = (c: number) => (o.unit === 'C' ? c : celsiusToFahrenheit(c));
  const outDelta = (c: number) => (o.unit === 'C' ? c : celsiusDeltaToFahrenheit(c));
  if (o.mode === 'friction') {
    const r = computeFriction({ measured: o.measured, room: o.room, flour: o.flour, water: o.water, preferments: o.preferments });
    return {
      unit: o.unit, mode: 'friction', factors: r.factors, desiredDoughTemperature: null,
      room: out(o.room), flour: out(o.flour), preferments: o.preferments.map(out),
      rise: outDelta(r.rise), friction: outDelta(r.frictionFactor), straightDoughFriction: outDelta(r.straightDoughFactor),
      waterTemperature: out(o.water), measured: out(o.measured), tap: null, water: null, ice: null, tapWater: null, iceShare: null,
      warnings: r.rise < 0 ? ['the friction works out below zero: check the measured temperatures'] : [],
    };
  }
  let plan: WaterPlan;
  try {
    plan = planWater({ ddt: o.ddt, room: o.room, flour: o.flour, rise: o.rise, preferments: o.preferments, tap: o.tap, waterGrams: o.waterGrams }, o.unit);
  } catch (e) {
    if (e instanceof TemperatureError) throw new InputError(e.message);
    throw e;
  }
  return {
    unit: o.unit, mode: 'water', factors: plan.factors, desiredDoughTemperature: out(o.ddt),
    room: out(o.room), flour: out(o.flour), preferments: o.preferments.map(out),
    rise: outDelta(o.rise), friction: outDelta(plan.frictionFactor), straightDoughFriction: outDelta(o.rise * 3),
    waterTemperature: out(plan.waterTemperature), measured: null,
    tap: o.tap === undefined ? null : out(o.tap), water: o.waterGrams ?? null,
    ice: plan.ice, tapWater: plan.tapWater, iceShare: plan.iceShare, warnings: plan.warnings,
  };
}

export const command = new Command('temp')
  .description('Water temperature (and ice) for a desired dough temperature, or a mixer\'s friction from a measured dough.')
  .option('--ddt <t>', 'desired dough temperature')
  .option('--room <t>', 'room temperature')
  .option('--flour <t>', 'flour temperature')
  .option('--friction <t>', 'the mixer\'s friction factor found on a straight dough (3 factors); its rise is a third of it (°C-degrees, or °F-degrees with --fahrenheit)')
  .option('--rise <t>', 'the mixer\'s rise: how much warmer dough comes off it than its ingredients\' average (instead of --friction)')
  .option('--preferment <t>', 'a pre-ferment\'s temperature; repeat for each pre-ferment', (v: string, prev: string[] = []) => [...prev, v])
  .option('--tap <t>', 'tap water temperature (for the ice)')
  .option('--water <weight>', 'all the water the dough takes, e.g. "6.5 kg" or grams (for the ice)')
  .option('--measured <t>', 'a measured dough temperature: work the friction out instead (with --water-temp)')
  .option('--water-temp <t>', 'the water temperature used for the measured dough')
  .option('--fahrenheit', 'bare numbers are °F (friction in °F-degrees); results in °F')
  .option('--json', 'print the result as JSON (temperatures in °C unless --fahrenheit; ice and tap water in g)')
  .addHelpText(
    'after',
    `
Examples:
  $ panform temp --ddt 25 --room 22 --flour 20 --friction 13
  $ panform temp --ddt 26 --room 28 --flour 27 --friction 13 \\
      --preferment 24 --tap 22 --water 6.5kg
  $ panform temp --fahrenheit --ddt 80 --room 75 --flour 65 --friction 35
  $ panform temp --measured 26 --room 22 --flour 20 --water-temp 18

The multiplier method: water = n·DDT − (room + flour + each pre-ferment + friction); n counts
room, flour, water and each pre-ferment (3, or 4 with one pre-ferment). The friction is n × the
mixer's rise, so one mixer's friction grows with n: --friction 13 (found on a straight dough) is a
rise of 4.3 °C, 17.3 °C of friction with one pre-ferment. A temperature difference converts without
the offset: 20 °F-degrees are 11.1 °C-degrees. Ice (at 0 °C) = water·(tap − target)/(tap + L/c),
L = 333.55 J/g, c = 4.186 J/(g·K). Bare numbers are °C unless --fahrenheit.`,
  )
  .action(async (raw: RawOptions) => {
    const opts = toTempOptions(raw);
    const data = collectTemp(opts);
    if (opts.json) {
      process.stdout.write(`${JSON.stringify(data, null, 2)}\n`);
      return;
    }
    const { tempText } = await import('../print/temp.ts');
    process.stdout.write(fitText(tempText(data)));
  });
