import fc from 'fast-check';
import { describe, expect, it } from 'vitest';
import { localDateTime, minuteOf } from '#shared/sheet/time';

// The sheet's clock arithmetic against the calendar itself (Date on UTC, where no time zone or
// daylight-saving change can move a wall-clock time).
const reference = (date: string, minute: number) => new Date(Date.parse(`${date}T00:00:00Z`) + Math.round(minute) * 60_000).toISOString().slice(0, 16);
const dates = fc.constantFrom('2026-12-03', '2026-01-01', '2024-02-29', '2026-03-29', '2026-10-25', '2026-12-31');

describe('sheet clock', () => {
  it('localDateTime agrees with the calendar, across midnights, months and leap days', () => {
    fc.assert(
      fc.property(dates, fc.double({ min: -5 * 1440, max: 5 * 1440, noNaN: true }), (date, minute) => {
        expect(localDateTime(date, minute)).toBe(reference(date, minute));
      }),
      { numRuns: 2000, seed: 20261202 },
    );
  });
  it('minuteOf undoes localDateTime', () => {
    fc.assert(
      fc.property(dates, fc.integer({ min: -5 * 1440, max: 5 * 1440 }), (date, minute) => {
        expect(minuteOf(localDateTime(date, minute), date)).toBe(minute);
      }),
      { numRuns: 2000, seed: 20261203 },
    );
  });
  it.each([
    ['2026-12-03', 250, '2026-12-03T04:10'],
    ['2026-12-03', -120, '2026-12-02T22:00'],
    ['2026-12-31', 1440 + 30, '2027-01-01T00:30'],
    ['2024-03-01', -1, '2024-02-29T23:59'],
  ])('%s + %i min is %s', (date, minute, text) => {
    expect(localDateTime(date, minute)).toBe(text);
  });
});
