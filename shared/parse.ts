// Reads the text of a formula, catalog or plan file: YAML with source positions (the `yaml`
// package), then the JSON Schema (ajv), then normalization. Every problem is a located Finding;
// nothing throws for bad input. Pure: the caller reads the file and passes its text in.
import type { ErrorObject } from 'ajv';
import { isMap, isPair, isScalar, isSeq, LineCounter, parseDocument, type Document, type Node } from 'yaml';
import type { CatalogFile, FormulaFile, PlanFile, SchemaKind } from './schema/shapes.ts';
import { validatorFor } from './schema/validators.ts';
import { normalizeCatalog, normalizeFormula, normalizePlan, type Catalog, type Formula, type Plan } from './model.ts';
import { QuantityError } from './units.ts';

import type { Finding } from './findings.ts';
export { formatFinding, sortFindings, type Finding, type Severity } from './findings.ts';

export interface SourceMap {
  /** Position of the value at a JSON pointer (or of its nearest existing parent). */
  locate(pointer: string, which?: 'key' | 'value'): { line: number; col: number };
}

export type Parsed<T> =
  | { ok: true; value: T; raw: unknown; findings: Finding[]; source: SourceMap }
  | { ok: false; findings: Finding[]; source: SourceMap | null; raw?: unknown };

/** Control characters other than tab and line breaks, and the mark of bytes that were not UTF-8. */
const ODD_CHARACTERS = /[\u0000-\u0008\u000b\u000c\u000e-\u001f\ufffd]/g;

function looksBinary(text: string): boolean {
  if (text.includes('\u0000')) return true;
  // More than 8 odd characters in the first 4 KB (a regular expression: a cold loop over the
  // characters costs more than reading the file).
  return (text.slice(0, 4096).match(ODD_CHARACTERS)?.length ?? 0) > 8;
}

export function decodePointer(pointer: string): string[] {
  if (pointer === '' || pointer === '/') return [];
  return pointer
    .split('/')
    .slice(1)
    .map((s) => s.replace(/~1/g, '/').replace(/~0/g, '~'));
}

function makeSourceMap(doc: Document, lc: LineCounter): SourceMap {
  const pos = (offset: number) => {
    const p = lc.linePos(offset);
    return { line: p.line, col: p.col };
  };
  return {
    locate(pointer, which = 'value') {
      let node: unknown = doc.contents;
      let keyNode: unknown = null;
      for (const seg of decodePointer(pointer)) {
        if (isMap(node)) {
          const pair = node.items.find((it) => isPair(it) && isScalar(it.key) && String(it.key.value) === seg);
          if (!pair) break;
          keyNode = pair.key;
          node = pair.value ?? pair.key;
        } else if (isSeq(node)) {
          const item = node.items[Number(seg)];
          if (item === undefined) break;
          keyNode = null;
          node = item;
        } else break;
      }
      const target = (which === 'key' && keyNode ? keyNode : node) as Node | null;
      const range = target && 'range' in target ? target.range : undefined;
      return range ? pos(range[0]) : { line: 1, col: 1 };
    },
  };
}

function describeAjvError(e: ErrorObject): { pointer: string; message: string; at: 'key' | 'value' } {
  const where = e.instancePath === '' ? 'the file' : decodePointer(e.instancePath).join('.');
  switch (e.keyword) {
    case 'required':
      return { pointer: e.instancePath, message: `${where} needs "${(e.params as { missingProperty: string }).missingProperty}"`, at: 'value' };
    case 'additionalProperties': {
      const extra = (e.params as { additionalProperty: string }).additionalProperty;
      return { pointer: `${e.instancePath}/${extra}`, message: `unknown field "${extra}" in ${where}`, at: 'key' };
    }
    case 'enum':
      return {
        pointer: e.instancePath,
        message: `${where} must be one of: ${((e.params as { allowedValues: unknown[] }).allowedValues ?? []).join(', ')}`,
        at: 'value',
      };
    case 'pattern':
      return { pointer: e.instancePath, message: `${where} is not written as expected (${patternHint((e.params as { pattern: string }).pattern)})`, at: 'value' };
    case 'type':
      return { pointer: e.instancePath, message: `${where} must be ${(e.params as { type: string }).type}`, at: 'value' };
    case 'minimum':
    case 'exclusiveMinimum':
    case 'maximum':
    case 'exclusiveMaximum':
    case 'minItems':
    case 'minLength':
    case 'uniqueItems':
      return { pointer: e.instancePath, message: `${where} ${e.message ?? 'is out of range'}`, at: 'value' };
    default:
      return { pointer: e.instancePath, message: `${where} ${e.message ?? 'is not valid'}`, at: 'value' };
  }
}

function patternHint(pattern: string): string {
  if (pattern.includes('(g|kg|oz|lb)')) return 'a weight with its unit, e.g. "320 g"';
  if (pattern.includes('(C|F)')) return 'a temperature with its unit, e.g. "25 °C"';
  if (pattern.includes('%')) return 'a percentage, e.g. "2 %"';
  if (pattern.includes('[-–]')) return 'a number or a range such as "10-14"';
  if (pattern.includes(':[0-5]')) return 'a time of day, "HH:MM"';
  if (pattern.includes('{4}')) return 'a date, "YYYY-MM-DD"';
  if (pattern.includes('[a-z0-9]+(-')) return 'kebab-case, e.g. "harbour-ciabatta"';
  return `matching ${pattern}`;
}

/** Union errors from ajv repeat the same place once per branch; keep the most useful one. */
function pruneAjvErrors(errors: ErrorObject[]): ErrorObject[] {
  const byPath = new Map<string, ErrorObject[]>();
  for (const e of errors) {
    const list = byPath.get(e.instancePath) ?? [];
    list.push(e);
    byPath.set(e.instancePath, list);
  }
  const out: ErrorObject[] = [];
  for (const [, list] of byPath) {
    const hasUnion = list.some((e) => e.keyword === 'anyOf');
    if (!hasUnion) {
      out.push(...list);
      continue;
    }
    const specific = list.find((e) => e.keyword === 'pattern') ?? list.find((e) => e.keyword !== 'anyOf' && e.keyword !== 'type');
    out.push(specific ?? list.find((e) => e.keyword === 'anyOf')!);
  }
  return out;
}

/** YAML text → plain data with positions, or located findings. Never throws. */
export function parseYamlText(text: string, file: string): { ok: true; data: unknown; source: SourceMap } | { ok: false; findings: Finding[] } {
  const at = (line: number, col: number, message: string): Finding => ({ file, line, col, severity: 'error', message });
  if (looksBinary(text)) return { ok: false, findings: [at(1, 1, 'this is not a text file (binary content)')] };
  const body = text.replace(/^\uFEFF/, '');
  // Nothing but blank lines and comments: no line starts, after its blanks, with anything but "#".
  if (!/^\s*[^\s#]/m.test(body)) {
    return { ok: false, findings: [at(1, 1, 'the file is empty')] };
  }
  // Every syntax problem located; aliases expanded within bounds.
  const lc = new LineCounter();
  let doc: Document;
  try {
    doc = parseDocument(body, { lineCounter: lc, uniqueKeys: true, prettyErrors: false, strict: true });
  } catch (e) {
    return { ok: false, findings: [at(1, 1, `cannot be read as YAML: ${(e as Error).message}`)] };
  }
  if (doc.errors.length > 0) {
    return {
      ok: false,
      findings: doc.errors.map((e) => {
        const p = lc.linePos(e.pos[0]);
        const msg = e.code === 'DUPLICATE_KEY' ? `duplicate key: ${firstLine(e.message).replace(/^Map keys must be unique.*$/, 'this key appears twice in the same block')}` : firstLine(e.message);
        return at(p.line, p.col, msg);
      }),
    };
  }
  let data: unknown;
  try {
    data = doc.toJS({ maxAliasCount: 100 });
  } catch (e) {
    return { ok: false, findings: [at(1, 1, `cannot be read as YAML: ${firstLine((e as Error).message)}`)] };
  }
  return { ok: true, data, source: makeSourceMap(doc, lc) };
}

function firstLine(s: string): string {
  return s.split('\n')[0].trim();
}

/** A finding is one line: a key written as a YAML collection would otherwise spread over several. */
function oneLine(s: string): string {
  const flat = s.replace(/\s*\n\s*/g, ' ');
  return flat.length > 200 ? `${flat.slice(0, 199)}…` : flat;
}

/** Validates data against one of the file schemas; findings are located with `source`. */
export function validateAgainstSchema(kind: SchemaKind, data: unknown, file: string, source: SourceMap): Finding[] {
  if (data === null || typeof data !== 'object' || Array.isArray(data)) {
    return [{ file, line: 1, col: 1, severity: 'error', message: `a ${kind} file must be a mapping of keys to values` }];
  }
  const v = validatorFor(kind);
  if (v(data)) return [];
  return pruneAjvErrors(v.errors ?? []).map((e) => {
    const d = describeAjvError(e);
    const p = source.locate(d.pointer, d.at);
    return { file, line: p.line, col: p.col, severity: 'error', message: oneLine(d.message), pointer: d.pointer };
  });
}

function parseKind<Raw, T>(kind: SchemaKind, text: string, file: string, normalize: (raw: Raw) => T): Parsed<T> {
  const y = parseYamlText(text, file);
  if (!y.ok) return { ok: false, findings: y.findings, source: null };
  const findings = validateAgainstSchema(kind, y.data, file, y.source);
  if (findings.length > 0) return { ok: false, findings, source: y.source, raw: y.data };
  try {
    return { ok: true, value: normalize(y.data as Raw), raw: y.data, findings: [], source: y.source };
  } catch (e) {
    if (e instanceof QuantityError) {
      return { ok: false, findings: [{ file, line: 1, col: 1, severity: 'error', message: `${e.message}; expected ${e.expected}` }], source: y.source, raw: y.data };
    }
    throw e;
  }
}

export function parseFormulaText(text: string, file: string): Parsed<Formula> {
  return parseKind<FormulaFile, Formula>('formula', text, file, normalizeFormula);
}
export function parseCatalogText(text: string, file: string): Parsed<Catalog> {
  return parseKind<CatalogFile, Catalog>('catalog', text, file, normalizeCatalog);
}
export function parsePlanText(text: string, file: string): Parsed<Plan> {
  return parseKind<PlanFile, Plan>('plan', text, file, normalizePlan);
}

