// Which scale weighs each weight on the sheet, and the weights too small for it.
//
// Rules (docs/batch-sheet.md, "Scales and small weights"):
// - A weight goes on the finest scale (smallest resolution) whose maximum holds it; a weight
//   above every scale's maximum goes on the largest, in lots (a warning says how many).
// - A reading is off by up to half a division, so a weight needs enough divisions for that to be
//   small: at least MIN_DIVISIONS = 20 (at most 2.5 % off). 20 divisions is the minimum capacity
//   of a class III weighing instrument, OIML R 76-1 (2006) Table 3 (from memory).
// - A weight below that is flagged. When it dissolves (yeast, salt, sugar, improver) and the same
//   mix or build has water, a premix is suggested: weigh enough of it to read well (20 divisions,
//   or the weight itself rounded up to a division), dissolve it in part of the water at 1 in k,
//   and take k × the weight of the solution, with k the least of 5, 10, 20, 50, 100 that makes the
//   amount taken readable too; the water taken with it comes off the water line.
// Pure; no I/O.
import type { Scale } from '../model.ts';
import type { IngredientKind } from '../schema/shapes.ts';
import type { ScaleCheck, ScaleUse, SheetLine } from './types.ts';

export const MIN_DIVISIONS = 20;
export const PREMIX_FACTORS = [5, 10, 20, 50, 100] as const;
const DISSOLVES: IngredientKind[] = ['yeast', 'salt', 'sugar', 'improver'];
const EPS = 1e-9;

/** The scale that weighs `grams`: the finest whose maximum holds it, else the largest. */
export function scaleFor(grams: number, scales: Scale[]): Scale {
  const holds = scales.filter((s) => s.maxGrams >= grams - EPS);
  if (holds.length > 0) return holds.reduce((a, b) => (b.resolutionGrams < a.resolutionGrams || (b.resolutionGrams === a.resolutionGrams && b.maxGrams < a.maxGrams) ? b : a));
  return scales.reduce((a, b) => (b.maxGrams > a.maxGrams ? b : a));
}

/** The premix for a weight too small for its scale, or null when the water cannot take it. */
export function premixFor(grams: number, resolution: number, water: number): ScaleCheck['premix'] {
  const least = MIN_DIVISIONS * resolution;
  const dissolve = Math.max(least, Math.ceil(grams / resolution - EPS) * resolution);
  const factor = PREMIX_FACTORS.find((k) => grams * k >= least - EPS);
  if (factor === undefined) return null;
  const lessWater = grams * (factor - 1);
  if (lessWater > water + EPS) return null;
  return { dissolve, water: dissolve * (factor - 1), factor, take: grams * factor, lessWater };
}

export interface WeighedGroup {
  where: ScaleCheck['where'];
  label: string;
  formula: string;
  lines: SheetLine[];
}

/**
 * Gives each line its scale (sets `line.scale`) and returns the small weights and how many
 * weights each scale takes. Without scales nothing is assigned or flagged.
 */
export function checkWeights(groups: WeighedGroup[], scales: Scale[] | undefined): { scales: ScaleUse[]; smallWeights: ScaleCheck[]; warnings: string[] } {
  if (!scales || scales.length === 0) return { scales: [], smallWeights: [], warnings: [] };
  const warnings: string[] = [];
  const count = new Map<string, number>();
  const smallWeights: ScaleCheck[] = [];
  for (const g of groups) {
    const water = g.lines.filter((l) => l.kind === 'water').reduce((a, l) => a + l.grams, 0);
    for (const l of g.lines) {
      if (!(l.grams > 0)) continue;
      const s = scaleFor(l.grams, scales);
      l.scale = s.name;
      count.set(s.name, (count.get(s.name) ?? 0) + 1);
      if (l.grams > s.maxGrams + EPS) {
        const lots = Math.ceil(l.grams / s.maxGrams - EPS);
        warnings.push(`${l.ingredient} for ${g.label} (${Number((l.grams / 1000).toFixed(2))} kg) is more than the ${s.name} takes (${Number((s.maxGrams / 1000).toFixed(2))} kg): weigh it in ${lots} lots`);
      }
      const divisions = l.grams / s.resolutionGrams;
      if (divisions >= MIN_DIVISIONS - EPS) continue;
      const premix = DISSOLVES.includes(l.kind as IngredientKind) ? premixFor(l.grams, s.resolutionGrams, water) : null;
      smallWeights.push({
        where: g.where, label: g.label, formula: g.formula, ingredient: l.ingredient, grams: l.grams, scale: s.name,
        resolution: s.resolutionGrams, divisions, problem: divisions < 1 ? 'below-resolution' : 'few-divisions', premix,
        advice: premix
          ? 'dissolve it in part of the water as shown (yeast and salt each in water of their own, never together)'
          : 'weigh it on a finer scale (one that reads to a twentieth of it or better)',
      });
    }
  }
  return {
    scales: scales.map((s) => ({ name: s.name, max: s.maxGrams, resolution: s.resolutionGrams, weights: count.get(s.name) ?? 0, least: MIN_DIVISIONS * s.resolutionGrams })),
    smallWeights,
    warnings,
  };
}
