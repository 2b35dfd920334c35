// The batch a command is asked for, from its flags: `--pieces N [--piece W]`, `--mix W` or
// `--flour W`, read by shared/batch.ts like the API's query and the viewer's address.
import { BatchError, parseBatch, type BatchFields } from '#shared/batch';
import type { ScaleTarget } from '#shared/scale';
import { UsageError } from './errors.ts';

export type TargetFlags = BatchFields;

/** The target the flags ask for, or null for the batch the formula is written for. */
export function parseTargetFlags(o: TargetFlags): ScaleTarget | null {
  try {
    return parseBatch({ pieces: o.pieces, piece: o.piece, mix: o.mix, flour: o.flour }, (f) => `--${f}`);
  } catch (e) {
    if (e instanceof BatchError) throw new UsageError(e.message, e.hint);
    throw e;
  }
}
