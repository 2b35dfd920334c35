// The words and patterns of Panform's files, without the schema library: code that only needs
// to know the allowed statuses, kinds or allergen codes imports them from here, so computing
// a batch never loads the schema builder. shapes.ts builds the schemas from these.
export const MASS_PATTERN = '^\\s*[0-9]+(\\.[0-9]+)?\\s*(g|kg|oz|lb)\\s*$';
export const TEMPERATURE_PATTERN = '^\\s*-?[0-9]+(\\.[0-9]+)?\\s*°?\\s*(C|F)\\s*$';
/** A temperature or a range of temperatures with one unit: "25 °C", "25-26 °C", "18–21 °C". */
export const TEMPERATURE_RANGE_PATTERN = '^\\s*-?[0-9]+(\\.[0-9]+)?(\\s*[-–]\\s*-?[0-9]+(\\.[0-9]+)?)?\\s*°?\\s*(C|F)\\s*$';
export const PERCENT_PATTERN = '^\\s*-?[0-9]+(\\.[0-9]+)?\\s*%\\s*$';
export const RANGE_PATTERN = '^\\s*[0-9]+(\\.[0-9]+)?(\\s*[-–]\\s*[0-9]+(\\.[0-9]+)?)?\\s*$';
/** A rate of temperature change: "4 °C/min" or "7 °F/min". */
export const RATE_PATTERN = '^\\s*[0-9]+(\\.[0-9]+)?\\s*°?\\s*(C|F)\\s*/\\s*min\\s*$';
export const CLOCK_PATTERN = '^([01][0-9]|2[0-3]):[0-5][0-9]$';
export const ID_PATTERN = '^[a-z0-9]+(-[a-z0-9]+)*$';
export const DATE_PATTERN = '^[0-9]{4}-[0-9]{2}-[0-9]{2}$';

export const FORMULA_STATUSES = ['draft', 'active', 'retired'] as const;
export const PREFERMENT_KINDS = ['poolish', 'biga', 'levain', 'sponge', 'old-dough', 'other'] as const;
export const STEP_KINDS = [
  'autolyse', 'mix', 'bulk', 'fold', 'divide', 'preshape', 'rest', 'shape', 'proof', 'retard', 'bake', 'cool', 'other',
] as const;
export const BAKE_VESSELS = ['deck', 'tray', 'pot', 'tin', 'stone'] as const;
/** What a step holds the pieces in: the bake vessels, and for proof and retard also bannetons and couches. */
export const VESSELS = [...BAKE_VESSELS, 'banneton', 'couche'] as const;
/** What a plan counts of its equipment (`equipment:`), each a number of pieces of kit. */
export const EQUIPMENT_KINDS = ['tray', 'tin', 'pot', 'banneton', 'couche'] as const;
/** A culture's feeding ratio, culture : flour : water, e.g. "1:2:2". */
export const RATIO_PATTERN = '^\\s*[0-9]+(\\.[0-9]+)?\\s*:\\s*[0-9]+(\\.[0-9]+)?\\s*:\\s*[0-9]+(\\.[0-9]+)?\\s*$';
export const INGREDIENT_KINDS = [
  'flour', 'water', 'salt', 'yeast', 'sugar', 'fat', 'dairy', 'egg', 'seed', 'inclusion', 'culture', 'improver', 'other',
] as const;
/** What a finish is for: on top of the piece, brushed on, under it in the tray or tin, or dusted on. */
export const FINISH_USES = ['topping', 'wash', 'tray', 'dusting'] as const;
/** How a plan's mixer works: a machine, or the bench's hands (a batch limit per person). */
export const MIXER_KINDS = ['machine', 'hand'] as const;
export const YEAST_TYPES = ['fresh', 'active-dry', 'instant'] as const;
export const ALLERGEN_CODES = [
  'wheat', 'rye', 'barley', 'oats', 'spelt', 'khorasan', 'crustaceans', 'eggs', 'fish', 'peanuts', 'soybeans', 'milk',
  'almonds', 'hazelnuts', 'walnuts', 'cashews', 'pecans', 'brazil-nuts', 'pistachios', 'macadamia', 'celery', 'mustard',
  'sesame', 'sulphites', 'lupin', 'molluscs',
] as const;

