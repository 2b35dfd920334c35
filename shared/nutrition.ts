// The nutrition declaration of a formula's product, EU or US, from the catalog's nutrients per
// 100 g of each ingredient. Pure; no I/O.
//
// What is summed. One piece as sold (product.ts): the dough's ingredients as used and the
// finishes, less the water lost in the oven (the bake loss carries no nutrients). Water carries
// nothing; a salt with no `nutrients` entry is sodium chloride, 39.3 % sodium (SODIUM_IN_SALT, from
// the standard atomic weights of Na and Cl). Every other ingredient needs a `nutrients` entry: when
// one lacks it there is no declaration, and the answer names what is missing.
//
// Carbohydrate. The catalog's `carbohydrate` is total carbohydrate, fibre included, as food
// composition tables give it "by difference" (USDA FoodData Central). The US declares that total
// (21 CFR 101.9(c)(6)); the EU declares carbohydrate without fibre (Regulation (EU) No 1169/2011
// Annex I: fibre is declared on its own), so EU carbohydrate = total − fibre.
//
// EU (Regulation (EU) No 1169/2011 Article 30, Annex XIV, Annex XV). Energy from the Annex XIV
// conversion factors, per 100 g and per piece; the order of Annex XV; salt = sodium × 2.5 (Annex I
// point 11); values rounded as the European Commission's guidance document on tolerances for
// nutrient values declared on a label (December 2012) says.
//
// US (21 CFR 101.9). Per serving: the reference amount customarily consumed for "breads (excluding
// sweet quick type), rolls" is 50 g (21 CFR 101.12(b), Table 2); a serving is whole pieces, or a
// fraction of a large piece, as 101.9(b)(2) says. Calories by the general factors 4, 4 and 9 on
// protein, total carbohydrate and fat (101.9(c)(1)(i)(B)); rounding by 101.9(c); percent Daily
// Values from the DRVs of 101.9(c)(9). Added sugars are the sugars of ingredients of kind sugar.
//
// This supports, and does not replace, a labelling review under local rules: supplier values,
// analysis and the tolerances are the bakery's to check.
import type { Catalog, Formula, Nutrients } from './model.ts';
import { lookupIngredient } from './model.ts';
import { productPiece, ProductError, type BakeLoss } from './product.ts';
import type { Jurisdiction } from './allergens.ts';

/** Regulation (EU) No 1169/2011 Annex I point 11: salt = sodium × 2.5. */
export const SALT_PER_SODIUM = 2.5;
/** Standard atomic weights (IUPAC, abridged): Na 22.990, Cl 35.45. */
export const ATOMIC_WEIGHT = { Na: 22.98976928, Cl: 35.453 } as const;
/** Mass fraction of sodium in sodium chloride: 22.990 / 58.443 = 0.3934. */
export const SODIUM_IN_SALT = ATOMIC_WEIGHT.Na / (ATOMIC_WEIGHT.Na + ATOMIC_WEIGHT.Cl);

/** Regulation (EU) No 1169/2011 Annex XIV: energy per gram. */
export const EU_ENERGY_FACTORS = {
  carbohydrate: { kj: 17, kcal: 4 },
  protein: { kj: 17, kcal: 4 },
  fat: { kj: 37, kcal: 9 },
  fibre: { kj: 8, kcal: 2 },
} as const;
/** 21 CFR 101.9(c)(1)(i)(B): calories per gram of protein, total carbohydrate and total fat. */
export const US_CALORIE_FACTORS = { protein: 4, carbohydrate: 4, fat: 9 } as const;
/** kJ in a kcal (the thermochemical calorie). */
export const KJ_PER_KCAL = 4.184;
/** 21 CFR 101.12(b) Table 2, bakery products: breads (excluding sweet quick type), rolls. */
export const US_RACC_BREAD_GRAMS = 50;
/** 21 CFR 101.9(c)(9): Daily Reference Values for adults and children 4 years and older. */
export const US_DAILY_VALUES = { fat: 78, saturates: 20, sodiumMg: 2300, carbohydrate: 275, fibre: 28, addedSugars: 50, protein: 50 } as const;

export const NUTRITION_CAUTION =
  'This nutrition declaration is worked out from the catalog\'s values per ingredient; it supports, and does not replace, a labelling review under local rules. ' +
  'Check the values against suppliers\' specifications or an analysis, and the declared figures against the tolerances your authority applies.';

/** The values a declaration carries, in this order (EU Annex XV). Grams, energy in kJ and kcal. */
export interface NutrientValues {
  energyKj: number;
  energyKcal: number;
  fat: number;
  saturates: number;
  carbohydrate: number;
  sugars: number;
  fibre: number;
  protein: number;
  salt: number;
}
export const NUTRIENT_KEYS = ['energyKj', 'energyKcal', 'fat', 'saturates', 'carbohydrate', 'sugars', 'fibre', 'protein', 'salt'] as const;

/** One line of the printed declaration. */
export interface DeclarationLine {
  key: string;
  label: string;
  /** Indented under the line before ("of which saturates"). */
  sub: boolean;
  /** As printed per 100 g (EU) or per serving (US). */
  value: string;
  /** EU: per piece, as printed. */
  perPiece?: string;
  /** US: percent Daily Value, when there is one. */
  dailyValue?: number;
}

export interface UsServing {
  /** "1 piece (72 g)", "1/18 of a loaf (50 g)". */
  text: string;
  grams: number;
  racc: number;
  perServing: NutrientValues & { sodiumMg: number; addedSugars: number };
  declared: { calories: number; fat: number; saturates: number; sodiumMg: number; carbohydrate: number; fibre: number; sugars: number; addedSugars: number; protein: number };
  dailyValuePercent: { fat: number; saturates: number; sodiumMg: number; carbohydrate: number; fibre: number; addedSugars: number };
}

export interface NutritionDeclaration {
  formula: string;
  title: string;
  rules: Jurisdiction;
  /** Per 100 g of the baked product (EU energy and carbohydrate under EU rules; US totals under US rules). */
  per100g: NutrientValues;
  /** Per piece as sold. */
  perPiece: NutrientValues;
  /** As declared: EU per 100 g by the 2012 guidance; US per serving by 21 CFR 101.9(c). */
  rounded: NutrientValues;
  /** EU: per piece as declared. */
  roundedPerPiece: NutrientValues;
  piece: { doughGrams: number; bakedGrams: number; bakeLoss: BakeLoss };
  /** US rules only. */
  serving: UsServing | null;
  lines: DeclarationLine[];
  sources: { ingredient: string; source: string }[];
  notes: string[];
  caution: string;
}

export type NutritionResult =
  | { ok: true; declaration: NutritionDeclaration }
  | { ok: false; missing: string[]; message: string };

export class NutritionError extends Error {
  constructor(message: string) {
    super(message);
    this.name = 'NutritionError';
  }
}

/** What the catalog gives per 100 g of an ingredient, or null when it gives nothing usable. */
export function nutrientsOf(catalog: Catalog, name: string): Nutrients | null {
  const item = Object.hasOwn(catalog, name) ? catalog[name] : undefined;
  if (item?.nutrients) return item.nutrients;
  const kind = item?.kind ?? lookupIngredient(catalog, name).kind;
  if (!item) return null;
  if (kind === 'water') return { fat: 0, saturates: 0, carbohydrate: 0, sugars: 0, fibre: 0, protein: 0, sodiumMg: 0, source: 'water carries no nutrients' };
  if (kind === 'salt') {
    return { fat: 0, saturates: 0, carbohydrate: 0, sugars: 0, fibre: 0, protein: 0, sodiumMg: SODIUM_IN_SALT * 100_000, source: 'sodium chloride: 39.3 % sodium (standard atomic weights of Na and Cl)' };
  }
  return null;
}

/** Rounds to a step without binary drift (2.45 to 0.1 is 2.5). */
export function roundTo(x: number, step: number): number {
  const q = Math.round(Number((x / step).toPrecision(12)));
  const decimals = Math.max(0, -Math.floor(Math.log10(step) + 1e-9));
  return Number((q * step).toFixed(decimals));
}

/**
 * EU rounding (European Commission guidance on tolerances, December 2012): energy to 1 kJ/kcal;
 * fat, carbohydrate, sugars, fibre, protein to 1 g from 10 g, 0.1 g above 0.5 g, else 0 ("<0.5 g"
 * may be declared); saturates to 1 g from 10 g, 0.1 g above 0.1 g, else 0; salt to 0.1 g from 1 g,
 * 0.01 g above 0.0125 g, else 0.
 */
export function roundEu(key: (typeof NUTRIENT_KEYS)[number], x: number): number {
  switch (key) {
    case 'energyKj':
    case 'energyKcal':
      return roundTo(x, 1);
    case 'saturates':
      return x >= 10 ? roundTo(x, 1) : x > 0.1 ? roundTo(x, 0.1) : 0;
    case 'salt':
      return x >= 1 ? roundTo(x, 0.1) : x > 0.0125 ? roundTo(x, 0.01) : 0;
    default:
      return x >= 10 ? roundTo(x, 1) : x > 0.5 ? roundTo(x, 0.1) : 0;
  }
}

/** The step the EU guidance rounds an amount to (0 below the smallest step). */
function euStep(key: (typeof NUTRIENT_KEYS)[number], x: number): number {
  if (key === 'energyKj' || key === 'energyKcal') return 1;
  if (key === 'saturates') return x >= 10 ? 1 : 0.1;
  if (key === 'salt') return x >= 1 ? 0.1 : 0.01;
  return x >= 10 ? 1 : 0.1;
}

/** As printed: "4.0 g", "0.79 g", "<0.5 g" for an amount that rounds to nothing, "978 kJ". */
export function euText(key: (typeof NUTRIENT_KEYS)[number], x: number): string {
  const r = roundEu(key, x);
  if (key === 'energyKj') return `${r} kJ`;
  if (key === 'energyKcal') return `${r} kcal`;
  if (r === 0) return x > 0 ? (key === 'saturates' ? '<0.1 g' : key === 'salt' ? '<0.01 g' : '<0.5 g') : '0 g';
  const step = euStep(key, r);
  return `${r.toFixed(step >= 1 ? 0 : step >= 0.1 ? 1 : 2)} g`;
}

/** 21 CFR 101.9(c)(1): calories below 5 as 0, to 5 up to 50, to 10 above 50. */
export function roundUsCalories(x: number): number {
  return x < 5 ? 0 : x <= 50 ? roundTo(x, 5) : roundTo(x, 10);
}
/** 21 CFR 101.9(c)(2) and (c)(2)(i): fat and saturated fat below 0.5 g as 0, to 0.5 g below 5 g, to 1 g from 5 g. */
export function roundUsFat(x: number): number {
  return x < 0.5 ? 0 : x < 5 ? roundTo(x, 0.5) : roundTo(x, 1);
}
/** 21 CFR 101.9(c)(4): sodium below 5 mg as 0, to 5 mg from 5 to 140 mg, to 10 mg above 140 mg. */
export function roundUsSodium(mg: number): number {
  return mg < 5 ? 0 : mg <= 140 ? roundTo(mg, 5) : roundTo(mg, 10);
}
/** 21 CFR 101.9(c)(6) and (c)(7): carbohydrate, fibre, sugars and protein below 0.5 g as 0, else to 1 g. */
export function roundUsGrams(x: number): number {
  return x < 0.5 ? 0 : roundTo(x, 1);
}

/** 21 CFR 101.9(b)(2): whole pieces closest to the reference amount, or a fraction of a large piece. */
export function usServing(pieceGrams: number, racc = US_RACC_BREAD_GRAMS): { pieces: number; fraction: number; grams: number; text: string } {
  const share = pieceGrams / racc;
  const g = (x: number) => `${Math.round(x)} g`;
  if (share <= 0.5) {
    const n = Math.max(1, Math.round(racc / pieceGrams));
    return { pieces: n, fraction: 1, grams: n * pieceGrams, text: `${n} pieces (${g(n * pieceGrams)})` };
  }
  if (share < 2 / 3) {
    // (b)(2)(i)(B): one or two units may be declared; the count nearer the reference amount.
    const n = Math.abs(2 * pieceGrams - racc) < Math.abs(pieceGrams - racc) ? 2 : 1;
    return { pieces: n, fraction: 1, grams: n * pieceGrams, text: `${n} ${n === 1 ? 'piece' : 'pieces'} (${g(n * pieceGrams)})` };
  }
  if (share <= 2) return { pieces: 1, fraction: 1, grams: pieceGrams, text: `1 piece (${g(pieceGrams)})` };
  // (b)(2)(ii): a large unit usually divided: the fraction (1/2 to 1/6, or smaller by halving or
  // thirding those) whose slice is nearest the reference amount.
  let best = 2;
  for (const k of fractions()) if (Math.abs(pieceGrams / k - racc) < Math.abs(pieceGrams / best - racc)) best = k;
  return { pieces: 1, fraction: best, grams: pieceGrams / best, text: `1/${best} of a piece (${g(pieceGrams / best)})` };
}

function fractions(): number[] {
  const out = new Set<number>();
  for (const base of [2, 3, 4, 5, 6]) {
    for (let a = 1; a <= 512; a *= 2) for (let b = 1; b <= 243; b *= 3) if (base * a * b <= 1000) out.add(base * a * b);
  }
  return [...out].sort((x, y) => x - y);
}

const zero = (): NutrientValues => ({ energyKj: 0, energyKcal: 0, fat: 0, saturates: 0, carbohydrate: 0, sugars: 0, fibre: 0, protein: 0, salt: 0 });
const scaleValues = (v: NutrientValues, f: number): NutrientValues =>
  Object.fromEntries(NUTRIENT_KEYS.map((k) => [k, v[k] * f])) as unknown as NutrientValues;

/** Energy of grams of fat, carbohydrate (EU: without fibre; US: total), fibre and protein. */
export function energyOf(g: { fat: number; carbohydrate: number; fibre: number; protein: number }, rules: Jurisdiction): { kj: number; kcal: number } {
  if (rules === 'eu') {
    const f = EU_ENERGY_FACTORS;
    return {
      kj: g.fat * f.fat.kj + g.carbohydrate * f.carbohydrate.kj + g.fibre * f.fibre.kj + g.protein * f.protein.kj,
      kcal: g.fat * f.fat.kcal + g.carbohydrate * f.carbohydrate.kcal + g.fibre * f.fibre.kcal + g.protein * f.protein.kcal,
    };
  }
  const u = US_CALORIE_FACTORS;
  const kcal = g.fat * u.fat + g.carbohydrate * u.carbohydrate + g.protein * u.protein;
  return { kj: kcal * KJ_PER_KCAL, kcal };
}

/**
 * The nutrition declaration of one piece of the formula's product, or the ingredients that lack
 * values. Throws NutritionError for a formula it cannot weigh (ScaleError from scale.ts too).
 */
export function nutritionDeclaration(formula: Formula, catalog: Catalog, options: { rules: Jurisdiction; bakeLoss?: number }): NutritionResult {
  const rules = options.rules;
  let piece;
  try {
    piece = productPiece(formula, catalog, { bakeLoss: options.bakeLoss });
  } catch (e) {
    if (e instanceof ProductError) throw new NutritionError(e.message);
    throw e;
  }
  const lines = [...piece.dough, ...piece.finishes.map((f) => ({ ingredient: f.ingredient, grams: f.grams }))].filter((l) => l.grams > 0);
  const missing = [...new Set(lines.filter((l) => nutrientsOf(catalog, l.ingredient) === null).map((l) => l.ingredient))];
  if (missing.length > 0) {
    return {
      ok: false,
      missing,
      message: `no nutrition declaration for ${formula.id}: the catalog gives no nutrients for ${missing.map((m) => `"${m}"`).join(', ')}; add "nutrients" (per 100 g, with its source) to ${missing.length === 1 ? 'that entry' : 'those entries'}`,
    };
  }
  // Grams of each nutrient in one piece; total carbohydrate, and sodium in mg.
  let fat = 0, saturates = 0, carbohydrate = 0, sugars = 0, fibre = 0, protein = 0, sodiumMg = 0, addedSugars = 0;
  const sources = new Map<string, string>();
  for (const l of lines) {
    const n = nutrientsOf(catalog, l.ingredient)!;
    const f = l.grams / 100;
    fat += n.fat * f;
    saturates += n.saturates * f;
    carbohydrate += n.carbohydrate * f;
    sugars += n.sugars * f;
    fibre += n.fibre * f;
    protein += n.protein * f;
    sodiumMg += n.sodiumMg * f;
    if (lookupIngredient(catalog, l.ingredient).kind === 'sugar') addedSugars += n.sugars * f;
    sources.set(l.ingredient, n.source);
  }
  const carbs = rules === 'eu' ? Math.max(0, carbohydrate - fibre) : carbohydrate;
  const energy = energyOf({ fat, carbohydrate: carbs, fibre, protein }, rules);
  const perPiece: NutrientValues = {
    energyKj: energy.kj, energyKcal: energy.kcal, fat, saturates, carbohydrate: carbs, sugars, fibre, protein, salt: (sodiumMg * SALT_PER_SODIUM) / 1000,
  };
  const per100g = scaleValues(perPiece, 100 / piece.bakedGrams);
  const notes: string[] = [
    `Per piece: ${Number(piece.bakedGrams.toFixed(1))} g as sold, from ${Number(piece.doughGrams.toFixed(1))} g of dough less the ${piece.bakeLoss.note}${piece.finishes.length > 0 ? ', plus its finishes' : ''}.`,
  ];
  let rounded: NutrientValues;
  let roundedPerPiece = zero();
  let serving: UsServing | null = null;
  let declLines: DeclarationLine[];
  if (rules === 'eu') {
    rounded = Object.fromEntries(NUTRIENT_KEYS.map((k) => [k, roundEu(k, per100g[k])])) as unknown as NutrientValues;
    roundedPerPiece = Object.fromEntries(NUTRIENT_KEYS.map((k) => [k, roundEu(k, perPiece[k])])) as unknown as NutrientValues;
    const row = (key: (typeof NUTRIENT_KEYS)[number], label: string, sub = false): DeclarationLine => ({
      key, label, sub, value: euText(key, per100g[key]), perPiece: euText(key, perPiece[key]),
    });
    declLines = [
      { key: 'energy', label: 'Energy', sub: false, value: `${euText('energyKj', per100g.energyKj)} / ${euText('energyKcal', per100g.energyKcal)}`, perPiece: `${euText('energyKj', perPiece.energyKj)} / ${euText('energyKcal', perPiece.energyKcal)}` },
      row('fat', 'Fat'),
      row('saturates', 'of which saturates', true),
      row('carbohydrate', 'Carbohydrate'),
      row('sugars', 'of which sugars', true),
      row('fibre', 'Fibre'),
      row('protein', 'Protein'),
      row('salt', 'Salt'),
    ];
    notes.push('Carbohydrate is available carbohydrate (total less fibre); energy from the Annex XIV factors (fat 37 kJ/9 kcal, carbohydrate and protein 17 kJ/4 kcal, fibre 8 kJ/2 kcal per gram).');
  } else {
    const s = usServing(piece.bakedGrams);
    const f = s.grams / piece.bakedGrams;
    const per = { ...scaleValues(perPiece, f), sodiumMg: sodiumMg * f, addedSugars: addedSugars * f };
    const declared = {
      calories: roundUsCalories(per.energyKcal),
      fat: roundUsFat(per.fat),
      saturates: roundUsFat(per.saturates),
      sodiumMg: roundUsSodium(per.sodiumMg),
      carbohydrate: roundUsGrams(per.carbohydrate),
      fibre: roundUsGrams(per.fibre),
      sugars: roundUsGrams(per.sugars),
      addedSugars: roundUsGrams(per.addedSugars),
      protein: roundUsGrams(per.protein),
    };
    // 101.9(d)(7)(ii): the percent from the amount declared (so "0g" reads 0 %), to the nearest whole percent.
    const dv = US_DAILY_VALUES;
    const pctOf = (x: number, d: number) => Math.round(Number(((x / d) * 100).toPrecision(12)));
    const dailyValuePercent = {
      fat: pctOf(declared.fat, dv.fat), saturates: pctOf(declared.saturates, dv.saturates), sodiumMg: pctOf(declared.sodiumMg, dv.sodiumMg),
      carbohydrate: pctOf(declared.carbohydrate, dv.carbohydrate), fibre: pctOf(declared.fibre, dv.fibre), addedSugars: pctOf(declared.addedSugars, dv.addedSugars),
    };
    serving = { text: s.text, grams: s.grams, racc: US_RACC_BREAD_GRAMS, perServing: per, declared, dailyValuePercent };
    rounded = {
      energyKj: roundTo(declared.calories * KJ_PER_KCAL, 1), energyKcal: declared.calories, fat: declared.fat, saturates: declared.saturates,
      carbohydrate: declared.carbohydrate, sugars: declared.sugars, fibre: declared.fibre, protein: declared.protein,
      salt: roundTo((declared.sodiumMg * SALT_PER_SODIUM) / 1000, 0.01),
    };
    declLines = [
      { key: 'calories', label: 'Calories', sub: false, value: String(declared.calories) },
      { key: 'fat', label: 'Total Fat', sub: false, value: `${declared.fat}g`, dailyValue: dailyValuePercent.fat },
      { key: 'saturates', label: 'Saturated Fat', sub: true, value: `${declared.saturates}g`, dailyValue: dailyValuePercent.saturates },
      { key: 'sodium', label: 'Sodium', sub: false, value: `${declared.sodiumMg}mg`, dailyValue: dailyValuePercent.sodiumMg },
      { key: 'carbohydrate', label: 'Total Carbohydrate', sub: false, value: `${declared.carbohydrate}g`, dailyValue: dailyValuePercent.carbohydrate },
      { key: 'fibre', label: 'Dietary Fiber', sub: true, value: `${declared.fibre}g`, dailyValue: dailyValuePercent.fibre },
      { key: 'sugars', label: 'Total Sugars', sub: true, value: `${declared.sugars}g` },
      { key: 'addedSugars', label: `Includes ${declared.addedSugars}g Added Sugars`, sub: true, value: '', dailyValue: dailyValuePercent.addedSugars },
      { key: 'protein', label: 'Protein', sub: false, value: `${declared.protein}g` },
    ];
    notes.push(
      `Serving: ${s.text}, the reference amount for breads and rolls being ${US_RACC_BREAD_GRAMS} g (21 CFR 101.12(b)); calories by 4, 4 and 9 per gram of protein, total carbohydrate and fat.`,
      'Trans fat, cholesterol, vitamin D, calcium, iron and potassium are required on the Nutrition Facts panel but are not in the catalog: add them from the suppliers\' specifications or an analysis.',
    );
  }
  return {
    ok: true,
    declaration: {
      formula: formula.id,
      title: formula.title,
      rules,
      per100g,
      perPiece,
      rounded,
      roundedPerPiece,
      piece: { doughGrams: piece.doughGrams, bakedGrams: piece.bakedGrams, bakeLoss: piece.bakeLoss },
      serving,
      lines: declLines,
      sources: [...sources].map(([ingredient, source]) => ({ ingredient, source })),
      notes,
      caution: NUTRITION_CAUTION,
    },
  };
}
