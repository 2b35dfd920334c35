import { describe, expect, it } from 'vitest';
import { compareCodeUnits, compareText, textRanks } from '#shared/text';

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

describe('compareCodeUnits', () => {
  it('sorts local date-times by time, across a day and a month', () => {
    const times = ['2026-12-03T04:10', '2026-11-30T23:50', '2026-12-02T22:00', '2026-12-03T00:05'];
    expect([...times].sort(compareCodeUnits)).toEqual(['2026-11-30T23:50', '2026-12-02T22:00', '2026-12-03T00:05', '2026-12-03T04:10']);
    expect(compareCodeUnits('2026-12-03T04:10', '2026-12-03T04:10')).toBe(0);
  });
});
