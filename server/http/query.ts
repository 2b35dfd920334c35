// Reading query parameters: one string each, or a 422 that names the parameter.
import type { Request } from 'express';
import { invalid } from './errors.ts';

export function queryString(req: Request, name: string, max = 200): string | undefined {
  const v = (req.query as Record<string, unknown>)[name];
  if (v === undefined) return undefined;
  if (typeof v !== 'string') throw invalid(`give ${name} once, as plain text`, [{ path: name, message: 'must be a single value' }]);
  if (v.length > max) throw invalid(`${name} may have at most ${max} characters`, [{ path: name, message: 'too long' }]);
  return v;
}

export function queryInteger(req: Request, name: string, range: { min: number; max: number }): number | undefined {
  const text = queryString(req, name, 20);
  if (text === undefined || text.trim() === '') return undefined;
  const n = Number(text);
  if (!/^\s*[0-9]+\s*$/.test(text) || n < range.min || n > range.max) {
    throw invalid(`${name} must be a whole number from ${range.min} to ${range.max}; got "${text}"`, [{ path: name, message: 'not a whole number in range' }]);
  }
  return n;
}
