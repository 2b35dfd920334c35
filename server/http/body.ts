// Reading JSON request bodies: each field checked for its type and length, every problem listed
// (422 with `issues`), so a wrong body never reaches a handler half-checked.
import { invalid } from './errors.ts';

export interface StringField {
  /** Longest accepted value, in characters. */
  max: number;
  /** Shortest accepted value (default 1: a required field may not be empty). */
  min?: number;
}

export function readStringFields<K extends string>(body: unknown, fields: Record<K, StringField>): Record<K, string> {
  if (typeof body !== 'object' || body === null || Array.isArray(body)) {
    throw invalid(`send a JSON object with ${Object.keys(fields).join(', ')}`);
  }
  const obj = body as Record<string, unknown>;
  const issues: { path: string; message: string }[] = [];
  const out = {} as Record<K, string>;
  for (const [name, rule] of Object.entries(fields) as [K, StringField][]) {
    const v = obj[name];
    if (v === undefined || v === null) issues.push({ path: name, message: `${name} is required` });
    else if (typeof v !== 'string') issues.push({ path: name, message: `${name} must be a string; got ${Array.isArray(v) ? 'an array' : typeof v}` });
    else if (v.length < (rule.min ?? 1)) issues.push({ path: name, message: `${name} must not be empty` });
    else if (v.length > rule.max) issues.push({ path: name, message: `${name} may have at most ${rule.max} characters` });
    else out[name] = v;
  }
  if (issues.length > 0) throw invalid(issues.map((i) => i.message).join('; '), issues);
  return out;
}
