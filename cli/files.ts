// Reading formula, catalog and plan files from disk for the CLI: the I/O edge around
// shared/parse.ts. Errors carry the file's location and a suggestion.
import { existsSync, readdirSync, readFileSync, statSync } from 'node:fs';
import { basename, dirname, join, resolve } from 'node:path';
import { parseCatalogText, parsePlanText } from '#shared/parse';
import { checkFileText } from '#shared/check/check-file';
import { nearestName } from '#shared/check/suggest';
import type { Catalog, Formula, Plan } from '#shared/model';
import { InputError } from './errors.ts';

export { CATALOG_FILE } from '#shared/check/check-file';
import { CATALOG_FILE } from '#shared/check/check-file';

export function readText(path: string): string {
  try {
    return readFileSync(path, 'utf8');
  } catch (e) {
    const code = (e as NodeJS.ErrnoException).code;
    if (code === 'ENOENT') throw new InputError(`no such file: ${path}`);
    if (code === 'EISDIR') throw new InputError(`${path} is a folder; give a file`);
    throw new InputError(`cannot read ${path}: ${(e as Error).message}`);
  }
}

/**
 * The formulas folder a command uses when given none: ./formulas, or the current folder itself
 * when it holds the catalog and has no formulas/ (the top of a `panform new` repository).
 */
export function defaultFormulasFolder(cwd = process.cwd()): string {
  if (!existsSync(join(cwd, 'formulas')) && existsSync(join(cwd, CATALOG_FILE))) return '.';
  return 'formulas';
}

/** The catalog beside a formula or plan, or in its parent folder. */
export function findCatalogPath(near: string): string | undefined {
  const dir = statSync(near, { throwIfNoEntry: false })?.isDirectory() ? near : dirname(near);
  for (const d of [dir, dirname(dir)]) {
    const p = join(d, CATALOG_FILE);
    if (existsSync(p)) return p;
  }
  return undefined;
}

export function readCatalog(path: string): Catalog {
  const parsed = parseCatalogText(readText(path), path);
  if (!parsed.ok) throw new InputError(`the ingredient catalog ${path} has errors; run \`panform check ${path}\``, parsed.findings);
  return parsed.value;
}

/** The catalog for a formula or plan: `--catalog FILE`, else found beside it, else empty. */
export function readCatalogFor(near: string, explicit?: string): { catalog: Catalog; path?: string } {
  const path = explicit ?? findCatalogPath(near);
  if (!path) return { catalog: {} };
  return { catalog: readCatalog(path), path };
}

/** The ids of the formula files in a folder (file names without .yaml), for "did you mean". */
function formulaIdsIn(dir: string): string[] {
  try {
    return readdirSync(dir)
      .filter((n) => /\.ya?ml$/i.test(n) && n !== CATALOG_FILE)
      .map((n) => n.replace(/\.ya?ml$/i, ''));
  } catch {
    return [];
  }
}

/**
 * A formula given as a path, or as an id found in ./formulas/<id>.yaml or ./<id>.yaml
 * (or in `dir` when given).
 */
export function resolveFormulaPath(arg: string, dir?: string): string {
  if (existsSync(arg) && statSync(arg).isFile()) return arg;
  const candidates = dir
    ? [join(dir, `${arg}.yaml`), join(dir, `${arg}.yml`)]
    : [join('formulas', `${arg}.yaml`), join('formulas', `${arg}.yml`), `${arg}.yaml`, `${arg}.yml`];
  for (const c of candidates) if (existsSync(c)) return c;
  const near = nearestName(arg.replace(/\.ya?ml$/i, ''), formulaIdsIn(dir ?? (existsSync('formulas') ? 'formulas' : '.')));
  if (near) throw new InputError(`unknown formula: ${arg}; did you mean ${near}?`);
  throw new InputError(`unknown formula: ${arg}`, [], `give a formula file's path or an id with a file in ${dir ?? 'formulas/'} (try \`panform check\` to list problems)`);
}

/**
 * A formula, refused with its located findings when `panform check` would report an error
 * (schema or trade checks: flours not summing to 100, a pre-ferment taking more than the
 * formula has, an id that is not the file name ...). Warnings do not stop it.
 */
export function readFormula(path: string, catalog?: Catalog): Formula {
  const text = readText(path);
  const cat = catalog ?? readCatalogFor(path).catalog;
  const result = checkFileText({ kind: 'formula', file: path, text, catalog: cat });
  const errors = result.findings.filter((f) => f.severity === 'error');
  if (errors.length > 0 || result.kind !== 'formula' || !result.value) {
    throw new InputError(`${path} has errors; fix them first (\`panform check ${path}\`)`, errors);
  }
  return result.value;
}

export function readFormulaWithCatalog(arg: string, opts: { catalog?: string; dir?: string } = {}): { formula: Formula; catalog: Catalog; path: string } {
  const path = resolveFormulaPath(arg, opts.dir);
  const { catalog } = readCatalogFor(path, opts.catalog);
  const formula = readFormula(path, catalog);
  return { formula, catalog, path: resolve(path) };
}

export function readPlan(path: string): Plan {
  const parsed = parsePlanText(readText(path), path);
  if (!parsed.ok) throw new InputError(`${path} has errors; fix them first (\`panform check ${path}\`)`, parsed.findings);
  return parsed.value;
}

/** The folder that holds `plans/`, where a plan's orders find their formulas. */
export function formulasDirForPlan(planPath: string): string {
  const dir = dirname(resolve(planPath));
  return basename(dir) === 'plans' ? dirname(dir) : dir;
}
