// Reading the batch a baker asks for: pieces (with a piece weight or the formula's), a weight of
// mixed dough, or a weight of flour. One reader for `panform scale`/`cost` flags, the API's query
// (?pieces=&piece=, ?mix=, ?flour=) and the viewer's address, so they accept and refuse alike.
// Weights are "900 g", "28.47 kg", "2 lb" or a bare number of grams. Pure.
import type { ScaleTarget } from './scale.ts';
import { parseMassArgument, QuantityError } from './units.ts';

export type BatchField = 'pieces' | 'piece' | 'mix' | 'flour';

/** The batch as typed: each field's text, or undefined (an empty field counts as not given). */
export type BatchFields = Partial<Record<BatchField, string>>;

/** More pieces than any bakery makes of one product in a night: a typo, refused. */
export const MAX_PIECES = 100_000;
/** 10 t: more dough than any mixer room holds: a typo, refused. */
export const MAX_BATCH_GRAMS = 10_000_000;

/** A field that cannot be read; `field` is where, `hint` what would do. */
export class BatchError extends Error {
  constructor(
    readonly field: BatchField,
    message: string,
    readonly hint?: string,
  ) {
    super(message);
    this.name = 'BatchError';
  }
}

const WEIGHT_HINT = 'e.g. "900 g", "28.47 kg", "2 lb" or a bare number of grams';

/**
 * The target the fields ask for, or null when none is given (the batch the formula is written
 * for). `name` words a field as the surface shows it ("--mix" for the CLI, "mix" for the API).
 * Throws BatchError.
 */
export function parseBatch(fields: BatchFields, name: (f: BatchField) => string = (f) => f): ScaleTarget | null {
  const given = (f: BatchField) => fields[f] !== undefined && fields[f]!.trim() !== '';
  const modes = (['pieces', 'mix', 'flour'] as const).filter(given);
  if (modes.length > 1) {
    throw new BatchError(modes[0], `${name(modes[0])} and ${name(modes[1])} cannot be used together`, `give one of ${name('pieces')} N [${name('piece')} W], ${name('mix')} W or ${name('flour')} W`);
  }
  if (given('piece') && !given('pieces')) throw new BatchError('piece', `${name('piece')} needs ${name('pieces')}`, `e.g. ${name('pieces')} 18 with ${name('piece')} 900g`);
  if (given('pieces')) {
    const text = fields.pieces!.trim();
    const n = Number(text);
    if (!/^\d+$/.test(text) || n < 1) throw new BatchError('pieces', `${name('pieces')} must be a whole number of at least 1; got ${text}`);
    if (n > MAX_PIECES) throw new BatchError('pieces', `${name('pieces')} must be at most ${MAX_PIECES}; got ${text}`);
    return { by: 'pieces', pieces: n, pieceGrams: given('piece') ? weight('piece', fields.piece!, name) : undefined };
  }
  if (given('mix')) return { by: 'mix', grams: weight('mix', fields.mix!, name) };
  if (given('flour')) return { by: 'flour', grams: weight('flour', fields.flour!, name) };
  return null;
}

function weight(field: BatchField, raw: string, name: (f: BatchField) => string): number {
  const text = raw.trim();
  if (text.startsWith('-')) throw new BatchError(field, `${name(field)} must be a weight above 0; got ${text}`, WEIGHT_HINT);
  let g: number;
  try {
    g = parseMassArgument(text);
  } catch (e) {
    if (e instanceof QuantityError) throw new BatchError(field, `${name(field)}: ${e.message}`, `expected ${e.expected}, or a bare number of grams`);
    throw e;
  }
  if (!(g > 0) || !Number.isFinite(g)) throw new BatchError(field, `${name(field)} must be a weight above 0; got ${text}`, WEIGHT_HINT);
  if (g > MAX_BATCH_GRAMS) throw new BatchError(field, `${name(field)} must be at most ${MAX_BATCH_GRAMS / 1_000_000} t; got ${text}`, WEIGHT_HINT);
  return g;
}
