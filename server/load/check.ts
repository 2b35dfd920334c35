// Checking everything a load will take in before anything is written: each file parsed against
// its schema, a formula's id equal to its file name, its reference batch computable, and the
// trade checks. Any error and the load writes nothing.
import { createHash } from 'node:crypto';
import type { FormulaFigures } from '#shared/api';
import type { Catalog, Formula, Plan } from '#shared/model';
import { parseCatalogText, parseFormulaText, parsePlanText, sortFindings, type Finding } from '#shared/parse';
import { scaleFormula, ScaleError } from '#shared/scale';
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

/** Figures of a formula's reference batch (its own yield). Throws ScaleError when it cannot be scaled. */
export function referenceFigures(formula: Formula, catalog: Catalog): FormulaFigures {
  const r = scaleFormula(formula, catalog, { by: 'pieces', pieces: formula.yield.pieces });
  return {
    totalPercent: r.totalPercent,
    hydration: r.hydration,
    effectiveHydration: r.effectiveHydration,
    prefermentedFlour: r.prefermentedFlour,
    finalDoughHydration: r.finalDoughHydration,
    flour: r.flour,
    mixedDough: r.mixedDough,
    dividedDough: r.dividedDough,
    pieces: r.pieces,
    pieceGrams: r.pieceGrams,
  };
}

const fileId = (path: string) => path.slice(path.lastIndexOf('/') + 1).replace(/\.ya?ml$/i, '');

export function checkLoadInput(input: LoadInput, extra: ExtraCheck[] = []): CheckResult {
  const findings: Finding[] = [];
  let catalog: CheckedCatalog | null = null;
  const catalogFile = input.files.find((f) => f.kind === 'catalog');
  if (catalogFile) {
    const parsed = parseCatalogText(catalogFile.text, catalogFile.path);
    findings.push(...parsed.findings);
    if (parsed.ok) catalog = { file: catalogFile, value: parsed.value, raw: parsed.raw as Record<string, unknown> };
  }
  const cat = catalog?.value ?? {};
  const formulas: CheckedFormula[] = [];
  const plans: CheckedPlan[] = [];
  const seenIds = new Map<string, string>();
  const seenDates = new Map<string, string>();
  for (const file of input.files) {
    if (file.kind === 'formula') {
      const parsed = parseFormulaText(file.text, file.path);
      findings.push(...parsed.findings);
      if (!parsed.ok) continue;
      const at = (pointer: string) => ({ file: file.path, ...parsed.source.locate(pointer), severity: 'error' as const, pointer });
      const f = parsed.value;
      if (f.id !== fileId(file.path)) {
        findings.push({ ...at('/id'), message: `id "${f.id}" must equal the file name "${fileId(file.path)}"` });
        continue;
      }
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
    } else if (file.kind === 'plan') {
      const parsed = parsePlanText(file.text, file.path);
      findings.push(...parsed.findings);
      if (!parsed.ok) continue;
      const before = seenDates.get(parsed.value.date);
      if (before) {
        const where = parsed.source.locate('/date');
        findings.push({ file: file.path, ...where, severity: 'error', pointer: '/date', message: `the date ${parsed.value.date} is also planned in ${before}` });
        continue;
      }
      seenDates.set(parsed.value.date, file.path);
      plans.push({ file, value: parsed.value, raw: parsed.raw, hash: contentHash(file.text) });
    }
  }
  if (!findings.some((f) => f.severity === 'error')) {
    for (const check of extra) findings.push(...check({ catalog, formulas, plans }));
  }
  const sorted = sortFindings(findings);
  if (sorted.some((f) => f.severity === 'error')) return { ok: false, findings: sorted };
  return { ok: true, findings: sorted, catalog, formulas, plans };
}
