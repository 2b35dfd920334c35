// A located problem in a file, as `panform check` prints it: `path:line:col severity message`.
// Kept apart from the YAML reader so that printing a finding loads nothing else.
import { compareText } from './text.ts';

export type Severity = 'error' | 'warning';

export interface Finding {
  file: string;
  line: number;
  col: number;
  severity: Severity;
  message: string;
  /** A JSON pointer into the document, where known. */
  pointer?: string;
}

export function formatFinding(f: Finding): string {
  return `${f.file}:${f.line}:${f.col} ${f.severity} ${f.message}`;
}

export function sortFindings(fs: Finding[]): Finding[] {
  return [...fs].sort((a, b) => compareText(a.file, b.file) || a.line - b.line || a.col - b.col || compareText(a.message, b.message));
}
