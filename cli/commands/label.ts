// `panform label`: the ingredient statement of a formula under EU or US rules, with its
// allergens and, with --nutrition, its nutrition declaration, as plain text, HTML or JSON.
// A thin shell over shared/label.ts and shared/nutrition.ts.
import { Command, Option } from 'commander';
import { ALLERGEN_NAMES, AllergenError, formatGroups, groupOf } from '#shared/allergens';
import { ingredientStatement, LabelError, US_THRESHOLDS, type IngredientStatement, type UsThreshold } from '#shared/label';
import { nutritionDeclaration, NutritionError, type NutritionDeclaration } from '#shared/nutrition';
import { nutritionHtml, nutritionText } from '#shared/nutrition-print';
import { ScaleError } from '#shared/scale';
import { InputError, UsageError } from '../errors.ts';
import { readFormulaWithCatalog } from '../files.ts';

interface RawOptions {
  rules: string;
  threshold?: string;
  bakeLoss?: string;
  keepWater?: boolean;
  catalog?: string;
  html?: boolean;
  json?: boolean;
  nutrition?: boolean;
}

export interface LabelCliOptions {
  rules: 'eu' | 'us';
  threshold?: UsThreshold;
  /** Given on the command line; otherwise the formula's bake_loss or its category's default. */
  bakeLoss?: number;
  nutrition: boolean;
  keepWater: boolean;
  catalog?: string;
  output: 'text' | 'html' | 'json';
}

export function toLabelOptions(o: RawOptions): LabelCliOptions {
  const rules = o.rules.trim().toLowerCase();
  if (rules !== 'eu' && rules !== 'us') throw new UsageError(`--rules must be eu or us; got ${o.rules}`);
  let threshold: UsThreshold | undefined;
  if (o.threshold !== undefined) {
    if (rules !== 'us') throw new UsageError('--threshold applies to US rules only', 'add --rules us, or leave --threshold out (EU: under 2 %)');
    const t = Number(o.threshold.replace(/%\s*$/, ''));
    if (!US_THRESHOLDS.includes(t as UsThreshold)) {
      throw new UsageError(`--threshold must be one of ${US_THRESHOLDS.join(', ')} (percent); got ${o.threshold}`, '21 CFR 101.4(a)(2) allows 2, 1.5, 1 or 0.5 percent');
    }
    threshold = t as UsThreshold;
  }
  let bakeLoss: number | undefined;
  if (o.bakeLoss !== undefined) {
    bakeLoss = Number(o.bakeLoss.replace(/%\s*$/, ''));
    if (!Number.isFinite(bakeLoss) || bakeLoss < 0 || bakeLoss >= 100) {
      throw new UsageError(`--bake-loss must be a percentage from 0 to below 100; got ${o.bakeLoss}`, 'e.g. --bake-loss 12');
    }
  }
  if (o.html && o.json) throw new UsageError('--html and --json cannot be used together');
  return {
    rules,
    threshold,
    bakeLoss,
    nutrition: o.nutrition ?? false,
    keepWater: o.keepWater ?? false,
    catalog: o.catalog,
    output: o.json ? 'json' : o.html ? 'html' : 'text',
  };
}

/** The statement, and with --nutrition the declaration: null with `nutritionMissing` when an ingredient lacks values. */
export type LabelData = IngredientStatement & { nutrition?: NutritionDeclaration | null; nutritionMissing?: string[]; nutritionMessage?: string };

export function collectLabel(formulaArg: string, opts: LabelCliOptions): LabelData {
  const { formula, catalog } = readFormulaWithCatalog(formulaArg, { catalog: opts.catalog });
  try {
    const statement: LabelData = ingredientStatement(formula, catalog, {
      rules: opts.rules,
      threshold: opts.threshold,
      bakeLoss: opts.bakeLoss,
      omitMinorWater: !opts.keepWater,
    });
    if (!opts.nutrition) return statement;
    const n = nutritionDeclaration(formula, catalog, { rules: opts.rules, bakeLoss: opts.bakeLoss });
    return n.ok ? { ...statement, nutrition: n.declaration } : { ...statement, nutrition: null, nutritionMissing: n.missing, nutritionMessage: n.message };
  } catch (e) {
    if (e instanceof ScaleError || e instanceof LabelError || e instanceof AllergenError || e instanceof NutritionError) throw new InputError(e.message);
    throw e;
  }
}

export function printLabel(s: LabelData): string {
  const out: string[] = [`${s.title} (${s.formula}): ingredient statement, ${s.rules === 'eu' ? 'EU rules' : 'US rules'}`, '', s.text.trimEnd(), ''];
  const groups = s.rules === 'eu' ? s.allergens.eu : s.allergens.us;
  out.push(
    s.rules === 'eu'
      ? `Allergens (Regulation (EU) No 1169/2011 Annex II): ${groups.length > 0 ? formatGroups(groups) : 'none declared in the catalog'}`
      : `Major food allergens (US): ${groups.length > 0 ? formatGroups(groups) : 'none declared in the catalog'}`,
  );
  if (s.rules === 'us') {
    const notMajor = s.allergens.codes.filter((c) => groupOf(c, 'us') === undefined);
    if (notMajor.length > 0) out.push(`Also in the formula, not US major allergens: ${notMajor.map((c) => ALLERGEN_NAMES[c]).join(', ')}`);
  }
  out.push('');
  for (const n of s.notes) out.push(`note: ${n}`);
  out.push('', s.caution);
  if (s.nutrition) {
    out.push('', nutritionText(s.nutrition).trimEnd(), '');
    for (const n of s.nutrition.notes) out.push(`note: ${n}`);
    out.push('', 'Values per 100 g of each ingredient from:', ...s.nutrition.sources.map((x) => `  ${x.ingredient}: ${x.source}`), '', s.nutrition.caution);
  }
  return `${out.join('\n')}\n`;
}

export const command = new Command('label')
  .description('The ingredient statement of a formula (descending weight, compound ingredients, allergens emphasised) under EU or US rules')
  .argument('<formula>', 'a formula file, or an id found in formulas/')
  .addOption(new Option('--rules <eu|us>', 'which rules: EU (Regulation (EU) No 1169/2011) or US (21 CFR 101.4, FALCPA)').default('eu'))
  .option('--threshold <percent>', 'US: the "Contains ...% or less of:" threshold, one of 2, 1.5, 1, 0.5 (default 2)')
  .option('--bake-loss <percent>', "weight lost in baking, in percent of the dough (default: the formula's bake_loss, else its category's default)")
  .option('--nutrition', 'add the nutrition declaration (EU per 100 g and per piece; US Nutrition Facts per serving)')
  .option('--keep-water', 'EU: list added water even at 5 % or less of the product')
  .option('--catalog <file>', 'the ingredient catalog (default: ingredients.yaml beside the formula or in its parent folder)')
  .option('--html', 'print an HTML fragment, allergens in <strong> (notes go to stderr)')
  .option('--json', 'print the collected data as JSON')
  .addHelpText(
    'after',
    `
Example:
  $ panform label saltmere-seeded-rye --rules us --threshold 2
  $ panform label tidewater-milk-buns --nutrition --json

The statement supports, and does not replace, the bakery's own labelling review under local law.
`,
  )
  .action((formulaArg: string, raw: RawOptions) => {
    const opts = toLabelOptions(raw);
    const data = collectLabel(formulaArg, opts);
    if (opts.output === 'json') process.stdout.write(`${JSON.stringify(data, null, 2)}\n`);
    else if (opts.output === 'html') {
      process.stdout.write(data.html);
      if (data.nutrition) process.stdout.write(nutritionHtml(data.nutrition));
      for (const n of [...data.notes, ...(data.nutrition?.notes ?? [])]) process.stderr.write(`note: ${n}\n`);
    } else process.stdout.write(printLabel(data));
    if (data.nutrition === null) {
      throw new InputError(data.nutritionMessage ?? 'no nutrition declaration', [], 'values per 100 g come from the supplier\'s specification or a food composition table; name it in "source"');
    }
    if (data.unlisted.length > 0) {
      throw new InputError(
        `not in the catalog, so their allergens are unknown: ${data.unlisted.join(', ')}`,
        [],
        'add them to ingredients.yaml with their allergens (an empty list when they have none) before using this statement',
      );
    }
  });
