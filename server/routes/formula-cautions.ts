// The cautions shown with a formula: what can hurt someone while making it (hot ovens, steam,
// scalds, cold rooms, allergens). Worded like the batch sheet's, and deferring to local rules.
import type { AllergenSummary } from '#shared/allergens';
import { ALLERGEN_NAMES } from '#shared/allergens';
import { lookupIngredient, type Catalog, type Formula } from '#shared/model';
import { formatTemperature } from '#shared/units';

export function formulaCautions(formula: Formula, catalog: Catalog, allergens: AllergenSummary): string[] {
  const out: string[] = [];
  if (allergens.codes.length > 0) {
    out.push(
      `Allergens: ${allergens.codes.map((c) => ALLERGEN_NAMES[c]).join(', ')}. Keep them apart, clean scales, bowls and benches between products, and label as your local allergen rules require.`,
    );
  }
  if (allergens.unlisted.length > 0) {
    out.push(`Not in the ingredient catalog, so their allergens are unknown: ${allergens.unlisted.join(', ')}. Check them before this product is sold.`);
  }
  if (allergens.mayContain.codes.length > 0) {
    out.push(`May contain (cross-contact): ${allergens.mayContain.codes.map((c) => ALLERGEN_NAMES[c]).join(', ')}.`);
  }
  const bakes = formula.process.filter((s) => s.step === 'bake');
  if (bakes.length > 0) {
    const hottest = Math.max(...bakes.map((b) => b.temperature ?? 0));
    out.push(
      `Hot oven${hottest > 0 ? ` (${formatTemperature(hottest, 'C', 0)})` : ''}: dry oven gloves and long sleeves, peels and trays kept to their places, and a clear path to the racks.`,
    );
  }
  if (bakes.some((b) => b.steam || /steam/i.test(b.note ?? ''))) {
    out.push('Steam: stand aside when opening a steamed oven and let the steam clear before reaching in.');
  }
  if (bakes.some((b) => b.vessel === 'pot')) {
    out.push('Pots: a lid and pot at oven heat burn through a damp cloth; lift them only with dry gloves, onto a clear surface.');
  }
  if (formula.soakers.some((s) => s.hot)) {
    out.push('Scalds: boiling water for the hot soaker; pour slowly, away from the body, and let the soaker cool before it goes into the dough.');
  }
  const cold =
    formula.process.some((s) => s.step === 'retard' || (s.temperature !== undefined && s.temperature < 10 && s.step !== 'bake')) ||
    formula.preferments.some((p) => p.ripenTemperature !== undefined && p.ripenTemperature < 10);
  if (cold) {
    out.push('Cold room: check that the door opens from inside before going in, keep the floor dry, and wear a warm layer for long stays.');
  }
  const names = [...formula.flour, ...formula.ingredients].map((l) => l.ingredient);
  if (names.some((n) => ['egg', 'dairy'].includes(lookupIngredient(catalog, n).kind))) {
    out.push('Eggs and dairy: keep them chilled until they are weighed and wash hands and tools after handling raw egg.');
  }
  out.push(
    "These figures support, and do not replace, your site's food-safety plan and local food-safety and labelling rules; check temperatures, times and allergen controls as they require.",
  );
  return out;
}
