// The batch a formula is scaled to, kept in the URL so a scaled formula can be bookmarked,
// shared and printed: ?pieces=60&piece=320 (grams) or ?mix=28500 (grams of mixed dough).
// Read by shared/batch.ts like the CLI's flags and the API's query; an address it refuses (edited
// by hand) shows the written batch.
import { BatchError, parseBatch } from '#shared/batch';
import type { Formula } from '#shared/model';
import type { ScaleTarget } from '#shared/scale';

export function targetFromSearch(params: URLSearchParams, formula: Formula): ScaleTarget {
  let target: ScaleTarget | null;
  try {
    const field = (name: string) => params.get(name) ?? undefined;
    target = parseBatch({ pieces: field('pieces'), piece: field('piece'), mix: field('mix'), flour: field('flour') });
  } catch (e) {
    if (e instanceof BatchError) return writtenBatch(formula);
    throw e;
  }
  if (target === null) return writtenBatch(formula);
  return target.by === 'pieces' ? { ...target, pieceGrams: target.pieceGrams ?? formula.yield.pieceGrams } : target;
}

export function writtenBatch(formula: Formula): ScaleTarget {
  return { by: 'pieces', pieces: formula.yield.pieces, pieceGrams: formula.yield.pieceGrams };
}

export function isWrittenBatch(target: ScaleTarget, formula: Formula): boolean {
  return target.by === 'pieces' && target.pieces === formula.yield.pieces && (target.pieceGrams ?? formula.yield.pieceGrams) === formula.yield.pieceGrams;
}

/** The search params for a target; the written batch needs none. */
export function searchFromTarget(target: ScaleTarget, formula: Formula): Record<string, string> {
  if (isWrittenBatch(target, formula)) return {};
  if (target.by === 'mix') return { mix: String(target.grams) };
  if (target.by === 'flour') return { flour: String(target.grams) };
  const out: Record<string, string> = { pieces: String(target.pieces) };
  if (target.pieceGrams !== undefined && target.pieceGrams !== formula.yield.pieceGrams) out.piece = String(target.pieceGrams);
  return out;
}
