// `panform scale`: a formula scaled to a batch, as the bench weighs it: the overall formula, each
// pre-ferment and soaker build, the final dough, the derived figures and, given the conditions,
// the water temperature and ice. A thin shell over shared/scale.ts and shared/temperature.ts.
import { Command, Option } from 'commander';
import { AllergenError } from '#shared/allergens';
import { formulaCautions, type Caution } from '#shared/cautions';
import type { Formula } from '#shared/model';
import { ScaleError, scaleFormula, type ScaleResult, type ScaleTarget } from '#shared/scale';
import { planWater, TemperatureError, type WaterPlan } from '#shared/temperature';
import {
  DEFAULT_RESOLUTION, parseResolution, parseTemperatureArgument, parseTemperatureDeltaArgument, QuantityError,
  type Resolution, type TemperatureUnit, type UnitSystem,
} from '#shared/units';
import { InputError, UsageError } from '../errors.ts';
import { fitText } from '../print/width.ts';
import { readFormulaWithCatalog } from '../files.ts';
import { parseTargetFlags } from '../target-flags.ts';

interface RawOptions {
  pieces?: string;
  piece?: string;
  mix?: string;
  flour?: string;
  units: UnitSystem;
  json?: boolean;
  csv?: boolean;
  catalog?: string;
  resolution?: string;
  ddt?: string;
  room?: string;
  flourTemp?: string;
  friction?: string;
  tap?: string;
  prefermentTemp?: string[];
  fahrenheit?: boolean;
}

interface Conditions {
  /** All °C; friction in °C-degrees. */
  ddt?: number;
  room: number;
  flour: number;
  friction: number;
  tap?: number;
  preferments: number[];
}

export interface ScaleOptions {
  target: ScaleTarget | null;
  units: UnitSystem;
  output: 'table' | 'json' | 'csv';
  catalog?: string;
  resolution: Resolution;
  temperatureUnit: TemperatureUnit;
  conditions: Conditions | null;
}

export interface WaterSection extends WaterPlan {
  /** °C */
  desiredDoughTemperature: number;
  room: number;
  flour: number;
  /** °C-degrees */
  friction: number;
  preferments: { name: string; temperature: number }[];
  tap: number | null;
  /** Water weighed into the final dough, g (the builds' water is already in them). */
  waterGrams: number;
}

export interface ScaleData {
  result: ScaleResult;
  formula: Formula;
  water: WaterSection | null;
  /** The usual cautions for the work (shared/cautions.ts); ice only when the water takes some. */
  cautions: Caution[];
}

function usage(flag: string, e: unknown): never {
  if (e instanceof QuantityError) throw new UsageError(`${flag}: ${e.message}`, `expected ${e.expected}`);
  throw e;
}

function parseTemperatureFlag(flag: string, text: string, unit: TemperatureUnit, delta = false): number {
  try {
    return delta ? parseTemperatureDeltaArgument(text, unit) : parseTemperatureArgument(text, unit);
  } catch (e) {
    usage(flag, e);
  }
}

export function toScaleOptions(o: RawOptions): ScaleOptions {
  if (o.json && o.csv) throw new UsageError('--json and --csv cannot be used together');
  const target = parseTargetFlags(o);

  let resolution = DEFAULT_RESOLUTION;
  if (o.resolution !== undefined) {
    try {
      resolution = parseResolution(o.resolution);
    } catch (e) {
      usage('--resolution', e);
    }
  }

  const unit: TemperatureUnit = o.fahrenheit ? 'F' : 'C';
  const conditionFlags = { ddt: o.ddt, room: o.room, 'flour-temp': o.flourTemp, friction: o.friction, tap: o.tap, 'preferment-temp': o.prefermentTemp };
  const anyCondition = Object.values(conditionFlags).some((v) => v !== undefined);
  let conditions: Conditions | null = null;
  if (anyCondition) {
    const missing = (['room', 'flour-temp', 'friction'] as const).filter((k) => conditionFlags[k] === undefined);
    if (missing.length > 0) {
      throw new UsageError(
        `the water temperature needs ${missing.map((m) => `--${m}`).join(', ')}`,
        'give --room, --flour-temp and --friction (and --tap for the ice), e.g. --room 22 --flour-temp 20 --friction 13 --tap 14',
      );
    }
    conditions = {
      ddt: o.ddt === undefined ? undefined : parseTemperatureFlag('--ddt', o.ddt, unit),
      room: parseTemperatureFlag('--room', o.room!, unit),
      flour: parseTemperatureFlag('--flour-temp', o.flourTemp!, unit),
      friction: parseTemperatureFlag('--friction', o.friction!, unit, true),
      tap: o.tap === undefined ? undefined : parseTemperatureFlag('--tap', o.tap, unit),
      preferments: (o.prefermentTemp ?? []).map((t) => parseTemperatureFlag('--preferment-temp', t, unit)),
    };
  }

  return {
    target,
    units: o.units,
    output: o.json ? 'json' : o.csv ? 'csv' : 'table',
    catalog: o.catalog,
    resolution,
    temperatureUnit: o.fahrenheit ? 'F' : 'C',
    conditions,
  };
}

/** The water for the final dough, from the formula's pre-ferments and the conditions given. */
function collectWater(formula: Formula, result: ScaleResult, c: Conditions, unit: TemperatureUnit): WaterSection {
  const ddt = c.ddt ?? formula.doughTemperature;
  if (ddt === undefined) {
    throw new UsageError(`${formula.id} has no dough_temperature; give --ddt`, 'e.g. --ddt 25');
  }
  const n = formula.preferments.length;
  let prefermentTemps: number[];
  if (c.preferments.length === 0) {
    prefermentTemps = formula.preferments.map((p) => {
      const t = p.temperature ?? p.ripenTemperature;
      if (t === undefined) {
        throw new UsageError(
          `the temperature of pre-ferment "${p.name}" is not in the formula; give --preferment-temp`,
          'once for all pre-ferments, or once per pre-ferment in the formula\'s order',
        );
      }
      return t;
    });
  } else if (c.preferments.length === 1 && n > 0) {
    prefermentTemps = formula.preferments.map(() => c.preferments[0]);
  } else if (c.preferments.length === n) {
    prefermentTemps = c.preferments;
  } else {
    throw new UsageError(
      `${formula.id} has ${n} pre-ferment(s) but --preferment-temp was given ${c.preferments.length} times`,
      n === 0 ? 'leave out --preferment-temp for a straight dough' : 'give it once for all pre-ferments, or once per pre-ferment in order',
    );
  }
  const waterGrams = result.finalDoughWater;
  let plan: WaterPlan;
  try {
    plan = planWater({ ddt, room: c.room, flour: c.flour, friction: c.friction, preferments: prefermentTemps, tap: c.tap, waterGrams }, unit);
  } catch (e) {
    if (e instanceof TemperatureError) throw new InputError(`${formula.id}: ${e.message}`);
    throw e;
  }
  return {
    ...plan,
    desiredDoughTemperature: ddt,
    room: c.room,
    flour: c.flour,
    friction: c.friction,
    preferments: formula.preferments.map((p, i) => ({ name: p.name, temperature: prefermentTemps[i] })),
    tap: c.tap ?? null,
    waterGrams,
  };
}

export function collectScale(formulaArg: string, opts: ScaleOptions): ScaleData {
  const { formula, catalog } = readFormulaWithCatalog(formulaArg, { catalog: opts.catalog });
  const target: ScaleTarget = opts.target ?? { by: 'pieces', pieces: formula.yield.pieces, pieceGrams: formula.yield.pieceGrams };
  let result: ScaleResult;
  try {
    result = scaleFormula(formula, catalog, target);
  } catch (e) {
    if (e instanceof ScaleError) throw new InputError(e.message);
    throw e;
  }
  const water = opts.conditions ? collectWater(formula, result, opts.conditions, opts.temperatureUnit) : null;
  let cautions: Caution[];
  try {
    cautions = formulaCautions(formula, catalog, { ice: (water?.ice ?? 0) > 0 });
  } catch (e) {
    if (e instanceof AllergenError) throw new InputError(`${formula.id}: ${e.message}`);
    throw e;
  }
  return { result, formula, water, cautions };
}

/** What `--json` prints: the scale result with grams unrounded, and `mixingWater` (temperature, ice) when conditions are given. */
export function scaleJson(data: ScaleData, opts: ScaleOptions): unknown {
  const { result, water, cautions } = data;
  return {
    ...result,
    cautions,
    units: { weight: 'g', temperature: '°C', friction: '°C-degrees' },
    mixingWater: water && {
      waterTemperature: water.waterTemperature,
      factors: water.factors,
      ice: water.ice,
      tapWater: water.tapWater,
      iceShare: water.iceShare,
      waterGrams: water.waterGrams,
      desiredDoughTemperature: water.desiredDoughTemperature,
      room: water.room,
      flour: water.flour,
      friction: water.friction,
      preferments: water.preferments,
      tap: water.tap,
      warnings: water.warnings,
    },
    resolution: opts.resolution,
  };
}

export const command = new Command('scale')
  .description('Scale a formula to a batch: overall formula, pre-ferment and soaker builds, final dough, derived figures and water temperature.')
  .argument('<formula>', 'a formula file, or an id found as formulas/<id>.yaml')
  .option('--pieces <n>', 'number of pieces (with the formula\'s piece weight, or --piece)')
  .option('--piece <weight>', 'piece weight, e.g. "900 g", "2 lb" or grams')
  .option('--mix <weight>', 'mixed dough weight (no loss applied), e.g. "28.47 kg"')
  .option('--flour <weight>', 'total flour weight (no loss applied)')
  .addOption(new Option('--units <system>', 'weights printed in').choices(['metric', 'us']).default('metric'))
  .option('--json', 'print the result as JSON (grams unrounded)')
  .option('--csv', 'print one CSV row per line, with a section column')
  .option('--catalog <file>', 'the ingredient catalog (default: ingredients.yaml beside the formula or in its parent folder)')
  .option('--resolution <steps>', 'scale resolution for printing: step[,fine step[,fine below]] in g (default 1,0.1,100)')
  .option('--ddt <t>', 'desired dough temperature (default: the formula\'s dough_temperature)')
  .option('--room <t>', 'room temperature')
  .option('--flour-temp <t>', 'flour temperature')
  .option('--friction <t>', 'the mixer\'s friction, a temperature rise (°C-degrees, or °F-degrees with --fahrenheit)')
  .option('--tap <t>', 'tap water temperature, to work out the ice')
  .option('--preferment-temp <t>', 'pre-ferment temperature (once for all, or once per pre-ferment)', (v: string, prev: string[] = []) => [...prev, v])
  .option('--fahrenheit', 'bare temperatures are °F (friction in °F-degrees); printed in °F')
  .addHelpText(
    'after',
    `
Examples:
  $ panform scale harbour-ciabatta --pieces 60
  $ panform scale formulas/country-levain.yaml --pieces 18 --piece 900g \\
      --room 22 --flour-temp 20 --friction 13 --tap 14
  $ panform scale harbour-ciabatta --mix 28.47kg --json

Without --pieces, --mix or --flour the formula's own yield is scaled. Weights accept g, kg, oz
or lb ("900 g", "2 lb"); a bare number is grams. Temperatures are °C unless --fahrenheit or
written with their unit ("72F").`,
  )
  .action(async (formulaArg: string, raw: RawOptions) => {
    const opts = toScaleOptions(raw);
    const data = collectScale(formulaArg, opts);
    if (opts.output === 'json') {
      process.stdout.write(`${JSON.stringify(scaleJson(data, opts), null, 2)}\n`);
      return;
    }
    const print = await import('../print/scale.ts');
    process.stdout.write(opts.output === 'csv' ? print.scaleCsv(data) : fitText(print.scaleText(data, opts)));
  });
