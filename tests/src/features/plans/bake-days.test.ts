// The bake-day list's order (today first, the days to come, then the days gone by) and the
// device clock read on a plan's clock.
import { describe, expect, it } from 'vitest';
import { localDay, minuteOnPlan, orderBakeDays, whenOf } from '../../../../src/features/plans/lib/bake-days.ts';

describe('bake days', () => {
  it('puts today first, then the days to come soonest first, then the past latest first', () => {
    const days = ['2026-12-01', '2026-12-05', '2026-12-03', '2026-11-20', '2026-12-04'].map((date) => ({ date }));
    expect(orderBakeDays(days, '2026-12-03').map((d) => d.date)).toEqual(['2026-12-03', '2026-12-04', '2026-12-05', '2026-12-01', '2026-11-20']);
    expect(whenOf('2026-12-03', '2026-12-03')).toBe('today');
    expect(whenOf('2026-12-04', '2026-12-03')).toBe('upcoming');
    expect(whenOf('2026-12-02', '2026-12-03')).toBe('past');
  });

  it('reads the clock as minutes from the plan date\'s midnight, the evening before negative', () => {
    const evening = new Date(2026, 11, 2, 22, 30);
    expect(localDay(evening)).toEqual({ day: '2026-12-02', minute: 1350 });
    expect(minuteOnPlan('2026-12-03', evening)).toBe(-90);
    expect(minuteOnPlan('2026-12-03', new Date(2026, 11, 3, 4, 10))).toBe(250);
  });
});
