// The trade's usual ranges (common practice, no single source). Values outside them are
// warnings, never errors: a baker may have a reason. Each band names its source where there is
// one (Hamelman, Bread, Wiley 2004; Gisslen, Professional Baking, Wiley), else "common practice".

export interface Band {
  min: number;
  max: number;
}

export const PRACTICE = {
  /** Poolish: equal weights of flour and water, about 100 % (common practice). */
  poolishHydration: { min: 90, max: 110 } as Band,
  /** Biga: stiff at 50–60 % (Hamelman, Bread, "Biga"; Gisslen, Professional Baking), or poolish-like near 100 %. */
  bigaStiffHydration: { min: 50, max: 60 } as Band,
  bigaLiquidHydration: { min: 90, max: 110 } as Band,
  /** Levain: stiff about 50–60 %, liquid 100–125 % (common practice). */
  levainHydration: { min: 50, max: 125 } as Band,
  /** Salt in percent of the flour (common practice). */
  salt: { min: 1.5, max: 3 } as Band,
  /** Hydration, counting the water in milk, eggs and butter (common practice for bread doughs). */
  hydration: { min: 50, max: 100 } as Band,
  /** Desired dough temperature, °C (common practice; Gisslen, Professional Baking, gives 78–80 °F, 25.5–26.7 °C, as usual). */
  doughTemperature: { min: 20, max: 30 } as Band,
  /** Pre-fermented flour, percent of the total flour (common practice). */
  prefermentedFlourMax: 60,
  /** Yeast in a lean dough, as fresh yeast in percent of the flour (common practice). */
  leanYeastFreshMax: 4,
  /** A dough is lean when sugar, fat, dairy and egg together are at most this percent (common practice). */
  leanEnrichmentMax: 5,
  /** Loss allowance, percent of the mixed dough (common practice: 1–3 %). */
  lossMax: 10,
  /** A cold hold (retard) runs at about 2–6 °C (common practice; follow your food-safety plan). */
  retardTemperatureMax: 8,
  /** Weight lost in the oven, percent of the dough (common practice: rolls and small pieces lose most). */
  bakeLoss: { min: 8, max: 25 } as Band,
  /** A finish heavier than this percent of the piece is unusual (common practice). */
  finishShareMax: 15,
  /** Bake temperatures, °C (common practice for bread and rolls). */
  bakeTemperature: { min: 150, max: 300 } as Band,
} as const;

/** Grams of each yeast type that replace 1 g of fresh yeast (Hamelman, Bread, Wiley 2004). */
export { HAMELMAN_YEAST_FACTORS as YEAST_FACTORS } from '../convert.ts';

export function outside(value: number, band: Band): boolean {
  return value < band.min - 1e-9 || value > band.max + 1e-9;
}
