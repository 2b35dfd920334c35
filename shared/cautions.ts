// The usual cautions for the work a formula or a day's sheet asks for: allergens, hot ovens and
// steam, lidded pots, scalding water, ice, cold rooms, raw egg and dairy, and the food-safety line
// that defers to local rules. One home for the rule: the formula page, the API, `panform scale`
// and the batch sheet all call cautionsFor, so they warn about the same things in the same words.
// Each caution has a topic, its identity: a surface that adds one (the viewer's ice, say) merges by
// topic, never by matching words. Pure; no I/O.
import { ALLERGEN_NAMES, allergenSummary, formulaIngredientNames, sortCodes } from './allergens.ts';
import { lookupIngredient, type Catalog, type Formula } from './model.ts';
import type { AllergenCode } from './schema/shapes.ts';
import { formatTemperature } from './units.ts';

export type CautionTopic =
  | 'allergens'
  | 'unlisted'
  | 'may-contain'
  | 'oven'
  | 'steam'
  | 'pots'
  | 'ice'
  | 'hot-water'
  | 'cold'
  | 'eggs-dairy'
  | 'food-safety';

export interface Caution {
  topic: CautionTopic;
  text: string;
}

/** What one product's work involves, read from its formula and the catalog. */
export interface CautionFacts {
  product: string;
  allergens: AllergenCode[];
  mayContain: AllergenCode[];
  /** Ingredients the catalog does not list: their allergens are unknown. */
  unlisted: string[];
  /** The hottest bake in °C; null without a bake step, 0 for a bake without a temperature. */
  hottestBake: number | null;
  steam: boolean;
  pots: boolean;
  hotWater: boolean;
  cold: boolean;
  eggs: boolean;
  dairy: boolean;
}

/** Below this (°C) a step or a build waits in a cold room or a retarder (common practice: 10 °C). */
const COLD_ROOM_CELSIUS = 10;

/** The facts of one formula. Throws AllergenError when the catalog's compounds loop. */
export function cautionFacts(formula: Formula, catalog: Catalog): CautionFacts {
  const summary = allergenSummary(formula, catalog);
  const bakes = formula.process.filter((s) => s.step === 'bake');
  const kinds = new Set(formulaIngredientNames(formula).map((n) => lookupIngredient(catalog, n).kind));
  return {
    product: formula.title,
    allergens: summary.codes,
    mayContain: summary.mayContain.codes,
    unlisted: summary.unlisted,
    hottestBake: bakes.length > 0 ? Math.max(...bakes.map((b) => b.temperature ?? 0)) : null,
    steam: bakes.some((b) => b.steam || /steam/i.test(b.note ?? '')),
    pots: bakes.some((b) => b.vessel === 'pot'),
    hotWater: formula.soakers.some((s) => s.hot),
    cold:
      formula.process.some((s) => s.step === 'retard' || (s.step !== 'bake' && s.temperature !== undefined && s.temperature < COLD_ROOM_CELSIUS)) ||
      formula.preferments.some((p) => p.ripenTemperature !== undefined && p.ripenTemperature < COLD_ROOM_CELSIUS) ||
      formula.soakers.some((s) => s.soakTemperature !== undefined && s.soakTemperature < COLD_ROOM_CELSIUS),
    eggs: kinds.has('egg'),
    dairy: kinds.has('dairy'),
  };
}

export interface CautionSet {
  /** Allergens in any product, in the catalog's order of codes. */
  allergens: AllergenCode[];
  /** Cross-contact allergens of any product that no product contains. */
  mayContain: AllergenCode[];
  cautions: Caution[];
}

/**
 * The cautions for the work of one or more products. `ice`: ice is weighed into a water line
 * (known only where water temperatures were worked out). With several products each allergen
 * names the products that carry it.
 */
export function cautionsFor(products: CautionFacts[], work: { ice: boolean }): CautionSet {
  const carriers = (pick: (f: CautionFacts) => AllergenCode[]) => {
    const m = new Map<AllergenCode, string[]>();
    for (const f of products) for (const a of pick(f)) m.set(a, [...new Set([...(m.get(a) ?? []), f.product])]);
    return m;
  };
  const contained = carriers((f) => f.allergens);
  const may = carriers((f) => f.mayContain);
  const allergens = sortCodes(contained.keys());
  const mayContain = sortCodes([...may.keys()].filter((a) => !contained.has(a)));
  const name = (codes: AllergenCode[], by: Map<AllergenCode, string[]>) =>
    products.length > 1 ? codes.map((a) => `${ALLERGEN_NAMES[a]} (${by.get(a)!.join(', ')})`).join('; ') : codes.map((a) => ALLERGEN_NAMES[a]).join(', ');
  const unlisted = [...new Set(products.flatMap((f) => f.unlisted))].sort();
  const bakes = products.map((f) => f.hottestBake).filter((t): t is number => t !== null);
  const hottest = Math.max(0, ...bakes);
  const any = (pick: (f: CautionFacts) => boolean) => products.some(pick);
  const eggs = any((f) => f.eggs);
  const dairy = any((f) => f.dairy);

  const out: Caution[] = [];
  const add = (topic: CautionTopic, when: boolean, text: string) => {
    if (when) out.push({ topic, text });
  };
  add(
    'allergens',
    allergens.length > 0,
    `Allergens: ${name(allergens, contained)}. Keep them apart, clean scales, bowls and benches between products, and label as your local allergen rules require.`,
  );
  add('unlisted', unlisted.length > 0, `Not in the ingredient catalog, so their allergens are unknown: ${unlisted.join(', ')}. Check them before anything made with them is sold.`);
  add('may-contain', mayContain.length > 0, `May contain (cross-contact): ${name(mayContain, may)}.`);
  add(
    'oven',
    bakes.length > 0,
    `Hot ovens${hottest > 0 ? ` (up to ${formatTemperature(hottest, 'C', 0)})` : ''}: dry oven gloves and long sleeves, peels and trays kept to their places, and a clear path to the racks.`,
  );
  add('steam', any((f) => f.steam), 'Steam: stand aside when opening a steamed oven and let the steam clear before reaching in.');
  add('pots', any((f) => f.pots), 'Pots: a lid and pot at oven heat burn through a damp cloth; lift them only with dry gloves, onto a clear surface.');
  add(
    'ice',
    work.ice,
    'Ice: weigh ice as part of the water (ice + tap water = the water line); use clean food-grade ice and a scoop, never a glass, and wipe up melt water on the floor at once.',
  );
  add('hot-water', any((f) => f.hotWater), 'Scalds: boiling water for hot soakers; pour slowly, away from the body, and let the soaker cool before it goes into a dough.');
  add('cold', any((f) => f.cold), 'Cold room: check that the door opens from inside before going in, keep the floor dry, and wear a warm layer for long stays.');
  add(
    'eggs-dairy',
    eggs || dairy,
    `${eggs && dairy ? 'Eggs and dairy' : eggs ? 'Eggs' : 'Dairy'}: keep ${eggs && dairy ? 'them' : eggs ? 'them' : 'it'} chilled until weighed${eggs ? ', and wash hands and tools after handling raw egg' : ''}.`,
  );
  out.push({
    topic: 'food-safety',
    text: "This supports, and does not replace, your site's food-safety plan and local food-safety and labelling rules; check temperatures, times and allergen controls as they require.",
  });
  return { allergens, mayContain, cautions: out };
}

/** The cautions for one formula's work. Throws AllergenError when the catalog's compounds loop. */
export function formulaCautions(formula: Formula, catalog: Catalog, work: { ice: boolean }): Caution[] {
  return cautionsFor([cautionFacts(formula, catalog)], work).cautions;
}

/**
 * A set with cautions added by topic (their identity): one already there is kept, a new one goes
 * where cautionsFor would have put it. For a surface that learns more later (the viewer's ice).
 */
export function mergeCautions(set: Caution[], more: Caution[]): Caution[] {
  const order: CautionTopic[] = ['allergens', 'unlisted', 'may-contain', 'oven', 'steam', 'pots', 'ice', 'hot-water', 'cold', 'eggs-dairy', 'food-safety'];
  const byTopic = new Map(set.map((c) => [c.topic, c]));
  for (const c of more) if (!byTopic.has(c.topic)) byTopic.set(c.topic, c);
  return [...byTopic.values()].sort((a, b) => order.indexOf(a.topic) - order.indexOf(b.topic));
}

/** The ice caution alone, for a surface that works out ice after the rest (the viewer's water helper). */
export function iceCaution(): Caution {
  return cautionsFor([], { ice: true }).cautions[0];
}
