// Baker's arithmetic: a formula in baker's percent scaled to a batch. Pure; no I/O.
//
// Conventions (docs/arithmetic.md):
// - total % = sum of all overall percentages (flours + ingredients).
// - pieces: divided dough D = N·P; mixed dough M = D / (1 − loss); flour F = M / (total % / 100).
// - mix or flour target: no loss is applied.
// - a pre-ferment's flour = F · share; each of its ingredients = its flour · percent / 100.
// - a soaker's ingredients are percent of the total flour.
// - final dough line = overall − what the pre-ferments and soakers take (never negative).
// - a levain seeded with a mature culture: the seed (a catalog `culture` with a hydration and the
//   flour it is fed with) is written in percent of the build's flour; its flour and water count as
//   flour and water of the build, and so of the formula. The build then asks for less fresh flour
//   and water: fresh = the listed line − the seed's part. The seed is not taken from the overall
//   formula (listing it there too is refused: it would count twice).
// - hydration: water lines / F; effective hydration adds the catalog water % of every non-flour
//   line (flour's own moisture is not counted); pre-fermented flour: pre-ferment flour / F.
// Weights stay unrounded here; rounding is for display only (units.ts).
import { lookupIngredient, type Catalog, type CatalogItem, type Formula, type Line } from './model.ts';
import type { IngredientKind } from './schema/shapes.ts';

export type ScaleTarget =
  | { by: 'pieces'; pieces: number; pieceGrams?: number }
  | { by: 'mix'; grams: number }
  | { by: 'flour'; grams: number };

export interface WeighedLine {
  ingredient: string;
  percent: number;
  grams: number;
}

export interface BuildLine extends WeighedLine {
  /** For a seed culture: true. Its grams are mixed in; its flour and water are inside the build's lines. */
  seed?: boolean;
  /** What to weigh when mixing the build (fresh flour and water less the seed's part). */
  weigh: number;
}

export interface ScaledBuild {
  name: string;
  kind: string;
  /** Flour in this build (seed flour included), g. */
  flour: number;
  /** Whole build, g. */
  grams: number;
  /** Share of total flour in percent (pre-ferments) */
  share?: number;
  /** Water / flour of the build, percent. */
  hydration: number;
  ingredients: BuildLine[];
}

export interface FinalLine {
  ingredient: string;
  grams: number;
  source: 'ingredient' | 'preferment' | 'soaker';
}

export interface ScaleResult {
  formula: string;
  title: string;
  target: ScaleTarget;
  pieces: number | null;
  pieceGrams: number | null;
  /** Percent applied (0 when scaled by mix or flour weight). */
  loss: number;
  mixedDough: number;
  dividedDough: number;
  flour: number;
  totalPercent: number;
  /** All water in the overall formula (pre-ferments' and soakers' included), g. */
  water: number;
  /** Water plus the water inside other ingredients (catalog water content), g. */
  effectiveWater: number;
  hydration: number;
  effectiveHydration: number;
  /** Flour held by all pre-ferments, g (seed flour included). */
  prefermentedFlourGrams: number;
  prefermentedFlour: number;
  /** Flour and water weighed into the final dough itself (outside the builds), g. */
  finalDoughFlour: number;
  finalDoughWater: number;
  finalDoughHydration: number;
  overall: (WeighedLine & { kind: IngredientKind })[];
  preferments: ScaledBuild[];
  soakers: ScaledBuild[];
  finalDough: FinalLine[];
}

/** Input that cannot be scaled: a clear message for the baker. */
export class ScaleError extends Error {
  constructor(message: string) {
    super(message);
    this.name = 'ScaleError';
  }
}

const EPSILON = 1e-9;

export function totalPercent(f: Formula): number {
  return sum(f.flour.map((l) => l.percent)) + sum(f.ingredients.map((l) => l.percent));
}

export function overallLines(f: Formula): Line[] {
  return [...f.flour, ...f.ingredients];
}

/** Total flour for a target, and the mixed and divided dough that go with it. */
export function resolveTarget(
  f: Formula,
  target: ScaleTarget,
): { flour: number; mixedDough: number; dividedDough: number; loss: number; pieces: number | null; pieceGrams: number | null } {
  const total = totalPercent(f);
  if (!(total > 0)) throw new ScaleError(`${f.id}: the formula's percentages add up to ${total} %, nothing to scale`);
  switch (target.by) {
    case 'pieces': {
      const piece = target.pieceGrams ?? f.yield.pieceGrams;
      if (!Number.isInteger(target.pieces) || target.pieces < 1) {
        throw new ScaleError(`pieces must be a whole number of at least 1; got ${target.pieces}`);
      }
      if (!(piece > 0) || !Number.isFinite(piece)) throw new ScaleError(`piece weight must be above 0 g; got ${piece} g`);
      if (!(f.loss >= 0 && f.loss < 100)) throw new ScaleError(`loss must be from 0 % to below 100 %; got ${f.loss} %`);
      const divided = target.pieces * piece;
      const mixed = divided / (1 - f.loss / 100);
      return { flour: mixed / (total / 100), mixedDough: mixed, dividedDough: divided, loss: f.loss, pieces: target.pieces, pieceGrams: piece };
    }
    case 'mix': {
      if (!(target.grams > 0) || !Number.isFinite(target.grams)) throw new ScaleError(`mixed dough weight must be above 0 g; got ${target.grams} g`);
      return { flour: target.grams / (total / 100), mixedDough: target.grams, dividedDough: target.grams, loss: 0, pieces: null, pieceGrams: null };
    }
    case 'flour': {
      if (!(target.grams > 0) || !Number.isFinite(target.grams)) throw new ScaleError(`flour weight must be above 0 g; got ${target.grams} g`);
      const mixed = target.grams * (total / 100);
      return { flour: target.grams, mixedDough: mixed, dividedDough: mixed, loss: 0, pieces: null, pieceGrams: null };
    }
  }
}

/** Water carried inside an ingredient, in percent of its weight (a culture without a stated water content: from its hydration). */
export function waterContent(item: CatalogItem): number {
  if (item.kind === 'culture' && item.water === 0 && item.hydration !== undefined) return (item.hydration / (100 + item.hydration)) * 100;
  return item.water;
}

export function scaleFormula(f: Formula, catalog: Catalog, target: ScaleTarget): ScaleResult {
  const t = resolveTarget(f, target);
  const F = t.flour;
  const total = totalPercent(f);
  // Everything listed under `flour:` is flour, whatever the catalog says (or does not say) about it.
  const flourNames = new Set(f.flour.map((l) => l.ingredient));
  const kindOf = (name: string): IngredientKind => (flourNames.has(name) ? 'flour' : lookupIngredient(catalog, name).kind);

  const overall = overallLines(f).map((l) => ({
    ingredient: l.ingredient,
    percent: l.percent,
    grams: (F * l.percent) / 100,
    kind: kindOf(l.ingredient),
  }));
  const overallByName = new Map<string, number>();
  for (const l of overall) overallByName.set(l.ingredient, (overallByName.get(l.ingredient) ?? 0) + l.grams);

  const taken = new Map<string, number>();
  const take = (ingredient: string, grams: number) => taken.set(ingredient, (taken.get(ingredient) ?? 0) + grams);

  const preferments: ScaledBuild[] = f.preferments.map((p) => {
    const pFlour = (F * p.share) / 100;
    const lines: BuildLine[] = [];
    const seeds: { line: BuildLine; flour: number; water: number; fedWith?: string }[] = [];
    for (const l of p.ingredients) {
      const grams = (pFlour * l.percent) / 100;
      const item = lookupIngredient(catalog, l.ingredient);
      if (item.kind === 'culture' && !flourNames.has(l.ingredient)) {
        if (overallByName.has(l.ingredient)) {
          throw new ScaleError(
            `${f.id}: the seed "${l.ingredient}" in "${p.name}" is also in the overall formula; its flour and water already count there, so list it in the build only`,
          );
        }
        const h = item.hydration ?? 100;
        const line: BuildLine = { ingredient: l.ingredient, percent: l.percent, grams, weigh: grams, seed: true };
        lines.push(line);
        seeds.push({ line, flour: (grams * 100) / (100 + h), water: (grams * h) / (100 + h), fedWith: item.fedWith });
      } else {
        lines.push({ ingredient: l.ingredient, percent: l.percent, grams, weigh: grams });
        take(l.ingredient, grams);
      }
    }
    for (const seed of seeds) {
      // The seed's flour comes out of the flour it is fed with, else out of the build's first flour.
      const flourLine =
        lines.find((l) => !l.seed && l.ingredient === seed.fedWith) ?? lines.find((l) => !l.seed && kindOf(l.ingredient) === 'flour');
      const waterLine = lines.find((l) => !l.seed && kindOf(l.ingredient) === 'water');
      if (!flourLine || !waterLine) {
        throw new ScaleError(`${f.id}: pre-ferment "${p.name}" has a seed culture but no flour or water line for it to count in`);
      }
      flourLine.weigh -= seed.flour;
      waterLine.weigh -= seed.water;
      for (const [line, part, what] of [[flourLine, seed.flour, 'flour'], [waterLine, seed.water, 'water']] as const) {
        if (line.weigh < -EPSILON * Math.max(1, F)) {
          throw new ScaleError(
            `${f.id}: the seed in "${p.name}" brings ${part.toFixed(1)} g of ${what}, more than the build's ${line.ingredient} (${line.grams.toFixed(1)} g)`,
          );
        }
        if (line.weigh < 0) line.weigh = 0;
      }
    }
    const buildLines = lines.filter((l) => !l.seed);
    const grams = sum(buildLines.map((l) => l.grams));
    const water = sum(buildLines.filter((l) => kindOf(l.ingredient) === 'water').map((l) => l.grams));
    return {
      name: p.name,
      kind: p.kind,
      flour: pFlour,
      grams,
      share: p.share,
      hydration: pFlour > 0 ? (water / pFlour) * 100 : 0,
      ingredients: lines,
    };
  });

  const soakers: ScaledBuild[] = f.soakers.map((s) => {
    const lines: BuildLine[] = s.ingredients.map((l) => {
      const grams = (F * l.percent) / 100;
      take(l.ingredient, grams);
      return { ingredient: l.ingredient, percent: l.percent, grams, weigh: grams };
    });
    const flourInSoaker = sum(lines.filter((l) => kindOf(l.ingredient) === 'flour').map((l) => l.grams));
    const water = sum(lines.filter((l) => kindOf(l.ingredient) === 'water').map((l) => l.grams));
    return {
      name: s.name,
      kind: 'soaker',
      flour: flourInSoaker,
      grams: sum(lines.map((l) => l.grams)),
      hydration: flourInSoaker > 0 ? (water / flourInSoaker) * 100 : 0,
      ingredients: lines,
    };
  });

  for (const [ingredient, grams] of taken) {
    const have = overallByName.get(ingredient);
    if (have === undefined) {
      const hint = catalog[ingredient] === undefined ? `; if it is a levain's seed, list it in the catalog with kind culture` : '';
      throw new ScaleError(`${f.id}: "${ingredient}" is in a pre-ferment or soaker but not in the overall formula${hint}`);
    }
    if (grams > have * (1 + 1e-9) + EPSILON) {
      throw new ScaleError(
        `${f.id}: pre-ferments and soakers take ${grams.toFixed(1)} g of ${ingredient}, but the formula has only ${have.toFixed(1)} g`,
      );
    }
  }

  const finalDough: FinalLine[] = [];
  const seen = new Set<string>();
  for (const l of overall) {
    if (seen.has(l.ingredient)) continue;
    seen.add(l.ingredient);
    const have = overallByName.get(l.ingredient) ?? 0;
    const used = taken.get(l.ingredient) ?? 0;
    // What the builds leave; a remainder within rounding noise of the line itself means all of it went into them.
    const left = have - used;
    if (used === 0 ? have > 0 : left > 1e-9 * have) finalDough.push({ ingredient: l.ingredient, grams: left, source: 'ingredient' });
  }
  for (const p of preferments) finalDough.push({ ingredient: p.name, grams: p.grams, source: 'preferment' });
  for (const s of soakers) finalDough.push({ ingredient: s.name, grams: s.grams, source: 'soaker' });

  const water = sum(overall.filter((l) => l.kind === 'water').map((l) => l.grams));
  // Flour's own moisture is not counted: effective hydration adds the water inside the other ingredients.
  const effectiveWater = sum(
    overall.map((l) => (l.kind === 'flour' ? 0 : (l.grams * (l.kind === 'water' ? 100 : waterContent(lookupIngredient(catalog, l.ingredient)))) / 100)),
  );
  const finalFlour = sum(finalDough.filter((l) => l.source === 'ingredient' && kindOf(l.ingredient) === 'flour').map((l) => l.grams));
  const finalWater = sum(finalDough.filter((l) => l.source === 'ingredient' && kindOf(l.ingredient) === 'water').map((l) => l.grams));
  const prefermentedFlourGrams = sum(preferments.map((p) => p.flour));

  return {
    formula: f.id,
    title: f.title,
    target,
    pieces: t.pieces,
    pieceGrams: t.pieceGrams,
    loss: t.loss,
    mixedDough: t.mixedDough,
    dividedDough: t.dividedDough,
    flour: F,
    totalPercent: total,
    water,
    effectiveWater,
    hydration: (water / F) * 100,
    effectiveHydration: (effectiveWater / F) * 100,
    prefermentedFlourGrams,
    prefermentedFlour: (prefermentedFlourGrams / F) * 100,
    finalDoughFlour: finalFlour,
    finalDoughWater: finalWater,
    finalDoughHydration: finalFlour > 0 ? (finalWater / finalFlour) * 100 : 0,
    overall,
    preferments,
    soakers,
    finalDough,
  };
}

export function sum(xs: readonly number[]): number {
  // Neumaier summation: weights added over many lines stay exact to well below 0.01 g.
  let s = 0;
  let c = 0;
  for (const x of xs) {
    const t = s + x;
    c += Math.abs(s) >= Math.abs(x) ? s - t + x : x - t + s;
    s = t;
  }
  return s + c;
}
