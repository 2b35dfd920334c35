// Text that cannot be stored or shown: a NUL character (PostgreSQL's text refuses it) or a lone
// surrogate (half of a UTF-16 pair, not a character; a "\ud800" escape in YAML makes one). Both
// can hide in a quoted YAML string and pass the schema, so every key and value is looked at. Pure.
import type { Finding, SourceMap } from '../parse.ts';
import { pointer } from './report.ts';

const LONE_SURROGATE = /[\ud800-\udbff](?![\udc00-\udfff])|(?<![\ud800-\udbff])[\udc00-\udfff]/;
/** Enough to show the problem; a file full of them needs no hundred lines. */
const MAX_FINDINGS = 20;

function problemOf(s: string): string | null {
  if (s.includes('\u0000')) return 'holds a NUL character (\\0), which cannot be stored; remove it';
  const m = LONE_SURROGATE.exec(s);
  if (m) return `holds a lone surrogate (\\u${m[0].charCodeAt(0).toString(16)}), half of a character that cannot be stored; write the character itself or remove the escape`;
  return null;
}

/** One located error per key or text value that holds a NUL character or a lone surrogate. */
export function checkStoredText(data: unknown, file: string, source: SourceMap): Finding[] {
  const out: Finding[] = [];
  const report = (at: string, which: 'key' | 'value', what: string, problem: string) => {
    if (out.length >= MAX_FINDINGS) return;
    let where = { line: 1, col: 1 };
    try {
      where = source.locate(at, which);
    } catch {
      // A position is a convenience; the finding itself must not be lost.
    }
    out.push({ file, ...where, severity: 'error', pointer: at, message: `${what} ${problem}` });
  };
  const walk = (value: unknown, path: string[]) => {
    if (typeof value === 'string') {
      const p = problemOf(value);
      if (p) report(pointer(...path), 'value', path.length > 0 ? `the text of ${path.join('.')}` : 'the text', p);
    } else if (Array.isArray(value)) {
      value.forEach((v, i) => walk(v, [...path, String(i)]));
    } else if (value !== null && typeof value === 'object') {
      for (const [k, v] of Object.entries(value)) {
        const p = problemOf(k);
        if (p) report(pointer(...path, k), 'key', `a key under ${path.length > 0 ? path.join('.') : 'the top level'}`, p);
        walk(v, [...path, k]);
      }
    }
  };
  walk(data, []);
  return out;
}
