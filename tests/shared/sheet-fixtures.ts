// Reads a plan with the formulas its orders name and the catalog, for the batch-sheet tests:
// the demo bakery (formulas/) and the small fixtures in tests/fixtures/sheet.
import { existsSync, readFileSync } from 'node:fs';
import { dirname, join } from 'node:path';
import { fileURLToPath } from 'node:url';
import { parseCatalogText, parseFormulaText, parsePlanText } from '#shared/parse';
import type { Catalog, Formula, Plan } from '#shared/model';
import type { SheetInput } from '#shared/sheet/types';

export const SHEET_FIXTURES = fileURLToPath(new URL('../fixtures/sheet', import.meta.url));
export const DEMO = fileURLToPath(new URL('../../formulas', import.meta.url));

function parsed<T>(r: { ok: true; value: T } | { ok: false; findings: unknown }, what: string): T {
  if (!r.ok) throw new Error(`${what} has errors: ${JSON.stringify(r.findings)}`);
  return r.value;
}

export function readCatalogIn(dir: string): Catalog {
  const path = join(dir, 'ingredients.yaml');
  return parsed(parseCatalogText(readFileSync(path, 'utf8'), path), path);
}

export function readFormulaIn(dir: string, id: string): Formula {
  const path = join(dir, `${id}.yaml`);
  return parsed(parseFormulaText(readFileSync(path, 'utf8'), path), path);
}

export function readPlanFile(path: string): Plan {
  return parsed(parsePlanText(readFileSync(path, 'utf8'), path), path);
}

/** The sheet input for a plan file in `<dir>/plans/`. */
export function sheetInput(planPath: string): SheetInput {
  const dir = dirname(dirname(planPath));
  const plan = readPlanFile(planPath);
  const formulas: Record<string, Formula> = {};
  for (const o of plan.orders) formulas[o.formula] ??= readFormulaIn(dir, o.formula);
  return { plan, formulas, catalog: readCatalogIn(dir) };
}

export const DEMO_PLANS = ['2026-12-03', '2026-12-04']
  .map((d) => join(DEMO, 'plans', `${d}.yaml`))
  .filter((p) => existsSync(p));
export const FIXTURE_PLANS = ['2030-07-10', '2030-01-15'].map((d) => join(SHEET_FIXTURES, 'plans', `${d}.yaml`));
