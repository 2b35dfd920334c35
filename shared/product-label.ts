// A formula's label for both markets: the ingredient statement and the nutrition declaration
// under EU and US rules, as the viewer shows them. A formula the label cannot be worked out for
// gets the reason instead, per market. Pure; no I/O.
import { AllergenError, type Jurisdiction } from './allergens.ts';
import { ingredientStatement, LabelError, type IngredientStatement } from './label.ts';
import type { Catalog, Formula } from './model.ts';
import { nutritionDeclaration, NutritionError, type NutritionResult } from './nutrition.ts';
import { ScaleError } from './scale.ts';

export interface MarketLabel {
  rules: Jurisdiction;
  statement: IngredientStatement | null;
  nutrition: NutritionResult | null;
  /** Why there is no statement (a formula that cannot be weighed). */
  problem: string | null;
}

export interface ProductLabel {
  eu: MarketLabel;
  us: MarketLabel;
}

function marketLabel(formula: Formula, catalog: Catalog, rules: Jurisdiction): MarketLabel {
  try {
    return {
      rules,
      statement: ingredientStatement(formula, catalog, { rules }),
      nutrition: nutritionDeclaration(formula, catalog, { rules }),
      problem: null,
    };
  } catch (e) {
    if (e instanceof LabelError || e instanceof NutritionError || e instanceof ScaleError || e instanceof AllergenError) {
      return { rules, statement: null, nutrition: null, problem: e.message };
    }
    throw e;
  }
}

export function productLabel(formula: Formula, catalog: Catalog): ProductLabel {
  return { eu: marketLabel(formula, catalog, 'eu'), us: marketLabel(formula, catalog, 'us') };
}
