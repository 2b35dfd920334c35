// Checking everything a load will take in before anything is written: the checks of
// `panform check` (shared/check) on every file, plus the reference batch of each formula and no
// duplicate ids or dates. Any error and the load writes nothing; warnings are passed on.
import { createHash } from 'node:crypto';
import type { FormulaFigures } from '#shared/api';
import type { Catalog, Formula, Plan } from '#shared/model';
import { parseCatalogText, parseFormulaText, parsePlanText, sortFindings, type Finding } from '#shared/parse';
import { ScaleError } from '#shared/scale';
import { referenceFigures } from '#shared/figures';
import { checkCatalog } from '#shared/check/catalog';
import { checkFileText, fileStem } from '#shared/check/check-file';
import { checkFormula } from '#shared/check/formula';
import { checkPlan, type KnownFormula } from '#shared/check/plan';
import type { FormulaFile } from '#shared/schema/shapes';
import type { LoadFile, LoadInput } from './read.ts';

export interface CheckedCatalog {
  file: LoadFile;
  value: Catalog;
  /** Each entry as written in the file. */
  raw: Record<string, unknown>;
}

export interface CheckedFormula {
  file: LoadFile;
  value: Formula;
  raw: unknown;
  hash: string;
  figures: FormulaFigures;
}

export interface CheckedPlan {
  file: LoadFile;
  value: Plan;
  raw: unknown;
  hash: string;
}

export type CheckResult =
  | { ok: true; findings: Finding[]; catalog: CheckedCatalog | null; formulas: CheckedFormula[]; plans: CheckedPlan[] }
  | { ok: false; findings: Finding[] };

/** Extra checks run over the parsed files (the trade checks); they add located findings. */
export type ExtraCheck = (parsed: { catalog: CheckedCatalog | null; formulas: CheckedFormula[]; plans: CheckedPlan[] }) => Finding[];

/** The hash that decides whether a file changed: SHA-256 of its text, line endings and BOM normalized. */
export function contentHash(text: string): string {
  return createHash('sha256').update(text.replace(/^\uFEFF/, '').replace(/\r\n?/g, '\n')).digest('hex');
}

/** What a plan's orders may name beside the formulas in the load (a load of single files). */
export interface CheckContext {
  /** Formula ids on disk in the folder that holds plans/, with their status where known. */
  folderFormulas?: ReadonlyMap<string, KnownFormula>;
}

/**
 * Checks every file of a load with the same checks as `panform check` (shared/check): schema,
 * units, the baker's arithmetic, catalog names, plan orders. Also: each formula's reference batch
 * must be computable, and no two files may hold the same formula id or plan date.
 */
export function checkLoadInput(input: LoadInput, extra: ExtraCheck[] = [], ctx: CheckContext = {}): CheckResult {
  const findings: Finding[] = [];
  let catalog: CheckedCatalog | null = null;
  let catalogBroken = false;
  const catalogFile = input.files.find((f) => f.kind === 'catalog');
  if (catalogFile) {
    const parsed = parseCatalogText(catalogFile.text, catalogFile.path);
    if (parsed.ok) {
      findings.push(...checkCatalog({ file: catalogFile.path, catalog: parsed.value, source: parsed.source }));
      catalog = { file: catalogFile, value: parsed.value, raw: parsed.raw as Record<string, unknown> };
    } else {
      findings.push(...checkFileText({ kind: 'catalog', file: catalogFile.path, text: catalogFile.text }).findings);
    }
    catalogBroken = findings.some((f) => f.severity === 'error');
  }
  const cat = catalog?.value ?? {};
  const formulas: CheckedFormula[] = [];
  const plans: CheckedPlan[] = [];
  const seenIds = new Map<string, string>();
  const seenDates = new Map<string, string>();
  for (const file of input.files) {
    if (file.kind !== 'formula') continue;
    const parsed = parseFormulaText(file.text, file.path);
    if (!parsed.ok) {
      findings.push(...checkFileText({ kind: 'formula', file: file.path, text: file.text, catalog: null }).findings);
      continue;
    }
    const at = (pointer: string) => ({ file: file.path, ...parsed.source.locate(pointer), severity: 'error' as const, pointer });
    const f = parsed.value;
    const own = checkFormula({
      file: file.path,
      formula: f,
      raw: parsed.raw as FormulaFile,
      source: parsed.source,
      expectedId: fileStem(file.path),
      catalog: catalogFile ? (catalogBroken ? null : cat) : null,
      noCatalog: catalogFile ? `the catalog ${catalogFile.path} has errors` : 'no ingredients.yaml was found beside it or in its parent folder',
    });
    findings.push(...own);
    if (own.some((x) => x.severity === 'error')) continue;
    const before = seenIds.get(f.id);
    if (before) {
      findings.push({ ...at('/id'), message: `the id "${f.id}" is also used by ${before}` });
      continue;
    }
    seenIds.set(f.id, file.path);
    let figures: FormulaFigures;
    try {
      figures = referenceFigures(f, cat);
    } catch (e) {
      if (!(e instanceof ScaleError)) throw e;
      findings.push({ ...at('/yield'), message: `the reference batch cannot be computed: ${e.message}` });
      continue;
    }
    formulas.push({ file, value: f, raw: parsed.raw, hash: contentHash(file.text), figures });
  }
  // Plans see the formulas of this load, and for a load of single files those on disk beside them.
  const known = new Map<string, KnownFormula>(ctx.folderFormulas ?? []);
  for (const f of formulas) known.set(f.value.id, { status: f.value.status });
  for (const file of input.files) {
    if (file.kind !== 'plan') continue;
    const parsed = parsePlanText(file.text, file.path);
    const folder = file.path.includes('/plans/') ? `${file.path.slice(0, file.path.indexOf('/plans/'))}/` : './';
    if (!parsed.ok) {
      findings.push(...checkFileText({ kind: 'plan', file: file.path, text: file.text, formulas: known, formulasDir: folder }).findings);
      continue;
    }
    const own = checkPlan({ file: file.path, plan: parsed.value, source: parsed.source, fileStem: fileStem(file.path), formulas: known, formulasDir: folder });
    findings.push(...own);
    if (own.some((x) => x.severity === 'error')) continue;
    const before = seenDates.get(parsed.value.date);
    if (before) {
      const where = parsed.source.locate('/date');
      findings.push({ file: file.path, ...where, severity: 'error', pointer: '/date', message: `the date ${parsed.value.date} is also planned in ${before}` });
      continue;
    }
    seenDates.set(parsed.value.date, file.path);
    plans.push({ file, value: parsed.value, raw: parsed.raw, hash: contentHash(file.text) });
  }
  if (!findings.some((f) => f.severity === 'error')) {
    for (const check of extra) findings.push(...check({ catalog, formulas, plans }));
  }
  const sorted = sortFindings(findings);
  if (sorted.some((f) => f.severity === 'error')) return { ok: false, findings: sorted };
  return { ok: true, findings: sorted, catalog, formulas, plans };
}
