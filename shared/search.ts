// The formula search's matching rule, typo-tolerant: every word typed must be found in the
// formula's text (id, title, tags, ingredient names), as a part of a word or as a word (or the
// start of one) within a typo or two ("harbor" finds "harbour", "ciabata" finds "ciabatta"). Pure.
import { editDistance } from './check/suggest.ts';

/** Edits forgiven for a typed word: none under 4 letters, one up to 7, two from 8. */
function typosAllowed(word: string): number {
  return word.length < 4 ? 0 : word.length < 8 ? 1 : 2;
}

/** The typed text as lower-case words. */
export function searchWords(q: string | undefined): string[] {
  return (q ?? '').toLowerCase().split(/\s+/).filter(Boolean);
}

/** Does `text` (lower case) hold every one of `words`, allowing typos? */
export function matchesSearch(words: readonly string[], text: string): boolean {
  if (words.length === 0) return true;
  let textWords: string[] | undefined;
  return words.every((w) => {
    if (text.includes(w)) return true;
    const allowed = typosAllowed(w);
    if (allowed === 0) return false;
    textWords ??= [...new Set(text.split(/[^\p{L}\p{N}]+/u).filter(Boolean))];
    return textWords.some((t) => editDistance(w, t) <= allowed || (t.length > w.length && editDistance(w, t.slice(0, w.length)) <= allowed));
  });
}
