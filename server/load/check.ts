// Checking everything a load will take in before anything is written: the checks of
// `panform check` (shared/check) on every file, plus the reference batch of each formula and no
// duplicate ids or dates. Any error and the load writes nothing; warnings are passed on.
import { createHash } from 'node:crypto';
import type { FormulaFigures } from '#shared/api';
import type { Catalog, Formula, Plan } from '#shared/model';
import { sortFindings, type Finding } from '#shared/parse';
import { referenceFigures } from '#shared/figures';
import { checkFileText, fileStem } from '#shared/check/check-file';
import type { KnownFormula } from '#shared/check/plan';
import { orderableFormula } from '#shared/files';
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
  const unread = (f: LoadFile) => {
    if (f.problem === undefined) return false;
    findings.push({ file: f.path, line: 1, col: 1, severity: 'error', message: f.problem });
    return true;
  };
  let catalog: CheckedCatalog | null = null;
  const catalogFile = input.files.find((f) => f.kind === 'catalog');
  if (catalogFile && !unread(catalogFile)) {
    const res = checkFileText({ kind: 'catalog', file: catalogFile.path, text: catalogFile.text });
    findings.push(...res.findings);
    if (res.kind === 'catalog' && res.raw !== undefined && res.value) catalog = { file: catalogFile, value: res.value, raw: res.raw as Record<string, unknown> };
  }
  const cat = catalog?.value ?? {};
  const formulas: CheckedFormula[] = [];
  const plans: CheckedPlan[] = [];
  const seenIds = new Map<string, string>();
  const seenDates = new Map<string, string>();
  // What plans may name: every formula file of the load, as `panform check` sees the folder (a
  // formula with errors is reported in its own file, not again in each plan that orders it).
  const known = new Map<string, KnownFormula>(ctx.folderFormulas ?? []);
  for (const file of input.files) {
    if (file.kind !== 'formula') continue;
    const orderable = orderableFormula(file.path.slice(file.path.indexOf('/') + 1));
    if (orderable) known.set(fileStem(file.path), {});
    if (unread(file)) continue;
    const res = checkFileText({
      kind: 'formula',
      file: file.path,
      text: file.text,
      catalog: catalog?.value ?? null,
      noCatalog: catalogFile ? `the catalog ${catalogFile.path} has errors` : 'no ingredients.yaml was found beside it or in its parent folder',
    });
    findings.push(...res.findings);
    if (orderable && res.kind === 'formula' && res.value) known.set(fileStem(file.path), { status: res.value.status });
    if (res.kind !== 'formula' || !res.value || res.raw === undefined || !res.source) continue;
    const f = res.value;
    const before = seenIds.get(f.id);
    if (before) {
      findings.push({ file: file.path, ...res.source.locate('/id'), severity: 'error', pointer: '/id', message: `the id "${f.id}" is also used by ${before}` });
      continue;
    }
    seenIds.set(f.id, file.path);
    // Checked above (checkFileText scales the formula's own batch), so this cannot throw.
    formulas.push({ file, value: f, raw: res.raw, hash: contentHash(file.text), figures: referenceFigures(f, cat) });
  }
  // Plans see the formulas of this load, and for a load of single files those on disk beside them.
  for (const file of input.files) {
    if (file.kind !== 'plan' || unread(file)) continue;
    const folder = file.path.includes('/plans/') ? `${file.path.slice(0, file.path.indexOf('/plans/'))}/` : './';
    const res = checkFileText({ kind: 'plan', file: file.path, text: file.text, formulas: known, formulasDir: folder });
    findings.push(...res.findings);
    if (res.kind !== 'plan' || !res.value || res.raw === undefined || !res.source) continue;
    const before = seenDates.get(res.value.date);
    if (before) {
      findings.push({ file: file.path, ...res.source.locate('/date'), severity: 'error', pointer: '/date', message: `the date ${res.value.date} is also planned in ${before}` });
      continue;
    }
    seenDates.set(res.value.date, file.path);
    plans.push({ file, value: res.value, raw: res.raw, hash: contentHash(file.text) });
  }
  if (!findings.some((f) => f.severity === 'error')) {
    for (const check of extra) findings.push(...check({ catalog, formulas, plans }));
  }
  const sorted = sortFindings(findings);
  if (sorted.some((f) => f.severity === 'error')) return { ok: false, findings: sorted };
  return { ok: true, findings: sorted, catalog, formulas, plans };
}
