import { describe, expect, it } from 'vitest';
import { compareText } from '#shared/text';

describe('compareText', () => {
  it('orders without regard to case first, then puts capitals first', () => {
    expect(['bread flour', 'Apple', 'apple', 'Bread flour', 'água'].sort(compareText)).toEqual(['Apple', 'apple', 'Bread flour', 'bread flour', 'água']);
  });
  it('is a total order: equal only for equal strings', () => {
    expect(compareText('salt', 'salt')).toBe(0);
    expect(compareText('salt', 'Salt')).toBe(1);
    expect(compareText('Salt', 'salt')).toBe(-1);
  });
});
