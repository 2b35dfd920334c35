// `panform check` for one file's text: YAML with positions, the JSON Schema, then the trade
// checks for its kind. Every problem is a located Finding; nothing throws for any input. Pure:
// the caller reads the file (and the catalog or the formula folder it needs) and passes them in.
import {
  parseCatalogText, parseFormulaText, parsePlanText, sortFindings, type Finding, type Parsed, type SourceMap,
} from '../parse.ts';
import type { Catalog, Formula, Plan } from '../model.ts';
import type { FormulaFile, SchemaKind } from '../schema/shapes.ts';
import { checkCatalog } from './catalog.ts';
import { explainSchemaFindings, locateQuantityProblems } from './explain.ts';
import { checkFormula } from './formula.ts';
import { checkPlan, type KnownFormula } from './plan.ts';
import { checkStoredText } from './stored-text.ts';
import { referenceFigures } from '../figures.ts';
import { ScaleError } from '../scale.ts';

export type CheckRequest =
  | {
      kind: 'formula';
      file: string;
      text: string;
      /** null: no catalog; names and kinds are not checked and `noCatalog` says why. */
      catalog: Catalog | null;
      noCatalog?: string;
    }
  | { kind: 'catalog'; file: string; text: string }
  | { kind: 'plan'; file: string; text: string; formulas: ReadonlyMap<string, KnownFormula>; formulasDir: string };

/** `value` and `raw` (the file's data as parsed) are set when the file has no error. */
export type CheckResult =
  | { kind: 'formula'; findings: Finding[]; value?: Formula; raw?: unknown; source?: SourceMap }
  | { kind: 'catalog'; findings: Finding[]; value?: Catalog; raw?: unknown; source?: SourceMap }
  | { kind: 'plan'; findings: Finding[]; value?: Plan; raw?: unknown; source?: SourceMap };

/** The ingredient catalog's file name in a formulas folder. */
export const CATALOG_FILE = 'ingredients.yaml';

/** A formula, catalog or plan file is a few kB; anything far larger is not one, and is not read whole. */
export const MAX_FILE_BYTES = 2 * 1024 * 1024;

export function tooLargeProblem(bytes: number): string {
  return `the file is ${(bytes / 1024 / 1024).toFixed(1)} MB; a formula, catalog or plan file is a few kB (at most ${MAX_FILE_BYTES / 1024 / 1024} MB), so this is not one`;
}

/** "formulas/plans/2026-12-03.yaml" → "2026-12-03". */
export function fileStem(file: string): string {
  const base = file.split(/[\\/]/).pop() ?? file;
  return base.replace(/\.ya?ml$/i, '');
}

/** Schema findings explained; a value the model refused located where it is written. */
function parseFindings<T>(kind: SchemaKind, parsed: Parsed<T>, file: string, text: string): Finding[] {
  if (parsed.ok) return [];
  if (parsed.raw === undefined || parsed.source === null) return parsed.findings.map((f) => explainYamlError(nameDuplicateKey(f, text)));
  const explained = explainSchemaFindings(kind, parsed.findings, parsed.raw);
  const atTop = explained.length === 1 && explained[0].line === 1 && explained[0].col === 1 && explained[0].pointer === undefined;
  if (atTop) {
    const located = locateQuantityProblems(kind, parsed.raw, file, parsed.source);
    if (located.length > 0) return located;
  }
  return explained;
}

/** "duplicate key: …" → 'duplicate key "water": …', reading the key where the finding points. */
function nameDuplicateKey(f: Finding, text: string): Finding {
  if (!f.message.startsWith('duplicate key')) return f;
  const line = text.replace(/^\uFEFF/, '').split(/\r?\n/)[f.line - 1] ?? '';
  const m = /^\s*(?:-\s+)?("[^"]*"|'[^']*'|[^:#{}[\],]+?)\s*:/.exec(line.slice(f.col - 1));
  if (!m) return f;
  const key = m[1].replace(/^["']|["']$/g, '');
  return { ...f, message: `duplicate key ${JSON.stringify(key)}: it appears twice in the same block; keep one` };
}

/** The YAML parser's own words, marked as such so a baker knows it is the file's layout at fault. */
function explainYamlError(f: Finding): Finding {
  if (/^(duplicate key|the file is empty|this is not a text file|cannot be read as YAML)/.test(f.message) || /yaml/i.test(f.message)) return f;
  return { ...f, message: `not valid YAML: ${f.message}` };
}

export function checkFileText(req: CheckRequest): CheckResult {
  try {
    return sorted(run(req));
  } catch (e) {
    // A bug in a check must not hide the file's other problems or crash the run.
    const message = `Panform could not finish checking this file (internal error: ${(e as Error)?.message ?? String(e)}); please report it`;
    return { kind: req.kind, findings: [{ file: req.file, line: 1, col: 1, severity: 'error', message }] } as CheckResult;
  }
}

function sorted(r: CheckResult): CheckResult {
  return { ...r, findings: sortFindings(r.findings) } as CheckResult;
}

function run(req: CheckRequest): CheckResult {
  switch (req.kind) {
    case 'formula': {
      const parsed = parseFormulaText(req.text, req.file);
      if (!parsed.ok) return { kind: 'formula', findings: parseFindings('formula', parsed, req.file, req.text) };
      const stored = checkStoredText(parsed.raw, req.file, parsed.source);
      if (stored.length > 0) return { kind: 'formula', findings: stored };
      const findings = checkFormula({
        file: req.file,
        formula: parsed.value,
        raw: parsed.raw as FormulaFile,
        source: parsed.source,
        expectedId: fileStem(req.file),
        catalog: req.catalog,
        noCatalog: req.noCatalog,
      });
      if (req.catalog && !findings.some((f) => f.severity === 'error')) findings.push(...checkReferenceBatch(parsed.value, req.catalog, req.file, parsed.source));
      return withValue({ kind: 'formula', findings, value: parsed.value, raw: parsed.raw, source: parsed.source });
    }
    case 'catalog': {
      const parsed = parseCatalogText(req.text, req.file);
      if (!parsed.ok) return { kind: 'catalog', findings: parseFindings('catalog', parsed, req.file, req.text) };
      const stored = checkStoredText(parsed.raw, req.file, parsed.source);
      if (stored.length > 0) return { kind: 'catalog', findings: stored };
      const findings = checkCatalog({ file: req.file, catalog: parsed.value, source: parsed.source });
      return withValue({ kind: 'catalog', findings, value: parsed.value, raw: parsed.raw, source: parsed.source });
    }
    case 'plan': {
      const parsed = parsePlanText(req.text, req.file);
      if (!parsed.ok) return { kind: 'plan', findings: parseFindings('plan', parsed, req.file, req.text) };
      const stored = checkStoredText(parsed.raw, req.file, parsed.source);
      if (stored.length > 0) return { kind: 'plan', findings: stored };
      const findings = checkPlan({
        file: req.file,
        plan: parsed.value,
        source: parsed.source,
        fileStem: fileStem(req.file),
        formulas: req.formulas,
        formulasDir: req.formulasDir,
      });
      return withValue({ kind: 'plan', findings, value: parsed.value, raw: parsed.raw, source: parsed.source });
    }
  }
}

/** The value and data only for a file without errors: nothing else may use it. */
function withValue(r: CheckResult): CheckResult {
  if (!r.findings.some((f) => f.severity === 'error')) return r;
  return { kind: r.kind, findings: r.findings, value: r.value } as CheckResult;
}

/** The formula's own batch (its yield) must scale: the figures it is listed and compared by come from it. */
function checkReferenceBatch(formula: Formula, catalog: Catalog, file: string, source: SourceMap): Finding[] {
  try {
    referenceFigures(formula, catalog);
    return [];
  } catch (e) {
    if (!(e instanceof ScaleError)) throw e;
    return [{ file, ...source.locate('/yield'), severity: 'error', pointer: '/yield', message: `the formula's own batch (its yield) cannot be scaled: ${e.message}` }];
  }
}
