// The bake days in the order a baker looks for them: today first, then the days to come (soonest
// first), then the days gone by (latest first). Today is this device's calendar day, passed in.
import type { PlanSummary } from '#shared/api';

export type When = 'today' | 'upcoming' | 'past';

export function whenOf(date: string, today: string): When {
  return date === today ? 'today' : date > today ? 'upcoming' : 'past';
}

export function orderBakeDays<T extends Pick<PlanSummary, 'date'>>(plans: T[], today: string): T[] {
  const ahead = plans.filter((p) => p.date >= today).sort((a, b) => a.date.localeCompare(b.date));
  const past = plans.filter((p) => p.date < today).sort((a, b) => b.date.localeCompare(a.date));
  return [...ahead, ...past];
}

/** A device clock reading as the calendar day and the minutes of that day, in its own time zone. */
export function localDay(d: Date): { day: string; minute: number } {
  const two = (n: number) => String(n).padStart(2, '0');
  return { day: `${d.getFullYear()}-${two(d.getMonth() + 1)}-${two(d.getDate())}`, minute: d.getHours() * 60 + d.getMinutes() };
}

/** Minutes from a plan date's midnight to the clock reading (negative: the days before). */
export function minuteOnPlan(planDate: string, d: Date): number {
  const { day, minute } = localDay(d);
  const days = Math.round((Date.UTC(+day.slice(0, 4), +day.slice(5, 7) - 1, +day.slice(8, 10)) - Date.UTC(+planDate.slice(0, 4), +planDate.slice(5, 7) - 1, +planDate.slice(8, 10))) / 86_400_000);
  return days * 1440 + minute;
}
