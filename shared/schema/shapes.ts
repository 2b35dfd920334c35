// The one source of truth for the shapes of Panform's files. The JSON Schemas in
// shared/schema/*.schema.json are generated from these definitions (`npm run schema`), and
// tests/shared/schema-drift.test.ts fails when the committed files and these shapes differ.
import { Type, type Static } from '@sinclair/typebox';
import {
  ALLERGEN_CODES, CLOCK_PATTERN, EQUIPMENT_KINDS, RATIO_PATTERN, VESSELS, DATE_PATTERN, FINISH_USES, FORMULA_STATUSES, ID_PATTERN, INGREDIENT_KINDS, MASS_PATTERN,
  MIXER_KINDS, PERCENT_PATTERN, PREFERMENT_KINDS, RANGE_PATTERN, RATE_PATTERN, STEP_KINDS, TEMPERATURE_PATTERN, TEMPERATURE_RANGE_PATTERN, YEAST_TYPES,
} from './vocabulary.ts';

export * from './vocabulary.ts';

// ---- quantities written with their unit, as a baker writes them -------------------------
export const Mass = Type.String({
  pattern: MASS_PATTERN,
  description: 'A weight with its unit: g, kg, oz or lb, e.g. "320 g" or "2 lb".',
});
export const Temperature = Type.String({
  pattern: TEMPERATURE_PATTERN,
  description: 'A temperature with its unit, e.g. "25 °C" or "77 °F".',
});
/** A temperature or a range such as "25-26 °C"; a range is aimed at its middle and shown whole. */
export const TemperatureRange = Type.String({
  pattern: TEMPERATURE_RANGE_PATTERN,
  description: 'A temperature, or a range with one unit, e.g. "25 °C" or "25-26 °C" (aimed at the middle).',
});
export const Percent = Type.Union([Type.Number(), Type.String({ pattern: PERCENT_PATTERN })], {
  description: 'A percentage, e.g. "2 %" or 2.',
});
/** A number or a range "10-14"; ranges use their midpoint unless a plan says otherwise. */
export const Range = Type.Union([Type.Number({ minimum: 0 }), Type.String({ pattern: RANGE_PATTERN })], {
  description: 'A number or a range such as "10-14".',
});
/** Ingredient name → baker's percent. */
export const PercentTable = Type.Record(Type.String({ minLength: 1 }), Type.Number(), {
  description: "Ingredient name (as in the catalog) → baker's percent.",
});

export const AllergenCode = Type.Unsafe<(typeof ALLERGEN_CODES)[number]>({
  type: 'string',
  enum: [...ALLERGEN_CODES],
  description: 'An allergen code; the EU and US roll-ups are derived from these.',
});

// ---- formula ------------------------------------------------------------------------------
export const Ripen = Type.Object(
  {
    hours: Range,
    temperature: Type.Optional(TemperatureRange),
  },
  { additionalProperties: false, description: 'How long and how warm a pre-ferment ripens.' },
);

export const Preferment = Type.Object(
  {
    name: Type.String({ minLength: 1 }),
    kind: Type.Unsafe<(typeof PREFERMENT_KINDS)[number]>({ type: 'string', enum: [...PREFERMENT_KINDS] }),
    share: Type.Union([Type.Number({ exclusiveMinimum: 0 }), Type.String({ pattern: PERCENT_PATTERN })], {
      description: 'Share of the total flour that this pre-ferment holds, e.g. "30 %".',
    }),
    ingredients: PercentTable,
    ripen: Type.Optional(Ripen),
    temperature: Type.Optional(Type.String({ pattern: TEMPERATURE_PATTERN, description: 'Target temperature of the build when mixed.' })),
    note: Type.Optional(Type.String()),
  },
  { additionalProperties: false },
);

export const Soaker = Type.Object(
  {
    name: Type.String({ minLength: 1 }),
    ingredients: PercentTable,
    soak: Type.Optional(
      Type.Object(
        { hours: Range, temperature: Type.Optional(Temperature), hot: Type.Optional(Type.Boolean({ description: 'Made with boiling water (a scald).' })) },
        { additionalProperties: false },
      ),
    ),
    note: Type.Optional(Type.String()),
  },
  { additionalProperties: false },
);

export const Step = Type.Object(
  {
    step: Type.Unsafe<(typeof STEP_KINDS)[number]>({ type: 'string', enum: [...STEP_KINDS] }),
    minutes: Type.Optional(Range),
    hours: Type.Optional(Range),
    temperature: Type.Optional(Temperature),
    folds: Type.Optional(
      Type.Object(
        {
          count: Type.Integer({ minimum: 1 }),
          every: Type.Number({ exclusiveMinimum: 0, description: 'Minutes between folds.' }),
        },
        { additionalProperties: false },
      ),
    ),
    vessel: Type.Optional(Type.Unsafe<(typeof VESSELS)[number]>({
      type: 'string',
      enum: [...VESSELS],
      description: 'What the pieces are in: bake deck, tray, pot, tin or stone; proof and retard also banneton or couche.',
    })),
    covered: Type.Optional(Type.Number({ minimum: 0, description: 'Minutes of the bake under a lid or cover.' })),
    steam: Type.Optional(Type.Boolean()),
    per_slot: Type.Optional(Type.Number({
      exclusiveMinimum: 0,
      description: 'Bake: pieces that fill one oven slot (tray or peel place); below 1 when a piece takes more than one slot.',
    })),
    seconds_per_piece: Type.Optional(Type.Number({
      exclusiveMinimum: 0,
      description: "Divide, preshape or shape: one person's handling time per piece, in seconds.",
    })),
    note: Type.Optional(Type.String()),
  },
  { additionalProperties: false },
);

export const Finish = Type.Object(
  {
    ingredient: Type.String({ minLength: 1, description: 'Catalog name of what goes on or under the piece.' }),
    per_piece: Type.String({ pattern: MASS_PATTERN, description: 'Weight used on each piece, e.g. "4 g".' }),
    use: Type.Unsafe<(typeof FINISH_USES)[number]>({
      type: 'string',
      enum: [...FINISH_USES],
      description: 'topping (on top), wash (brushed on), tray (oil or grease under the piece), dusting (flour on the piece or the peel).',
    }),
    note: Type.Optional(Type.String()),
  },
  { additionalProperties: false, description: 'What goes on or under the dough: counted in the ingredient statement, allergens and nutrition.' },
);

export const FormulaFile = Type.Object(
  {
    $schema: Type.Optional(Type.String()),
    id: Type.String({ pattern: ID_PATTERN, description: 'kebab-case; equals the file name.' }),
    title: Type.String({ minLength: 1 }),
    status: Type.Unsafe<(typeof FORMULA_STATUSES)[number]>({ type: 'string', enum: [...FORMULA_STATUSES] }),
    category: Type.String({ pattern: ID_PATTERN, description: 'e.g. lean, sourdough, rye, enriched, oil, rolls.' }),
    description: Type.Optional(Type.String()),
    tags: Type.Optional(Type.Array(Type.String({ minLength: 1 }), { uniqueItems: true })),
    yield: Type.Object(
      {
        pieces: Type.Integer({ minimum: 1 }),
        piece: Mass,
      },
      { additionalProperties: false, description: 'The batch the formula is written for.' },
    ),
    loss: Type.Optional(Percent),
    bake_loss: Type.Optional(Type.Union([Type.Number(), Type.String({ pattern: PERCENT_PATTERN })], {
      description: 'Weight lost in the oven, in percent of the dough weight (taken as water). Default by category (common practice).',
    })),
    dough_temperature: Type.Optional(TemperatureRange),
    bassinage: Type.Optional(Type.Object(
      {
        percent: Type.Number({ exclusiveMinimum: 0, description: "Baker's percent of water held back, part of the formula's water line." }),
        temperature: Temperature,
      },
      { additionalProperties: false, description: 'Water held back and added late in the mix (bassinage), with its own temperature.' },
    )),
    flour: PercentTable,
    ingredients: PercentTable,
    preferments: Type.Optional(Type.Array(Preferment)),
    soakers: Type.Optional(Type.Array(Soaker)),
    process: Type.Optional(Type.Array(Step)),
    finishes: Type.Optional(Type.Array(Finish)),
    may_contain: Type.Optional(Type.Array(AllergenCode, { uniqueItems: true })),
    notes: Type.Optional(Type.String()),
  },
  { additionalProperties: false, $id: 'https://panform.example/schema/formula.schema.json', title: 'Panform formula' },
);

// ---- ingredient catalog --------------------------------------------------------------------
const grams100 = (description: string) => Type.Number({ minimum: 0, maximum: 100, description });
export const Nutrients = Type.Object(
  {
    fat: grams100('Fat, g per 100 g.'),
    saturates: grams100('Saturated fatty acids, g per 100 g.'),
    carbohydrate: grams100('Total carbohydrate (by difference, fibre included), g per 100 g.'),
    sugars: grams100('Total sugars, g per 100 g.'),
    fibre: grams100('Dietary fibre, g per 100 g.'),
    protein: grams100('Protein, g per 100 g.'),
    sodium_mg: Type.Number({ minimum: 0, maximum: 100000, description: 'Sodium, mg per 100 g.' }),
    source: Type.String({ minLength: 1, description: 'Where the values come from: a supplier specification, or a food composition table and its number.' }),
  },
  { additionalProperties: false, description: 'Per 100 g, grams unless the key says mg.' },
);
export const CatalogEntry = Type.Object(
  {
    kind: Type.Unsafe<(typeof INGREDIENT_KINDS)[number]>({ type: 'string', enum: [...INGREDIENT_KINDS] }),
    water: Type.Optional(Type.Union([Type.Number({ minimum: 0, maximum: 100 }), Type.String({ pattern: PERCENT_PATTERN })], {
      description: 'Water content in percent of its weight.',
    })),
    water_source: Type.Optional(Type.String({ minLength: 1, description: 'Where the water content comes from: a food composition table and its number, or a supplier specification.' })),
    allergens: Type.Optional(Type.Array(AllergenCode, { uniqueItems: true })),
    yeast: Type.Optional(Type.Unsafe<(typeof YEAST_TYPES)[number]>({ type: 'string', enum: [...YEAST_TYPES] })),
    yeast_factor: Type.Optional(Type.Number({
      exclusiveMinimum: 0,
      description: 'Grams of this yeast that replace 1 g of fresh yeast (default: fresh 1, active-dry 0.4, instant 0.33).',
    })),
    /** For a culture (levain seed): its hydration and the flour it is fed with. */
    hydration: Type.Optional(Percent),
    fed_with: Type.Optional(Type.String({ minLength: 1 })),
    cost_per_kg: Type.Optional(Type.Number({ minimum: 0 })),
    cost_date: Type.Optional(Type.String({ pattern: DATE_PATTERN })),
    /** A compound ingredient: its components in descending order of weight. */
    components: Type.Optional(Type.Array(Type.String({ minLength: 1 }), { minItems: 1 })),
    label: Type.Optional(Type.String({ minLength: 1, description: 'Name on the ingredient statement.' })),
    labels: Type.Optional(Type.Object(
      {
        eu: Type.Optional(Type.String({ minLength: 1 })),
        us: Type.Optional(Type.String({ minLength: 1 })),
      },
      { additionalProperties: false, description: 'The name on the statement for one market, where it differs from label.' },
    )),
    nutrients: Type.Optional(Nutrients),
    feeding: Type.Optional(Type.Object(
      {
        ratio: Type.Optional(Type.String({ pattern: RATIO_PATTERN, description: 'Culture : flour : water by weight at a feed, e.g. "1:2:2" (default 1:2:2, water scaled to the hydration).' })),
        hours: Type.Optional(Range),
        temperature: Type.Optional(TemperatureRange),
        keep: Type.Optional(Type.String({ pattern: MASS_PATTERN, description: 'Ripe culture kept back after the builds, to feed again, e.g. "300 g".' })),
      },
      { additionalProperties: false, description: "A culture's feed before the night's builds: ratio, hours to ripe, temperature and what is kept back." },
    )),
    note: Type.Optional(Type.String()),
  },
  { additionalProperties: false },
);

export const CatalogFile = Type.Record(Type.String({ minLength: 1 }), CatalogEntry, {
  $id: 'https://panform.example/schema/catalog.schema.json',
  title: 'Panform ingredient catalog',
});

// ---- production plan -----------------------------------------------------------------------
export const Mixer = Type.Object(
  {
    name: Type.String({ minLength: 1 }),
    kind: Type.Optional(Type.Unsafe<(typeof MIXER_KINDS)[number]>({
      type: 'string', enum: [...MIXER_KINDS], description: 'machine (default) or hand; by hand the capacity is the batch one person mixes.',
    })),
    capacity: Mass,
    minimum: Type.Optional(Mass),
    rise: Type.Optional(Type.String({
      pattern: TEMPERATURE_PATTERN,
      description: "The mixer's temperature rise: how much warmer a dough comes off it than its ingredients' average (a difference).",
    })),
    friction: Type.Optional(Type.String({
      pattern: TEMPERATURE_PATTERN,
      description: 'The friction factor found on a straight dough (three factors: room, flour, water), a difference; rise = friction / 3.',
    })),
    clean_down: Type.Optional(Type.Number({
      minimum: 0,
      description: 'Minutes to clean the bowl and hook before a dough without an allergen follows one with it.',
    })),
  },
  { additionalProperties: false },
);

export const Oven = Type.Object(
  {
    name: Type.String({ minLength: 1 }),
    decks: Type.Integer({ minimum: 1, description: 'Independent chambers, each with its own temperature (a rack oven: 1).' }),
    slots: Type.Integer({ minimum: 1, description: 'Trays or peel places per deck.' }),
    heat: Type.Optional(Type.String({ pattern: RATE_PATTERN, description: 'How fast a deck heats up, e.g. "4 °C/min".' })),
    cool: Type.Optional(Type.String({ pattern: RATE_PATTERN, description: 'How fast a deck cools down, e.g. "2 °C/min".' })),
    steam: Type.Optional(Type.Boolean({ description: 'The oven can steam.' })),
    fan: Type.Optional(Type.Boolean({ description: 'A fan (convection or rack) oven: trays, tins and pots, no bread on the sole.' })),
  },
  { additionalProperties: false },
);

export const Shift = Type.Object(
  {
    from: Type.String({ pattern: CLOCK_PATTERN, description: 'Start, "HH:MM".' }),
    to: Type.String({ pattern: CLOCK_PATTERN, description: 'End, "HH:MM"; a time not after `from` ends the next day.' }),
    people: Type.Integer({ minimum: 1, description: 'People on the bench for dividing, preshaping and shaping.' }),
    date: Type.Optional(Type.String({ pattern: DATE_PATTERN, description: "The day the shift starts; default the plan's date." })),
    name: Type.Optional(Type.String({ minLength: 1, description: 'A name to print the sheet for this shift by (panform sheet --shift NAME), e.g. "evening builds".' })),
  },
  { additionalProperties: false },
);

export const Scale = Type.Object(
  {
    name: Type.String({ minLength: 1 }),
    max: Type.String({ pattern: MASS_PATTERN, description: 'The most it weighs, e.g. "60 kg".' }),
    resolution: Type.String({ pattern: MASS_PATTERN, description: 'The step it reads in (its division), e.g. "0.5 g".' }),
  },
  { additionalProperties: false },
);

export const Equipment = Type.Object(
  {
    tray: Type.Optional(Type.Integer({ minimum: 0, description: 'Baking trays (one fills an oven slot).' })),
    tin: Type.Optional(Type.Integer({ minimum: 0, description: 'Loaf tins.' })),
    pot: Type.Optional(Type.Integer({ minimum: 0, description: 'Lidded pots.' })),
    banneton: Type.Optional(Type.Integer({ minimum: 0, description: 'Proofing baskets.' })),
    couche: Type.Optional(Type.Integer({ minimum: 0, description: "Linen couches (each holds one oven slot's load)." })),
  },
  { additionalProperties: false, description: 'What the bakery has to hold the pieces: trays, tins, pots, bannetons, couches.' },
);

export const Order = Type.Object(
  {
    formula: Type.String({ pattern: ID_PATTERN }),
    pieces: Type.Integer({ minimum: 1 }),
    piece: Type.Optional(Mass),
    mixer: Type.Optional(Type.String({ minLength: 1 })),
    oven: Type.Optional(Type.String({ minLength: 1, description: "The oven to bake it in; default any oven that suits the bake." })),
    customer: Type.Optional(Type.String()),
    due: Type.Optional(Type.String({ pattern: CLOCK_PATTERN, description: "When the last piece must be out of the oven, \"HH:MM\" on the plan's date; default ready_by." })),
  },
  { additionalProperties: false },
);

export const PlanFile = Type.Object(
  {
    $schema: Type.Optional(Type.String()),
    date: Type.String({ pattern: DATE_PATTERN }),
    ready_by: Type.String({ pattern: CLOCK_PATTERN, description: 'First bake out of the oven, "HH:MM".' }),
    conditions: Type.Object(
      {
        room: Temperature,
        flour: Temperature,
        tap_water: Temperature,
        preferment: Type.Optional(Temperature),
      },
      { additionalProperties: false },
    ),
    mixers: Type.Array(Mixer, { minItems: 1 }),
    ovens: Type.Optional(Type.Array(Oven, { minItems: 1 })),
    bench: Type.Optional(Type.Array(Shift, { minItems: 1, description: 'Shifts of people for dividing, preshaping and shaping.' })),
    orders: Type.Array(Order, { minItems: 1 }),
    equipment: Type.Optional(Equipment),
    scales: Type.Optional(Type.Array(Scale, { minItems: 1, description: 'The scales the bench weighs on.' })),
    ranges: Type.Optional(Type.Union([Type.Literal('short'), Type.Literal('mid'), Type.Literal('long')], {
      description: 'Which end of a step range the timeline uses; default mid.',
    })),
    notes: Type.Optional(Type.String()),
  },
  { additionalProperties: false, $id: 'https://panform.example/schema/plan.schema.json', title: 'Panform production plan' },
);

export type FormulaFile = Static<typeof FormulaFile>;
export type CatalogFile = Static<typeof CatalogFile>;
export type CatalogEntry = Static<typeof CatalogEntry>;
export type PlanFile = Static<typeof PlanFile>;
export type StepFile = Static<typeof Step>;
export type ScaleFile = Static<typeof Scale>;
export type EquipmentFile = Static<typeof Equipment>;
export type Vessel = (typeof VESSELS)[number];
export type EquipmentKind = (typeof EQUIPMENT_KINDS)[number];
export type OvenFile = Static<typeof Oven>;
export type ShiftFile = Static<typeof Shift>;
export type PrefermentFile = Static<typeof Preferment>;
export type SoakerFile = Static<typeof Soaker>;
export type FinishFile = Static<typeof Finish>;
export type NutrientsFile = Static<typeof Nutrients>;
export type FinishUse = (typeof FINISH_USES)[number];
export type AllergenCode = (typeof ALLERGEN_CODES)[number];
export type IngredientKind = (typeof INGREDIENT_KINDS)[number];
export type YeastType = (typeof YEAST_TYPES)[number];
export type FormulaStatus = (typeof FORMULA_STATUSES)[number];
export type PrefermentKind = (typeof PREFERMENT_KINDS)[number];
export type StepKind = (typeof STEP_KINDS)[number];
export type MixerKind = (typeof MIXER_KINDS)[number];

export const SCHEMAS = { formula: FormulaFile, catalog: CatalogFile, plan: PlanFile } as const;
export type SchemaKind = keyof typeof SCHEMAS;
