// `panform scale`: a formula scaled to a batch, as the bench weighs it: the overall formula, each
// pre-ferment and soaker build, the final dough, the derived figures and, given the conditions,
// the water temperature and ice. A thin shell over shared/scale.ts and shared/temperature.ts.
import { Command, Option } from 'commander';
import { AllergenError } from '#shared/allergens';
import { formulaCautions, type Caution } from '#shared/cautions';
import type { Catalog, Formula } from '#shared/model';
import { ScaleError, scaleFormula, type ScaleResult, type ScaleTarget } from '#shared/scale';
import { planMixWater } from '#shared/dough-water';
import {
  DEFAULT_RESOLUTION, parseResolution, parseTemperatureArgument, parseTemperatureDeltaArgument, QuantityError,
  type TemperatureUnit, type UnitSystem,
} from '#shared/units';
import { InputError, UsageError } from '../errors.ts';
import { fitText } from '../print/width.ts';
import { readFormulaWithCatalog } from '../files.ts';
import type { Conditions, ScaleData, ScaleOptions, WaterSection } from '../print/scale.ts';
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
  rise?: string;
  tap?: string;
  prefermentTemp?: string[];
  fahrenheit?: boolean;
}

export type { Conditions, ScaleData, ScaleOptions, WaterSection } from '../print/scale.ts';

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
  const conditionFlags = { ddt: o.ddt, room: o.room, 'flour-temp': o.flourTemp, friction: o.friction ?? o.rise, tap: o.tap, 'preferment-temp': o.prefermentTemp };
  const anyCondition = Object.values(conditionFlags).some((v) => v !== undefined);
  let conditions: Conditions | null = null;
  if (anyCondition) {
    const missing = (['room', 'flour-temp', 'friction'] as const).filter((k) => conditionFlags[k] === undefined).map((k) => (k === 'friction' ? 'friction (or --rise)' : k));
    if (missing.length > 0) {
      throw new UsageError(
        `the water temperature needs ${missing.map((m) => `--${m}`).join(', ')}`,
        'give --room, --flour-temp and --friction or --rise (and --tap for the ice), e.g. --room 22 --flour-temp 20 --friction 13 --tap 14',
      );
    }
    if (o.friction !== undefined && o.rise !== undefined) throw new UsageError('give --friction or --rise, not both', '--rise 4.3 is the same mixer as --friction 13 (13 ÷ 3)');
    conditions = {
      ddt: o.ddt === undefined ? undefined : parseTemperatureFlag('--ddt', o.ddt, unit),
      room: parseTemperatureFlag('--room', o.room!, unit),
      flour: parseTemperatureFlag('--flour-temp', o.flourTemp!, unit),
      rise: o.rise !== undefined ? parseTemperatureFlag('--rise', o.rise, unit, true) : parseTemperatureFlag('--friction', o.friction!, unit, true) / 3,
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

/** The water for the final dough: shared/dough-water.ts with the readings given. */
function collectWater(formula: Formula, result: ScaleResult, catalog: Catalog, c: Conditions, unit: TemperatureUnit): WaterSection {
  if (c.ddt === undefined && formula.doughTemperature === undefined) {
    throw new UsageError(`${formula.id} has no dough_temperature; give --ddt`, 'e.g. --ddt 25');
  }
  const n = formula.preferments.length;
  let measured: number[] = [];
  if (c.preferments.length === 0) measured = [];
  else if (c.preferments.length === 1 && n > 0) measured = formula.preferments.map(() => c.preferments[0]);
  else if (c.preferments.length === n) measured = c.preferments;
  else {
    throw new UsageError(
      `${formula.id} has ${n} pre-ferment(s) but --preferment-temp was given ${c.preferments.length} times`,
      n === 0 ? 'leave out --preferment-temp for a straight dough' : 'give it once for all pre-ferments, or once per pre-ferment in order',
    );
  }
  const water = planMixWater(formula, result, catalog, { ddt: c.ddt, room: c.room, flour: c.flour, tap: c.tap, rise: c.rise, measured }, unit);
  if (!water.reachable) throw new InputError(`${formula.id}: ${water.warnings[0]}`);
  return { ...water, tap: c.tap ?? null };
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
  const water = opts.conditions ? collectWater(formula, result, catalog, opts.conditions, opts.temperatureUnit) : null;
  let cautions: Caution[];
  try {
    cautions = formulaCautions(formula, catalog, { ice: (water?.main?.ice ?? 0) > 0 });
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
      waterTemperature: water.main?.temperature ?? null,
      liquid: water.liquid?.names ?? null,
      factors: water.factors,
      ice: water.main?.ice ?? null,
      tapWater: water.main?.tapWater ?? null,
      iceShare: water.main?.iceShare ?? null,
      waterGrams: water.main?.grams ?? 0,
      bassinage: water.bassinage,
      desiredDoughTemperature: water.desiredDoughTemperature,
      doughTemperatureRange: water.doughTemperatureRange,
      room: water.room,
      flour: water.flour,
      rise: water.rise,
      friction: water.frictionFactor,
      preferments: water.preferments,
      tap: water.tap,
      specificHeat: water.specificHeat,
      warnings: [...water.warnings, ...water.advice],
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
  .option('--friction <t>', 'the mixer\'s friction factor found on a straight dough (3 factors); its rise is a third of it (°C-degrees, or °F-degrees with --fahrenheit)')
  .option('--rise <t>', 'the mixer\'s rise: how much warmer dough comes off it than its ingredients\' average (instead of --friction)')
  .option('--tap <t>', 'tap water temperature, to work out the ice')
  .option('--preferment-temp <t>', 'pre-ferment temperature measured tonight (once for all, or once per pre-ferment); default: its ripening temperature', (v: string, prev: string[] = []) => [...prev, v])
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
written with their unit ("72F"). Water by the multiplier method: water = n·DDT − (room + flour +
each pre-ferment + n × rise); a pre-ferment counts at its measured temperature, else its ripening
temperature.`,
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
