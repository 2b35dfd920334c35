// The formula, catalog and plan as the arithmetic sees them: quantities parsed to grams, °C,
// percent and minutes. `normalize…` turns a file that passed the schema into this shape.
// Pure; no I/O.
import type {
  AllergenCode, CatalogFile, EquipmentKind, FinishUse, FormulaFile, FormulaStatus, IngredientKind, MixerKind, PlanFile, PrefermentKind, StepKind, Vessel, YeastType,
} from './schema/shapes.ts';
import { HAND_MIXING_RISE } from './temperature.ts';
import {
  middleOf, parseMass, parsePercent, parseRange, parseRate, parseTemperature, parseTemperatureDelta, parseTemperatureRange, type NumberRange, type RangePick,
} from './units.ts';

export interface Line {
  ingredient: string;
  /** Baker's percent. */
  percent: number;
}

export interface Preferment {
  name: string;
  kind: PrefermentKind;
  /** Percent of the formula's total flour held by this pre-ferment. */
  share: number;
  /** Baker's percent of the pre-ferment's own flour (seed flour included). */
  ingredients: Line[];
  ripenHours?: NumberRange;
  /** °C: the middle of `ripenTemperatureRange`, what the build is aimed at. */
  ripenTemperature?: number;
  /** °C, as written ("18-21 °C"; one temperature gives min = max). */
  ripenTemperatureRange?: NumberRange;
  /** °C: the temperature the build should come off the mixer at. */
  temperature?: number;
  note?: string;
}

export interface Soaker {
  name: string;
  /** Baker's percent of the formula's TOTAL flour. */
  ingredients: Line[];
  soakHours?: NumberRange;
  soakTemperature?: number;
  hot?: boolean;
  note?: string;
}

export interface Step {
  step: StepKind;
  /** Duration in minutes (a range; `hours` in the file is converted). */
  minutes?: NumberRange;
  /** °C */
  temperature?: number;
  folds?: { count: number; every: number };
  vessel?: Vessel;
  covered?: number;
  steam?: boolean;
  /** Bake: pieces that fill one oven slot. */
  perSlot?: number;
  /** Divide, preshape, shape: one person's seconds per piece. */
  secondsPerPiece?: number;
  note?: string;
}

/** What goes on or under each piece (seeds on top, egg wash, tray oil, dusting flour). */
export interface Finish {
  ingredient: string;
  /** Grams on each piece. */
  perPieceGrams: number;
  use: FinishUse;
  note?: string;
}

export interface Formula {
  id: string;
  title: string;
  status: FormulaStatus;
  category: string;
  description?: string;
  tags: string[];
  yield: { pieces: number; pieceGrams: number };
  /** Percent of mixed dough lost before dividing. */
  loss: number;
  /** Percent of the dough's weight lost in the oven (water), when the formula gives it; see bakeLossOf in label.ts. */
  bakeLoss?: number;
  /** °C: the desired dough temperature, the middle of `doughTemperatureRange`. */
  doughTemperature?: number;
  /** °C, as written ("25-26 °C"; one temperature gives min = max). */
  doughTemperatureRange?: NumberRange;
  /** Water held back and added late in the mix: baker's percent (part of the water line) and °C. */
  bassinage?: { percent: number; temperature: number };
  flour: Line[];
  ingredients: Line[];
  preferments: Preferment[];
  soakers: Soaker[];
  process: Step[];
  finishes: Finish[];
  mayContain: AllergenCode[];
  notes?: string;
}

export interface CatalogItem {
  name: string;
  kind: IngredientKind;
  /** Water content in percent of the ingredient's weight (water itself: 100). */
  water: number;
  /** Where `water` comes from; none when the kind's default (defaultWaterContent) is assumed. */
  waterSource?: string;
  allergens: AllergenCode[];
  yeast?: YeastType;
  /** Grams of this yeast that replace 1 g of fresh yeast, when the catalog sets it. */
  yeastFactor?: number;
  /** For a culture: its hydration in percent, and the flour it is fed with. */
  hydration?: number;
  fedWith?: string;
  costPerKg?: number;
  costDate?: string;
  components?: string[];
  label?: string;
  /** The name on the statement for one market, where it differs from label. */
  labels?: { eu?: string; us?: string };
  nutrients?: Nutrients;
  /** A culture's feed, as the catalog gives it (defaults are filled in by sheet/cultures.ts). */
  feeding?: { ratio?: [number, number, number]; hours?: NumberRange; temperature?: number; temperatureRange?: NumberRange; keepGrams?: number };
  note?: string;
}

/** Per 100 g of the ingredient: grams, sodium in mg. `carbohydrate` is total carbohydrate (fibre included). */
export interface Nutrients {
  fat: number;
  saturates: number;
  carbohydrate: number;
  sugars: number;
  fibre: number;
  protein: number;
  sodiumMg: number;
  source: string;
}

export type Catalog = Record<string, CatalogItem>;

export interface Mixer {
  name: string;
  /** By hand, `capacityGrams` is the batch one person mixes. */
  kind: MixerKind;
  capacityGrams: number;
  minimumGrams?: number;
  /**
   * °C-degrees: how much warmer the dough comes off the mixer than its ingredients' average. In a
   * sum of n temperatures the friction factor is n × rise (temperature.ts).
   */
  rise: number;
  /** Where `rise` came from: the file's `rise`, its straight-dough `friction` ÷ 3, or the hand-mixing default. */
  riseFrom: 'rise' | 'friction' | 'hand default';
  /** Minutes to clean it between a dough with an allergen and one without. */
  cleanDownMinutes?: number;
}

export interface Oven {
  name: string;
  decks: number;
  slots: number;
  /** °C per minute; undefined when the plan gives none (the scheduler uses a default). */
  heatRate?: number;
  coolRate?: number;
  steam: boolean;
  fan: boolean;
}

export interface Shift {
  /** The day the shift starts, "YYYY-MM-DD". */
  date: string;
  from: string;
  to: string;
  people: number;
  name?: string;
}

/** A scale the bench weighs on: the most it weighs and the step it reads in, grams. */
export interface Scale {
  name: string;
  maxGrams: number;
  resolutionGrams: number;
}

export interface Order {
  formula: string;
  pieces: number;
  pieceGrams?: number;
  mixer?: string;
  oven?: string;
  customer?: string;
  /** "HH:MM" on the plan's date; undefined: the plan's ready_by. */
  due?: string;
}

export interface Plan {
  date: string;
  readyBy: string;
  conditions: { room: number; flour: number; tapWater: number; preferment?: number };
  mixers: Mixer[];
  /** Undefined when the plan lists none (the scheduler assumes one and says so). */
  ovens?: Oven[];
  bench?: Shift[];
  orders: Order[];
  /** What the bakery has, by kind; undefined when the plan does not say. */
  equipment?: Partial<Record<EquipmentKind, number>>;
  /** Undefined when the plan lists none: weights are then not checked against a scale. */
  scales?: Scale[];
  ranges: RangePick;
  notes?: string;
}

/** A written temperature or range: its middle (what is aimed at) and the range; nothing when absent. */
function temperatureRange(text: string | undefined): { middle?: number; range?: NumberRange } {
  if (text === undefined) return {};
  const range = parseTemperatureRange(text);
  return { middle: middleOf(range), range };
}

const table = (t: Record<string, number> | undefined): Line[] =>
  Object.entries(t ?? {}).map(([ingredient, percent]) => ({ ingredient, percent }));

export function normalizeFormula(f: FormulaFile): Formula {
  return {
    id: f.id,
    title: f.title,
    status: f.status,
    category: f.category,
    description: f.description,
    tags: f.tags ?? [],
    yield: { pieces: f.yield.pieces, pieceGrams: parseMass(f.yield.piece) },
    loss: f.loss === undefined ? 0 : parsePercent(f.loss),
    bakeLoss: f.bake_loss === undefined ? undefined : parsePercent(f.bake_loss),
    doughTemperature: temperatureRange(f.dough_temperature).middle,
    doughTemperatureRange: temperatureRange(f.dough_temperature).range,
    ...(f.bassinage ? { bassinage: { percent: f.bassinage.percent, temperature: parseTemperature(f.bassinage.temperature) } } : {}),
    flour: table(f.flour),
    ingredients: table(f.ingredients),
    preferments: (f.preferments ?? []).map((p) => ({
      name: p.name,
      kind: p.kind,
      share: parsePercent(p.share),
      ingredients: table(p.ingredients),
      ripenHours: p.ripen ? parseRange(p.ripen.hours) : undefined,
      ripenTemperature: temperatureRange(p.ripen?.temperature).middle,
      ripenTemperatureRange: temperatureRange(p.ripen?.temperature).range,
      temperature: p.temperature === undefined ? undefined : parseTemperature(p.temperature),
      note: p.note,
    })),
    soakers: (f.soakers ?? []).map((s) => ({
      name: s.name,
      ingredients: table(s.ingredients),
      soakHours: s.soak ? parseRange(s.soak.hours) : undefined,
      soakTemperature: s.soak?.temperature === undefined ? undefined : parseTemperature(s.soak.temperature),
      hot: s.soak?.hot,
      note: s.note,
    })),
    process: (f.process ?? []).map((s) => {
      let minutes: NumberRange | undefined;
      if (s.minutes !== undefined) minutes = parseRange(s.minutes);
      else if (s.hours !== undefined) {
        const h = parseRange(s.hours);
        minutes = { min: h.min * 60, max: h.max * 60 };
      }
      return {
        step: s.step,
        minutes,
        temperature: s.temperature === undefined ? undefined : parseTemperature(s.temperature),
        folds: s.folds,
        vessel: s.vessel,
        covered: s.covered,
        steam: s.steam,
        perSlot: s.per_slot,
        secondsPerPiece: s.seconds_per_piece,
        note: s.note,
      };
    }),
    finishes: (f.finishes ?? []).map((x) => ({ ingredient: x.ingredient, perPieceGrams: parseMass(x.per_piece), use: x.use, note: x.note })),
    mayContain: f.may_contain ?? [],
    notes: f.notes,
  };
}

/** Water content by kind when the catalog gives none. */
export function defaultWaterContent(kind: IngredientKind): number {
  return kind === 'water' ? 100 : 0;
}

export function normalizeCatalog(c: CatalogFile): Catalog {
  // No prototype: an ingredient may be called anything, "constructor" included.
  const out: Catalog = Object.create(null) as Catalog;
  for (const [name, e] of Object.entries(c)) {
    out[name] = {
      name,
      kind: e.kind,
      water: e.water === undefined ? defaultWaterContent(e.kind) : parsePercent(e.water),
      waterSource: e.water_source,
      allergens: e.allergens ?? [],
      yeast: e.yeast,
      yeastFactor: e.yeast_factor,
      hydration: e.hydration === undefined ? undefined : parsePercent(e.hydration),
      fedWith: e.fed_with,
      costPerKg: e.cost_per_kg,
      costDate: e.cost_date,
      components: e.components,
      label: e.label,
      labels: e.labels,
      nutrients: e.nutrients && {
        fat: e.nutrients.fat,
        saturates: e.nutrients.saturates,
        carbohydrate: e.nutrients.carbohydrate,
        sugars: e.nutrients.sugars,
        fibre: e.nutrients.fibre,
        protein: e.nutrients.protein,
        sodiumMg: e.nutrients.sodium_mg,
        source: e.nutrients.source,
      },
      ...(e.feeding ? { feeding: normalizeFeeding(e.feeding) } : {}),
      note: e.note,
    };
  }
  return out;
}

function normalizeFeeding(x: NonNullable<CatalogFile[string]['feeding']>): NonNullable<CatalogItem['feeding']> {
  const t = temperatureRange(x.temperature);
  return {
    ...(x.ratio ? { ratio: x.ratio.split(':').map((n) => Number(n.trim())) as [number, number, number] } : {}),
    ...(x.hours !== undefined ? { hours: parseRange(x.hours) } : {}),
    ...(t.middle !== undefined ? { temperature: t.middle, temperatureRange: t.range } : {}),
    ...(x.keep !== undefined ? { keepGrams: parseMass(x.keep) } : {}),
  };
}

export function normalizePlan(p: PlanFile): Plan {
  return {
    date: p.date,
    readyBy: p.ready_by,
    conditions: {
      room: parseTemperature(p.conditions.room),
      flour: parseTemperature(p.conditions.flour),
      tapWater: parseTemperature(p.conditions.tap_water),
      preferment: p.conditions.preferment === undefined ? undefined : parseTemperature(p.conditions.preferment),
    },
    mixers: p.mixers.map((m) => ({
      name: m.name,
      kind: m.kind ?? 'machine',
      capacityGrams: parseMass(m.capacity),
      minimumGrams: m.minimum === undefined ? undefined : parseMass(m.minimum),
      ...mixerRise(m),
      cleanDownMinutes: m.clean_down,
    })),
    ovens: p.ovens?.map((o) => ({
      name: o.name,
      decks: o.decks,
      slots: o.slots,
      heatRate: o.heat === undefined ? undefined : parseRate(o.heat),
      coolRate: o.cool === undefined ? undefined : parseRate(o.cool),
      steam: o.steam ?? false,
      fan: o.fan ?? false,
    })),
    bench: p.bench?.map((b) => ({ date: b.date ?? p.date, from: b.from, to: b.to, people: b.people, ...(b.name ? { name: b.name } : {}) })),
    orders: p.orders.map((o) => ({
      formula: o.formula,
      pieces: o.pieces,
      pieceGrams: o.piece === undefined ? undefined : parseMass(o.piece),
      mixer: o.mixer,
      oven: o.oven,
      customer: o.customer,
      due: o.due,
    })),
    ...(p.equipment ? { equipment: { ...p.equipment } } : {}),
    ...(p.scales ? { scales: p.scales.map((x) => ({ name: x.name, maxGrams: parseMass(x.max), resolutionGrams: parseMass(x.resolution) })) } : {}),
    ranges: p.ranges ?? 'mid',
    notes: p.notes,
  };
}

/**
 * A mixer's rise as the baker gives it: `rise` itself, or the friction factor found on a straight
 * dough (three factors) ÷ 3; by hand with neither, the hand-mixing default. A machine with neither
 * is refused by the plan check; NaN here keeps the arithmetic from guessing.
 */
function mixerRise(m: PlanFile['mixers'][number]): Pick<Mixer, 'rise' | 'riseFrom'> {
  if (m.rise !== undefined) return { rise: parseTemperatureDelta(m.rise), riseFrom: 'rise' };
  if (m.friction !== undefined) return { rise: parseTemperatureDelta(m.friction) / 3, riseFrom: 'friction' };
  if (m.kind === 'hand') return { rise: HAND_MIXING_RISE, riseFrom: 'hand default' };
  return { rise: Number.NaN, riseFrom: 'rise' };
}

/** What the catalog says of an ingredient, or a guess from its name when it is not listed. */
export function lookupIngredient(catalog: Catalog, name: string): CatalogItem {
  if (Object.hasOwn(catalog, name)) return catalog[name];
  const kind: IngredientKind = name === 'water' ? 'water' : /flour/.test(name) ? 'flour' : 'other';
  return { name, kind, water: defaultWaterContent(kind), allergens: [] };
}
