// Clearer messages for values the schema refused: a quantity with an unknown unit says which
// unit it saw and which it accepts. Pure.
import { decodePointer, type Finding, type SourceMap } from '../parse.ts';
import { parseRange, QuantityError } from '../units.ts';
import type { SchemaKind } from '../schema/shapes.ts';
// The generated JSON Schema (kept equal to shapes.ts by the drift test): plain data, so the
// checks load no schema builder.
import formulaSchema from '../schema/formula.schema.json';
import catalogSchema from '../schema/catalog.schema.json';
import planSchema from '../schema/plan.schema.json';

const SCHEMAS: Record<SchemaKind, unknown> = { formula: formulaSchema, catalog: catalogSchema, plan: planSchema };
import { FindingList, pointer, quote } from './report.ts';
import { didYouMean } from './suggest.ts';

type Quantity = 'mass' | 'temperature' | 'temperature-difference' | 'percent' | 'range' | 'bakers-percent';

/** What a field holds, from where it sits in the file. */
export function quantityAt(kind: SchemaKind, path: string[]): Quantity | undefined {
  const last = path[path.length - 1];
  const parent = path[path.length - 2];
  if (kind === 'formula') {
    if (path.length === 2 && path[0] === 'yield' && last === 'piece') return 'mass';
    if (path.length === 1 && last === 'dough_temperature') return 'temperature';
    if (path.length === 1 && last === 'loss') return 'percent';
    if (path.length === 2 && (last !== undefined) && (path[0] === 'flour' || path[0] === 'ingredients')) return 'bakers-percent';
    if (path[0] === 'preferments' || path[0] === 'soakers') {
      if (path.length === 4 && parent === 'ingredients') return 'bakers-percent';
      if (last === 'share') return 'percent';
      if (last === 'temperature') return 'temperature';
      if (last === 'hours') return 'range';
    }
    if (path[0] === 'process' && path.length === 3) {
      if (last === 'temperature') return 'temperature';
      if (last === 'minutes' || last === 'hours') return 'range';
    }
  }
  if (kind === 'plan') {
    if (path[0] === 'conditions' && path.length === 2) return 'temperature';
    if (path[0] === 'mixers' && path.length === 3) {
      if (last === 'capacity' || last === 'minimum') return 'mass';
      if (last === 'friction') return 'temperature-difference';
    }
    if (path[0] === 'orders' && path.length === 3 && last === 'piece') return 'mass';
  }
  if (kind === 'catalog' && path.length === 2 && (last === 'water' || last === 'hydration')) return 'percent';
  return undefined;
}

const HOW: Record<Exclude<Quantity, 'bakers-percent' | 'range'>, { what: string; units: string; example: string }> = {
  mass: { what: 'a weight', units: 'g, kg, oz or lb', example: '"320 g"' },
  temperature: { what: 'a temperature', units: '°C or °F', example: '"25 °C"' },
  'temperature-difference': { what: 'a temperature difference', units: '°C or °F', example: '"13 °C"' },
  percent: { what: 'a percentage', units: '%', example: '"2 %"' },
};

function valueAt(data: unknown, path: string[]): unknown {
  let node = data;
  for (const seg of path) {
    if (node === null || typeof node !== 'object') return undefined;
    node = (node as Record<string, unknown>)[seg];
  }
  return node;
}

function show(v: unknown): string {
  if (typeof v === 'string') return quote(v);
  if (Array.isArray(v)) return 'a list';
  if (v === null || v === undefined) return 'empty';
  if (typeof v === 'object') return 'a block of keys';
  return String(v);
}

/** One message for a refused quantity, or undefined to keep the schema's own message. */
function explainQuantity(q: Quantity, where: string, v: unknown): string | undefined {
  if (q === 'bakers-percent') {
    if (typeof v === 'string') {
      const m = /^\s*(-?[0-9]+(?:\.[0-9]+)?)\s*%\s*$/.exec(v);
      return m
        ? `${where} is ${show(v)}; write baker's percent as a plain number, e.g. ${m[1]}`
        : `${where} is ${show(v)}; write baker's percent as a plain number, e.g. 2.2`;
    }
    return `${where} is ${show(v)}; write baker's percent as a plain number, e.g. 2.2`;
  }
  if (q === 'range') {
    if (typeof v === 'number' && v < 0) return `${where} is ${v}; a duration cannot be negative`;
    const unit = typeof v === 'string' ? /^\s*-?[0-9.]+(?:\s*[-–]\s*[0-9.]+)?\s*([^\s0-9].*?)\s*$/.exec(v) : null;
    if (unit) return `${where} is ${show(v)}: write the number alone (the key "${where.split('.').pop()}" gives the unit "${unit[1]}"), or a range such as "10-14"`;
    if (typeof v === 'string' && /^\s*-/.test(v)) return `${where} is ${show(v)}; a duration cannot be negative`;
    return `${where} is ${show(v)}; write a number, or a range such as "10-14"`;
  }
  const how = HOW[q];
  const write = `write ${how.what} as a number and ${how.units}, e.g. ${how.example}`;
  if (typeof v === 'number') return `${where} is ${v} without a unit; ${write}`;
  if (typeof v !== 'string') return `${where} must be ${how.what}; ${write}`;
  const m = /^\s*(-?[0-9]+(?:[.,][0-9]+)?)\s*(.*?)\s*$/.exec(v);
  if (!m) return `${where} is ${show(v)}: not ${how.what}; ${write}`;
  if (m[1].includes(',')) return `${where} is ${show(v)}: use a decimal point, not a comma; ${write}`;
  if (m[2] === '') return `${where} is ${show(v)} without a unit; ${write}`;
  if (/^e[+-]?[0-9]/i.test(m[2])) return `${where} is ${show(v)}: write the number in full, without an exponent; ${write}`;
  if (m[1].startsWith('-') && q === 'mass') return `${where} is ${show(v)}: a weight cannot be negative`;
  return `${where} is ${show(v)}: unknown unit ${quote(m[2])}; ${write}`;
}

type SchemaNode = {
  properties?: Record<string, SchemaNode>;
  patternProperties?: Record<string, SchemaNode>;
  items?: SchemaNode;
  anyOf?: SchemaNode[];
  enum?: unknown[];
};

/** The schema of the value at `path`, following objects, records and lists. */
function schemaAt(kind: SchemaKind, path: string[]): SchemaNode | undefined {
  let node: SchemaNode | undefined = SCHEMAS[kind] as unknown as SchemaNode;
  for (const seg of path) {
    if (!node) return undefined;
    if (node.properties && Object.hasOwn(node.properties, seg)) node = node.properties[seg];
    else if (node.patternProperties) node = Object.values(node.patternProperties)[0];
    else if (node.items) node = node.items;
    else return undefined;
  }
  return node;
}

/** The field names the schema allows in the object at `path`. */
export function fieldsAt(kind: SchemaKind, path: string[]): string[] {
  const node = schemaAt(kind, path);
  return node?.properties ? Object.keys(node.properties).filter((k) => k !== '$schema') : [];
}

/** The values the schema allows at `path`, when it is a list of choices. */
export function choicesAt(kind: SchemaKind, path: string[]): string[] {
  const node = schemaAt(kind, path);
  return Array.isArray(node?.enum) ? node.enum.map(String) : [];
}

/** Rewrites the schema's findings about quantities and codes into messages that say what to write. */
export function explainSchemaFindings(kind: SchemaKind, findings: Finding[], data: unknown): Finding[] {
  return findings.map((f) => {
    if (f.pointer === undefined) return f;
    const path = decodePointer(f.pointer);
    const where = path.length ? path.join('.') : 'the file';
    const v = valueAt(data, path);
    const q = quantityAt(kind, path);
    const refusedValue = /is not written as expected|must be (string|number)|must be >=|must be >/.test(f.message);
    if (q && refusedValue && v !== undefined) {
      const message = explainQuantity(q, where, v);
      if (message) return { ...f, message };
    }
    const unknownField = /^unknown field "(.*)" in /.exec(f.message);
    if (unknownField) {
      const fields = fieldsAt(kind, path.slice(0, -1));
      return { ...f, message: `${f.message}${didYouMean(unknownField[1], fields)}${fields.length ? ` (fields here: ${fields.join(', ')})` : ''}` };
    }
    const oneOf = /must be one of:/.test(f.message);
    const allowed = oneOf ? choicesAt(kind, path) : [];
    if (oneOf && typeof v === 'string' && allowed.length > 0) {
      const list = allowed.join(', ');
      if (path.includes('allergens') || path.includes('may_contain')) {
        const hint = /gluten/i.test(v) ? '; cereals containing gluten are written by grain: wheat, rye, barley, oats, spelt, khorasan' : didYouMean(v, allowed);
        return { ...f, message: `unknown allergen code ${quote(v)} in ${path.slice(0, -1).join('.')}${hint} (codes: ${list})` };
      }
      return { ...f, message: `${where} is ${quote(v)}, not one of: ${list}${didYouMean(v, allowed)}` };
    }
    return f;
  });
}

/**
 * The model refuses a few values the schema lets through (a range written backwards); find
 * them in the data so the finding points at the value, not at the top of the file.
 */
export function locateQuantityProblems(kind: SchemaKind, data: unknown, file: string, source: SourceMap): Finding[] {
  const out = new FindingList(file, source);
  if (kind !== 'formula' || data === null || typeof data !== 'object') return out.findings;
  const visit = (path: (string | number)[], v: unknown) => {
    if (v === undefined) return;
    try {
      parseRange(v as string | number);
    } catch (e) {
      if (e instanceof QuantityError) out.error(pointer(...path), `${path.join('.')} is ${show(v)}: ${e.message.replace(/:.*$/, '')}; expected ${e.expected}`);
    }
  };
  const d = data as Record<string, unknown>;
  const each = (key: string, fn: (item: Record<string, unknown>, i: number) => void) => {
    const list = d[key];
    if (Array.isArray(list)) list.forEach((x, i) => x && typeof x === 'object' && fn(x as Record<string, unknown>, i));
  };
  each('preferments', (p, i) => visit(['preferments', i, 'ripen', 'hours'], (p.ripen as Record<string, unknown> | undefined)?.hours));
  each('soakers', (s, i) => visit(['soakers', i, 'soak', 'hours'], (s.soak as Record<string, unknown> | undefined)?.hours));
  each('process', (s, i) => {
    visit(['process', i, 'minutes'], s.minutes);
    visit(['process', i, 'hours'], s.hours);
  });
  return out.findings;
}
