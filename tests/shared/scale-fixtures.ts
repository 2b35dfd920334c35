// Reads the small formulas in tests/fixtures/arithmetic for the scaling tests.
import { readFileSync } from 'node:fs';
import { join } from 'node:path';
import { fileURLToPath } from 'node:url';
import { parseCatalogText, parseFormulaText } from '#shared/parse';
import type { Catalog, Formula } from '#shared/model';

export const ARITHMETIC_FIXTURES = fileURLToPath(new URL('../fixtures/arithmetic', import.meta.url));

export function fixtureCatalog(): Catalog {
  const path = join(ARITHMETIC_FIXTURES, 'ingredients.yaml');
  const parsed = parseCatalogText(readFileSync(path, 'utf8'), path);
  if (!parsed.ok) throw new Error(`fixture catalog has errors: ${JSON.stringify(parsed.findings)}`);
  return parsed.value;
}

export function fixtureFormula(id: string): Formula {
  const path = join(ARITHMETIC_FIXTURES, `${id}.yaml`);
  const parsed = parseFormulaText(readFileSync(path, 'utf8'), path);
  if (!parsed.ok) throw new Error(`fixture ${id} has errors: ${JSON.stringify(parsed.findings)}`);
  return parsed.value;
}

/** A formula written inline for a test, with the defaults a fixture file would carry. */
export function formula(parts: Partial<Formula> & Pick<Formula, 'flour' | 'ingredients'>): Formula {
  return {
    id: 'inline',
    title: 'Inline formula',
    status: 'active',
    category: 'lean',
    tags: [],
    yield: { pieces: 1, pieceGrams: 1000 },
    loss: 0,
    preferments: [],
    soakers: [],
    process: [],
    finishes: [],
    mayContain: [],
    ...parts,
  };
}
