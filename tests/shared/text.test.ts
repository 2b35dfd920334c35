import { describe, expect, it } from 'vitest';
import { compareText, textRanks } from '#shared/text';

// Expected orders follow the Unicode Collation Algorithm (UTS #10) with the root (DUCET) order,
// which English uses: accents and case are secondary and tertiary differences.
describe('compareText', () => {
  it('orders accented letters with their base letter, not after "z"', () => {
    expect(['zucchini', 'água', 'apple', 'épeautre', 'fine salt', 'emmer'].sort(compareText)).toEqual(['água', 'apple', 'emmer', 'épeautre', 'fine salt', 'zucchini']);
  });
  it('orders without regard to case first, then puts capitals first', () => {
    expect(['bread flour', 'Apple', 'apple', 'Bread flour'].sort(compareText)).toEqual(['Apple', 'apple', 'Bread flour', 'bread flour']);
  });
  it('is equal only for equal strings', () => {
    expect(compareText('salt', 'salt')).toBe(0);
    expect(compareText('salt', 'Salt')).toBe(1);
    expect(compareText('Salt', 'salt')).toBe(-1);
    expect(compareText('sel', 'sél')).toBe(-1);
  });
});

describe('textRanks', () => {
  it('numbers each text by its place in compareText order, so a sort by rank is the same sort', () => {
    const texts = ['zucchini', 'água', 'apple', 'Apple', 'épeautre', 'apple', 'emmer', 'Bread flour', 'bread flour'];
    const ranks = textRanks(texts);
    expect([...texts].sort((a, b) => ranks.get(a)! - ranks.get(b)!)).toEqual([...texts].sort(compareText));
    expect(ranks.size).toBe(8);
  });
});
