// `panform cost`: what the ingredients of a batch cost, line by line, per piece and per kg of
// dough, from the catalog's prices. A thin shell over shared/cost.ts.
import { Command } from 'commander';
import { computeCost, formatMoney, type CostResult } from '#shared/cost';
import { ScaleError, scaleFormula, type ScaleTarget } from '#shared/scale';
import { formatGrams, formatPercent } from '#shared/units';
import { InputError } from '../errors.ts';
import { fitText } from '../print/width.ts';
import { readFormulaWithCatalog } from '../files.ts';
import { parseTargetFlags } from '../target-flags.ts';

interface RawOptions {
  pieces?: string;
  piece?: string;
  mix?: string;
  catalog?: string;
  currency?: string;
  json?: boolean;
}

export interface CostOptions {
  /** null: the batch the formula is written for. */
  target: ScaleTarget | null;
  catalog?: string;
  currency: string;
  json: boolean;
}

export function toCostOptions(o: RawOptions): CostOptions {
  const target = parseTargetFlags(o);
  return { target, catalog: o.catalog, currency: o.currency ?? '', json: o.json ?? false };
}

/** Reads the formula and its catalog, scales and costs the batch. */
export function collectCost(formulaArg: string, opts: CostOptions): CostResult {
  const { formula, catalog } = readFormulaWithCatalog(formulaArg, { catalog: opts.catalog });
  const target: ScaleTarget = opts.target ?? { by: 'pieces', pieces: formula.yield.pieces };
  try {
    return computeCost(scaleFormula(formula, catalog, target), catalog, { currency: opts.currency });
  } catch (e) {
    if (e instanceof ScaleError) throw new InputError(e.message);
    throw e;
  }
}

export function printCost(r: CostResult): string {
  const money = (n: number | null) => (n === null ? '—' : formatMoney(n, r.currency));
  const out: string[] = [];
  out.push(`${r.title} (${r.formula}): ingredient cost`);
  out.push(
    r.pieces !== null && r.pieceGrams !== null
      ? `batch: ${r.pieces} × ${formatGrams(r.pieceGrams)} = ${formatGrams(r.dividedDough)} divided, ${formatGrams(r.mixedDough)} mixed (loss ${formatPercent(r.loss)})`
      : `batch: ${formatGrams(r.mixedDough)} mixed dough`,
  );
  out.push('');
  const rows = [
    ['ingredient', 'weight', 'per kg', 'price date', 'cost'],
    ...r.lines.map((l) => [
      l.ingredient,
      formatGrams(l.grams),
      l.costPerKg === null ? 'no price' : formatMoney(l.costPerKg, r.currency),
      l.costDate ?? '',
      money(l.cost),
    ]),
  ];
  const width = rows[0].map((_, i) => Math.max(...rows.map((row) => [...row[i]].length)));
  const pad = (s: string, w: number, right: boolean) => (right ? s.padStart(w) : s.padEnd(w));
  const fmt = (row: string[]) => row.map((c, i) => pad(c, width[i], i === 1 || i === 2 || i === 4)).join('  ').trimEnd();
  out.push(fmt(rows[0]));
  for (const row of rows.slice(1)) out.push(fmt(row));
  out.push('');
  const incomplete = r.complete ? '' : '  (incomplete: prices missing)';
  const summary: [string, string][] = [['total', `${money(r.total)}${incomplete}`]];
  if (r.perPiece !== null) summary.push([`per piece (${r.pieces})`, `${money(r.perPiece)}${incomplete}`]);
  summary.push(['per kg of dough', `${money(r.perKgDough)}${incomplete}`]);
  const labelWidth = Math.max(...summary.map(([k]) => k.length));
  for (const [k, v] of summary) out.push(`${k.padEnd(labelWidth)}  ${v}`);
  out.push('');
  if (!r.complete) {
    out.push(`No price for: ${r.missing.join(', ')}. The totals above leave these out; add cost_per_kg (and cost_date) to the catalog.`);
  }
  if (r.pricesFrom !== null) {
    out.push(r.pricesFrom === r.pricesTo ? `Prices dated ${r.pricesFrom}.` : `Prices dated ${r.pricesFrom} to ${r.pricesTo}.`);
  }
  if (r.undated.length > 0) out.push(`Prices without a date: ${r.undated.join(', ')}.`);
  out.push('Ingredients only: no labour, energy or packaging.');
  return `${out.join('\n')}\n`;
}

export const command = new Command('cost')
  .description('What the ingredients of a batch cost: each line, the batch, per piece and per kg of dough (catalog prices)')
  .argument('<formula>', 'a formula file, or an id found in formulas/')
  .option('--pieces <n>', 'number of pieces (default: the batch the formula is written for)')
  .option('--piece <weight>', "piece weight, e.g. 900g (default: the formula's)")
  .option('--mix <weight>', 'mixed dough weight instead of pieces, e.g. 20kg')
  .option('--catalog <file>', 'the ingredient catalog (default: ingredients.yaml beside the formula or in its parent folder)')
  .option('--currency <symbol>', 'shown with amounts, e.g. € or EUR (default: plain numbers)')
  .option('--json', 'print the collected data as JSON (amounts unrounded)')
  .addHelpText(
    'after',
    `
Example:
  $ panform cost harbour-ciabatta --pieces 60 --currency €

A line without a price is listed by name and the totals are marked incomplete; it is never counted as zero.
`,
  )
  .action((formulaArg: string, raw: RawOptions) => {
    const opts = toCostOptions(raw);
    const data = collectCost(formulaArg, opts);
    process.stdout.write(opts.json ? `${JSON.stringify(data, null, 2)}\n` : fitText(printCost(data)));
  });
