// The batch a formula is scaled to, kept in the URL so a scaled formula can be bookmarked,
// shared and printed: ?pieces=60&piece=320 (grams) or ?mix=28500 (grams of mixed dough).
import type { Formula } from '#shared/model';
import type { ScaleTarget } from '#shared/scale';

export function targetFromSearch(params: URLSearchParams, formula: Formula): ScaleTarget {
  const mix = positive(params.get('mix'));
  if (mix !== null) return { by: 'mix', grams: mix };
  const pieces = positive(params.get('pieces'));
  const piece = positive(params.get('piece'));
  if (pieces !== null || piece !== null) {
    return { by: 'pieces', pieces: pieces ?? formula.yield.pieces, pieceGrams: piece ?? formula.yield.pieceGrams };
  }
  return writtenBatch(formula);
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

function positive(text: string | null): number | null {
  if (text === null || text.trim() === '') return null;
  const n = Number(text);
  return Number.isFinite(n) && n > 0 ? n : null;
}
