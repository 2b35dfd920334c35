import { describe, expect, it } from 'vitest';
import { hoursRange, longDate, minutes, minutesRange, pieceWeight, shortDateTime, weight } from '../../../src/lib/format.ts';

describe('weight', () => {
  it.each([
    [850, '850 g'],
    [56.34, '56.3 g'], // below 100 g: 0.1 g steps (docs/arithmetic.md)
    [3265.3, '3.27 kg'],
    [19592.4, '19.6 kg'],
  ])('shows %d g as %s', (g, text) => {
    expect(weight(g)).toBe(text);
  });
});

describe('pieceWeight', () => {
  it.each([
    [70, '70 g'],
    [320, '320 g'],
    [62.5, '62.5 g'],
    [1000, '1\u202f000 g'],
  ])('shows a piece of %d g as written: %s', (g, text) => {
    expect(pieceWeight(g)).toBe(text);
  });
});

describe('minutes and ranges', () => {
  it.each([
    [45, '45 min'],
    [90, '1 h 30 min'],
    [120, '2 h'],
  ])('%d minutes read as %s', (m, text) => {
    expect(minutes(m)).toBe(text);
  });

  it('writes a range of minutes and of hours', () => {
    expect(minutesRange({ min: 90, max: 90 })).toBe('1 h 30 min');
    expect(minutesRange({ min: 30, max: 45 })).toBe('30 min – 45 min');
    expect(hoursRange({ min: 12, max: 16 })).toBe('12–16 h');
  });
});

describe('longDate', () => {
  it('names the calendar day without shifting it by the time zone', () => {
    expect(longDate('2026-12-03')).toBe('Thursday 3 December 2026');
  });
});

describe('shortDateTime', () => {
  it('writes an instant in local time, day first', () => {
    const local = new Date(2026, 11, 2, 4, 7);
    expect(shortDateTime(local.toISOString())).toBe('2 Dec 2026, 04:07');
  });

  it('leaves text that is no date as it is', () => {
    expect(shortDateTime('yesterday')).toBe('yesterday');
  });
});
