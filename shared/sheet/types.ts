// The batch sheet as data: what `panform sheet --format json` prints and what the viewer and the
// HTML/PDF renderers draw. The JSON keys are a contract (docs/batch-sheet.md); weights are grams,
// unrounded; temperatures °C; times are local date-times "YYYY-MM-DDTHH:MM" on the plan's clock.
import type { PrefermentTemperature } from '../dough-water.ts';
import type { FrictionProposal } from '../friction.ts';
import type { AllergenCode, EquipmentKind, FinishUse, IngredientKind, PrefermentKind, StepKind, Vessel } from '../schema/shapes.ts';
import type { Catalog, Formula, Oven, Plan, Shift } from '../model.ts';
import type { NumberRange, RangePick } from '../units.ts';
import type { Caution } from '../cautions.ts';

/** A local date-time without a zone, e.g. "2026-12-03T04:10". */
export type LocalDateTime = string;

export interface SheetInput {
  plan: Plan;
  /** Every formula the plan's orders name, by id. */
  formulas: Record<string, Formula>;
  catalog: Catalog;
}

/** What a line is: a catalog kind, or a build that goes into the final dough as one line. */
export type LineKind = IngredientKind | 'preferment' | 'soaker';

export interface SheetLine {
  ingredient: string;
  /** What to weigh, g. */
  grams: number;
  kind: LineKind;
  /** A mature culture that seeds a levain build; its flour and water are inside the build's lines. */
  seed?: boolean;
  /** The scale that weighs it (the plan's `scales`), when the plan lists scales. */
  scale?: string;
}

/** One mix that takes part of a build. */
export interface BuildUse {
  formula: string;
  /** Index of the order in the plan. */
  order: number;
  mixNumber: number;
  grams: number;
  /** When that final mix starts: the build must be ripe then. */
  at: LocalDateTime;
}

/** A pre-ferment or soaker to make tonight. */
export interface SheetBuild {
  /** The first formula that uses it; `formulas` lists all when identical builds are combined. */
  formula: string;
  formulas: string[];
  name: string;
  kind: PrefermentKind | 'soaker';
  /** 1-based; a build is made in more than one batch when its uses are too far apart to be ripe for all. */
  batch: number;
  batches: number;
  /** Whole build, g. */
  grams: number;
  /** Flour in the build (seed flour included), g. */
  flour: number;
  ingredients: SheetLine[];
  uses: BuildUse[];
  /** °C the build should come off the mixer at (its `temperature`, else its ripening temperature). */
  targetTemperature: number | null;
  /** °C; n = 3 (room, flour, water), 4 with a seed culture, no friction. Null when the formula gives no target. */
  waterTemperature: number | null;
  /** °C the seed culture is counted at (the plan's pre-ferment default, else the room); null without a seed. */
  seedTemperature: number | null;
  /** Water lines of the build, g; split into ice and tap water when the water must be colder than the tap. */
  water: number;
  ice: number;
  tapWater: number;
  /** Ripening (pre-ferment) or soaking (soaker) hours, from the formula. */
  hours: NumberRange | null;
  /** °C to ripen or soak at. */
  holdTemperature: number | null;
  /** Mix it no earlier than this (ripe at most `hours.max` at its last use); null without hours. */
  mixFrom: LocalDateTime | null;
  /** Mix it no later than this (ripe at least `hours.min` at its first use). */
  mixUntil: LocalDateTime;
  /** A scald: made with boiling water. */
  hot: boolean;
  /** When and on which mixer the build is mixed (pre-ferments); null for soakers or when no mixer takes it. */
  booked: { mixer: string; start: LocalDateTime; end: LocalDateTime } | null;
  note?: string;
}

export interface TemperatureFactors {
  room: number;
  flour: number;
  /** The mixer's rise, °C-degrees. */
  rise: number;
  /** n × rise, °C-degrees: the friction in this sum. */
  friction: number;
  /** One per pre-ferment in the dough: the temperature it counts at and where that came from. */
  preferments: PrefermentTemperature[];
  /** 3 + the number of pre-ferments. */
  n: number;
}

export interface SheetMix {
  formula: string;
  title: string;
  /** Index of the order in the plan. */
  order: number;
  customer?: string;
  mixer: string;
  mixNumber: number;
  /** How many equal mixes the order is split into. */
  of: number;
  /** Mixed dough of this mix, g. */
  dough: number;
  flour: number;
  /** Final-dough lines: ingredients to weigh, and each pre-ferment and soaker as one line. */
  ingredients: SheetLine[];
  /** °C the dough should come off the mixer at (the middle of a range); null when the formula has none. */
  doughTemperature: number | null;
  /** °C: the formula's range, when it gives one. */
  doughTemperatureRange: NumberRange | null;
  factors: TemperatureFactors | null;
  /**
   * °C for the water poured at the start (ice and tap water together; the bassinage apart); for a
   * dough without water, its liquid's (see `liquid`). Null without a dough temperature or a liquid.
   */
  waterTemperature: number | null;
  /** What is tempered: "water", or the other liquid ("whole milk") of a dough without water. */
  liquid: string | null;
  /** Water lines of the mix, g (the bassinage included). */
  water: number;
  ice: number;
  tapWater: number;
  /** Water held back and added late in the mix, at its own temperature. */
  bassinage: { grams: number; temperature: number } | null;
  /** Whole pieces to divide from this mix, and their weight. */
  pieces: number;
  pieceGrams: number;
  /** What goes on or under this mix's pieces (the formula's finishes × its pieces). */
  finishes: MixFinish[];
  start: LocalDateTime;
  end: LocalDateTime;
}

export interface MixFinish {
  ingredient: string;
  kind: IngredientKind;
  use: FinishUse;
  /** g on each piece, and for all the mix's pieces. */
  perPiece: number;
  grams: number;
  note?: string;
}

/** A finish for the night's pieces of one formula: what the pick list weighs out. */
export interface SheetFinish extends MixFinish {
  formula: string;
  title: string;
  pieces: number;
}

/** What the night holds its pieces in at the busiest moment, against what the bakery has. */
export interface EquipmentNeed {
  kind: EquipmentKind;
  /** Most in use at once, and when that is first reached. */
  peak: number;
  at: LocalDateTime;
  /** What the plan's `equipment` says the bakery has; null when it does not say. */
  have: number | null;
  /** peak − have when that is above 0, else 0. */
  short: number;
  /** Each mix that uses it: how many in all, taken from `from` and all given back by `until`. */
  uses: { formula: string; label: string; step: 'proof' | 'bake'; count: number; from: LocalDateTime; until: LocalDateTime }[];
}

/** A weight on the sheet checked against the scale that weighs it. */
export interface ScaleCheck {
  /** "mix" (a mix card's line) or "build" (a pre-ferment or soaker). */
  where: 'mix' | 'build';
  /** The mix's or build's label, e.g. "Quay biga loaf 1/1" or "biga". */
  label: string;
  formula: string;
  ingredient: string;
  grams: number;
  scale: string;
  resolution: number;
  /** grams ÷ resolution. */
  divisions: number;
  /** What is wrong: below one division, or fewer than MIN_DIVISIONS. */
  problem: 'below-resolution' | 'few-divisions';
  /** Dissolve in part of the water: what to weigh, in how much water, and how much of the solution to take. */
  premix: { dissolve: number; water: number; factor: number; take: number; lessWater: number } | null;
  /** What to do instead when no premix is suggested. */
  advice: string;
}

export interface ScaleUse {
  name: string;
  max: number;
  resolution: number;
  /** Weights on the sheet that go on it. */
  weights: number;
  /** The lightest weight it can take by the rule (MIN_DIVISIONS × resolution). */
  least: number;
}

/** Feeding a culture so that it is ripe for the night's builds, with some kept back. */
export interface CultureFeed {
  culture: string;
  /** 1-based, when the builds are too far apart for one feed to be ripe for all. */
  feed: number;
  feeds: number;
  /** Ripe culture the builds take, g, and each build. */
  needed: number;
  uses: { build: string; formula: string; grams: number; at: LocalDateTime }[];
  /** Ripe culture kept back to feed again, g, and where that figure comes from. */
  keep: number;
  keepSource: string;
  /** needed + keep: what this feed makes. */
  grams: number;
  /** culture : flour : water, and where it comes from. */
  ratio: [number, number, number];
  ratioSource: string;
  /** What to weigh for the feed: ripe culture from the last feed, flour, water. */
  seed: number;
  flour: { ingredient: string; grams: number };
  water: number;
  hours: NumberRange;
  temperature: number;
  temperatureRange: NumberRange;
  timingSource: string;
  /** Feed at this time (aimed at the middle of the ripening hours before the first build), within [from, until]. */
  at: LocalDateTime;
  from: LocalDateTime;
  until: LocalDateTime;
  /** Ripe from (at + min hours) to (at + max hours). */
  ripeFrom: LocalDateTime;
  ripeUntil: LocalDateTime;
}

/** The time window a sheet was cut to (panform sheet --from/--to or --shift). */
export interface SheetWindow {
  from: LocalDateTime;
  to: LocalDateTime;
  /** The plan's shift name, when printed for a named shift. */
  name?: string;
}

export type TimelineStep = StepKind | 'build' | 'soak';

export interface TimelineEntry {
  formula: string;
  /** For builds: the build's name; for mixes: "<title> <n>/<of>" (with "(order k)" when a formula is ordered twice). */
  label: string;
  step: TimelineStep;
  /** Order index and mix number; null for builds. */
  order: number | null;
  mixNumber: number | null;
  start: LocalDateTime;
  end: LocalDateTime;
  /** Minutes from the plan date's midnight (negative: the evening before). */
  startMinute: number;
  endMinute: number;
  minutes: number;
  /** "mixer:<name>", "oven:<name>" or "bench" when the step holds one. */
  resource?: string;
  /** The oven's deck (bakes) or the bench person (divide, preshape, shape), 1-based. */
  unit?: number;
  /** Oven slots the load fills (bakes). */
  slots?: number;
  /** Fold times during this step. */
  folds?: LocalDateTime[];
  /** °C for bakes and retards. */
  temperature?: number;
  /** A window to do the step in (builds), not a fixed slot. */
  window?: boolean;
  cold?: boolean;
  steam?: boolean;
  /** Bakes: what the pieces bake in or on; proof and retard: what they rise in (banneton, couche, tray, tin). */
  vessel?: Vessel;
  /** Bakes: minutes of the bake under a lid. */
  covered?: number;
  note?: string;
}

export interface PickLine {
  ingredient: string;
  grams: number;
  kind: IngredientKind;
}

export interface FormulaSummary {
  formula: string;
  title: string;
  orders: number;
  pieces: number;
  dividedDough: number;
  mixedDough: number;
  mixes: number;
  mixers: string[];
  /** Everything weighed for it: its share of builds and its final-dough lines, g (= mixedDough). */
  weighed: number;
  /** Ingredient → grams across its builds and mixes (seed culture included). */
  ingredients: PickLine[];
}

export type { Caution, CautionTopic } from '../cautions.ts';

/** One use of a resource (README "Batch sheets", JSON). */
export interface Booking {
  resource: { kind: 'mixer' | 'oven' | 'bench'; name: string; unit: number | null };
  /** mix, build, divide, preshape, shape, bake; heat, cool (a deck changing temperature); clean-down (a mixer). */
  task: string;
  formula: string | null;
  /** The mix's label as on the timeline (a build's name for builds); null for heat, cool and clean-down. */
  mix: string | null;
  start: LocalDateTime;
  end: LocalDateTime;
  /** Oven slots filled (bakes); null elsewhere. */
  slots: number | null;
  /** °C of the deck (bakes, heat, cool); null elsewhere. */
  temperature: number | null;
}

/** Each order of the plan: when it is due and when its last piece is out of the oven. */
export interface OrderOutcome {
  formula: string;
  pieces: number;
  due: LocalDateTime;
  out: LocalDateTime;
  /** Minutes late; 0 when on time. */
  late: number;
}

export interface Sheet {
  date: string;
  readyBy: LocalDateTime;
  conditions: Plan['conditions'];
  mixers: Plan['mixers'];
  /** The ovens and bench shifts scheduled on, defaults filled in. */
  ovens: Oven[];
  bench: Shift[];
  ranges: RangePick;
  notes?: string;
  preferments: SheetBuild[];
  soakers: SheetBuild[];
  mixes: SheetMix[];
  timeline: TimelineEntry[];
  bookings: Booking[];
  orders: OrderOutcome[];
  totals: PickLine[];
  /** Finishes (seeds on top, washes, tray oil, dusting flour) for the night's pieces, by formula. */
  finishes: SheetFinish[];
  /** Trays, tins, pots, bannetons and couches at the peak of the night. */
  equipment: EquipmentNeed[];
  /** The plan's scales and how many weights each takes; empty when the plan lists none. */
  scales: ScaleUse[];
  /** Weights too small for the scale that weighs them. */
  smallWeights: ScaleCheck[];
  /** Feeds that make the cultures the builds take ripe in time. */
  cultures: CultureFeed[];
  /** Set when the sheet is cut to one shift or time window. */
  window?: SheetWindow;
  formulas: FormulaSummary[];
  allergens: AllergenCode[];
  mayContain: AllergenCode[];
  cautions: Caution[];
  /** Things the baker should look at that do not stop the sheet (late orders and their reasons first). */
  warnings: string[];
  /**
   * What the bench's records say about the friction of the day's mixers for the day's formulas
   * (shared/friction.ts): added by the server, which has the records; absent from a sheet made
   * from the files alone. The plan's values stay until the baker changes the file.
   */
  frictionProposals?: FrictionProposal[];
}

/** The plan cannot be turned into a sheet: the message says why and what to change. */
export class SheetError extends Error {
  constructor(message: string) {
    super(message);
    this.name = 'SheetError';
  }
}

export type { Catalog, Formula, Plan };
