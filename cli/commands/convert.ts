// `panform convert`: weights (g, kg, oz, lb), temperatures (°C, °F) and yeast (fresh, active dry,
// instant). A thin shell over shared/convert.ts. Yeast factors come from the catalog when it
// sets `yeast_factor`, else Hamelman's (fresh 1, active dry 0.4, instant 0.33).
import { existsSync } from 'node:fs';
import { join } from 'node:path';
import { Command } from 'commander';
import { convert, ConvertError, HAMELMAN_YEAST_FACTORS, yeastFactorsFrom, YEAST_FACTORS_SOURCE, type Conversion, type YeastFactors } from '#shared/convert';
import { roundDegrees, roundMassIn } from '#shared/units';
import { InputError, UsageError } from '../errors.ts';
import { fitText } from '../print/width.ts';

interface RawOptions {
  json?: boolean;
  catalog?: string;
}

export interface ConvertOptions {
  value: number;
  units: string[];
  json: boolean;
  catalog?: string;
}

export function toConvertOptions(valueText: string, units: string[], o: RawOptions): ConvertOptions {
  const text = valueText.trim().replace(',', '.');
  if (!/^-?\d+(\.\d+)?$|^-?\.\d+$/.test(text)) {
    throw new UsageError(`not a number: "${valueText}"`, 'e.g. panform convert 2 lb g');
  }
  if (units.length < 2 || units.length > 3) {
    throw new UsageError(`give a value and two units (three for yeast); got ${units.length} unit(s)`, 'e.g. "2 lb g", "26 C F", "10 g fresh instant"');
  }
  return { value: Number(text), units, json: !!o.json, catalog: o.catalog };
}

/**
 * The catalog for yeast factors: --catalog, else formulas/ingredients.yaml or ./ingredients.yaml
 * when present. The YAML reader is loaded only here, so weights and temperatures start faster.
 */
async function yeastFactorsFor(opts: ConvertOptions): Promise<{ factors: YeastFactors; source: string }> {
  const { CATALOG_FILE, readCatalog } = await import('../files.ts');
  const path = opts.catalog ?? [join('formulas', CATALOG_FILE), CATALOG_FILE].find((p) => existsSync(p));
  if (!path) return { factors: { ...HAMELMAN_YEAST_FACTORS }, source: YEAST_FACTORS_SOURCE };
  try {
    const { factors, fromCatalog } = yeastFactorsFrom(readCatalog(path));
    return { factors, source: fromCatalog.length > 0 ? `${path} (${fromCatalog.join(', ')}); others: ${YEAST_FACTORS_SOURCE}` : YEAST_FACTORS_SOURCE };
  } catch (e) {
    if (e instanceof ConvertError) throw new InputError(`${path}: ${e.message}`, [], e.expected);
    throw e;
  }
}

export type ConvertData = Conversion & { source?: string };

export async function collectConvert(opts: ConvertOptions): Promise<ConvertData> {
  const y = opts.units.length === 3 ? await yeastFactorsFor(opts) : undefined;
  try {
    const c = convert({ value: opts.value, units: opts.units, yeastFactors: y?.factors });
    return c.kind === 'yeast' ? { ...c, source: y?.source } : c;
  } catch (e) {
    if (e instanceof ConvertError) throw new UsageError(e.message, e.expected ? `valid: ${e.expected}` : undefined);
    throw e;
  }
}

const MASS_LABEL = { g: 'g', kg: 'kg', oz: 'oz', lb: 'lb' } as const;
const YEAST_LABEL = { fresh: 'fresh yeast', 'active-dry': 'active dry yeast', instant: 'instant yeast' } as const;

/** The number as given: ten significant digits, without float noise (78.8, not 78.80000000000001). */
function given(v: number): string {
  return String(Number(v.toPrecision(10)));
}

/** "=" when the rounded figure is the exact one, "≈" when it was rounded for reading. */
function rounded(exact: number, shown: number): string {
  return `${Math.abs(exact - shown) < 1e-9 ? '=' : '≈'} ${shown}`;
}

/** Text for people: results rounded as a scale or a thermometer shows them; --json keeps the full value. */
export function convertText(c: ConvertData): string {
  switch (c.kind) {
    case 'mass':
      return `${given(c.value)} ${MASS_LABEL[c.from]} ${rounded(c.result, roundMassIn(c.result, c.to))} ${MASS_LABEL[c.to]}\n`;
    case 'temperature': {
      const delta = c.from === 'C' ? c.value * 1.8 : c.value / 1.8;
      return (
        `${given(c.value)} °${c.from} ${rounded(c.result, roundDegrees(c.result))} °${c.to}\n` +
        `  (a temperature difference, such as friction, converts by ×${c.from === 'C' ? '1.8' : '5/9'} alone: ${given(c.value)} °${c.from}-degrees ${rounded(delta, roundDegrees(delta))} °${c.to}-degrees)\n`
      );
    }
    case 'yeast':
      return (
        `${given(c.value)} ${MASS_LABEL[c.unit]} ${YEAST_LABEL[c.from]} ${rounded(c.result, roundMassIn(c.result, c.unit))} ${MASS_LABEL[c.unit]} ${YEAST_LABEL[c.to]} (× ${given(c.factor)})\n` +
        `  factors against fresh yeast: fresh ${c.factors.fresh}, active dry ${c.factors['active-dry']}, instant ${c.factors.instant}; from ${c.source ?? YEAST_FACTORS_SOURCE}\n` +
        (c.to === 'active-dry' ? '  dissolve active dry yeast in some of the dough\'s water first\n' : '')
      );
  }
}

export const command = new Command('convert')
  .description('Convert weights (g, kg, oz, lb), temperatures (C, F) and yeast (fresh, active-dry, instant).')
  .argument('<value>', 'the number to convert')
  .argument('<units...>', 'from and to units; for yeast: a weight unit, then from and to yeast types')
  .option('--json', 'print the result as JSON, unrounded')
  .option('--catalog <file>', 'catalog whose yeast entries set `yeast_factor` (default: formulas/ingredients.yaml or ./ingredients.yaml when present)')
  .addHelpText(
    'after',
    `
Examples:
  $ panform convert 2 lb g              # ≈ 907 g (--json: 907.18474)
  $ panform convert 78 F C              # ≈ 25.6 °C
  $ panform convert 10 g fresh instant  # 3.3 g instant yeast

Yeast: one factor per type against fresh yeast (Hamelman, Bread, Wiley 2004: fresh 1,
active dry 0.4, instant 0.33); every pair is derived from them. A catalog entry of kind yeast
may set its own \`yeast_factor\`.`,
  )
  .action(async (valueText: string, units: string[], raw: RawOptions) => {
    const opts = toConvertOptions(valueText, units, raw);
    const data = await collectConvert(opts);
    process.stdout.write(opts.json ? `${JSON.stringify(data, null, 2)}\n` : fitText(convertText(data)));
  });
