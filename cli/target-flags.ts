// The batch a command is asked for, from its flags: `--pieces N [--piece W]`, `--mix W` or
// `--flour W`. Shared by the commands that scale (scale, cost) so they accept and refuse alike.
import type { ScaleTarget } from '#shared/scale';
import { parseMassArgument, QuantityError } from '#shared/units';
import { UsageError } from './errors.ts';

export interface TargetFlags {
  pieces?: string;
  piece?: string;
  mix?: string;
  flour?: string;
}

/** A weight flag: "900 g", "28.47 kg", "2 lb" or a bare number of grams, above 0. */
export function parseWeightFlag(flag: string, text: string): number {
  if (/^\s*-/.test(text)) throw new UsageError(`${flag} must be a weight above 0; got ${text.trim()}`, 'e.g. "900 g", "28.47 kg", "2 lb" or a bare number of grams');
  let g: number;
  try {
    g = parseMassArgument(text);
  } catch (e) {
    if (e instanceof QuantityError) throw new UsageError(`${flag}: ${e.message}`, `expected ${e.expected}, or a bare number of grams`);
    throw e;
  }
  if (!(g > 0) || !Number.isFinite(g)) throw new UsageError(`${flag} must be a weight above 0; got ${text.trim()}`);
  return g;
}

/** The target the flags ask for, or null for the batch the formula is written for. */
export function parseTargetFlags(o: TargetFlags): ScaleTarget | null {
  const given = (['pieces', 'mix', 'flour'] as const).filter((k) => o[k] !== undefined);
  if (given.length > 1) {
    throw new UsageError(`--${given[0]} and --${given[1]} cannot be used together`, 'give one of --pieces N [--piece W], --mix W or --flour W');
  }
  if (o.piece !== undefined && o.pieces === undefined) throw new UsageError('--piece needs --pieces', 'e.g. --pieces 18 --piece 900g');
  if (o.pieces !== undefined) {
    if (!/^\s*\d+\s*$/.test(o.pieces) || Number(o.pieces) < 1) {
      throw new UsageError(`--pieces must be a whole number of at least 1; got ${o.pieces.trim()}`);
    }
    return { by: 'pieces', pieces: Number(o.pieces), pieceGrams: o.piece === undefined ? undefined : parseWeightFlag('--piece', o.piece) };
  }
  if (o.mix !== undefined) return { by: 'mix', grams: parseWeightFlag('--mix', o.mix) };
  if (o.flour !== undefined) return { by: 'flour', grams: parseWeightFlag('--flour', o.flour) };
  return null;
}
