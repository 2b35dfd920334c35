// `panform check` for one file's text: YAML with positions, the JSON Schema, then the trade
// checks for its kind. Every problem is a located Finding; nothing throws for any input. Pure:
// the caller reads the file (and the catalog or the formula folder it needs) and passes them in.
import {
  parseCatalogText, parseFormulaText, parsePlanText, sortFindings, type Finding, type Parsed,
} from '../parse.ts';
import type { Catalog, Formula, Plan } from '../model.ts';
import type { FormulaFile, SchemaKind } from '../schema/shapes.ts';
import { checkCatalog } from './catalog.ts';
import { explainSchemaFindings, locateQuantityProblems } from './explain.ts';
import { checkFormula } from './formula.ts';
import { checkPlan, type KnownFormula } from './plan.ts';

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

export type CheckResult =
  | { kind: 'formula'; findings: Finding[]; value?: Formula }
  | { kind: 'catalog'; findings: Finding[]; value?: Catalog }
  | { kind: 'plan'; findings: Finding[]; value?: Plan };

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
      const findings = checkFormula({
        file: req.file,
        formula: parsed.value,
        raw: parsed.raw as FormulaFile,
        source: parsed.source,
        expectedId: fileStem(req.file),
        catalog: req.catalog,
        noCatalog: req.noCatalog,
      });
      return { kind: 'formula', findings, value: parsed.value };
    }
    case 'catalog': {
      const parsed = parseCatalogText(req.text, req.file);
      if (!parsed.ok) return { kind: 'catalog', findings: parseFindings('catalog', parsed, req.file, req.text) };
      return { kind: 'catalog', findings: checkCatalog({ file: req.file, catalog: parsed.value, source: parsed.source }), value: parsed.value };
    }
    case 'plan': {
      const parsed = parsePlanText(req.text, req.file);
      if (!parsed.ok) return { kind: 'plan', findings: parseFindings('plan', parsed, req.file, req.text) };
      const findings = checkPlan({
        file: req.file,
        plan: parsed.value,
        source: parsed.source,
        fileStem: fileStem(req.file),
        formulas: req.formulas,
        formulasDir: req.formulasDir,
      });
      return { kind: 'plan', findings, value: parsed.value };
    }
  }
}
