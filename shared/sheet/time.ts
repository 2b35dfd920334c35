// Local clock arithmetic for the sheet: minutes from the plan date's midnight ↔ "YYYY-MM-DDTHH:MM".
// The plan's times are local wall-clock times with no zone; they are computed on a UTC calendar so
// that no time zone (and no daylight-saving jump) of the machine running Panform can shift them.
import type { LocalDateTime } from './types.ts';

const MS_PER_MINUTE = 60_000;

function midnightUtc(date: string): number {
  const [y, m, d] = date.split('-').map(Number);
  return Date.UTC(y, m - 1, d);
}

/** "2026-12-03", 250 → "2026-12-03T04:10"; -120 → "2026-12-02T22:00". Minutes are rounded to whole minutes. */
export function localDateTime(date: string, minute: number): LocalDateTime {
  return new Date(midnightUtc(date) + Math.round(minute) * MS_PER_MINUTE).toISOString().slice(0, 16);
}

/** "2026-12-03T04:10" → minutes from midnight of `date` (negative the day before). */
export function minuteOf(t: LocalDateTime, date: string): number {
  return Math.round((Date.parse(`${t}:00Z`) - midnightUtc(date)) / MS_PER_MINUTE);
}

/** "06:00" → 360. */
export function clockMinutes(clock: string): number {
  const [h, m] = clock.split(':').map(Number);
  return h * 60 + m;
}

/** "2026-12-03T04:10" → "04:10". */
export function clockOf(t: LocalDateTime): string {
  return t.slice(11, 16);
}

/** "04:10", or "Wed 22:00"-style with the day when it is not the plan's date: "2 Dec 22:00". */
export function shortTime(t: LocalDateTime, planDate: string): string {
  if (t.slice(0, 10) === planDate) return clockOf(t);
  const [, m, d] = t.slice(0, 10).split('-').map(Number);
  return `${d} ${MONTHS[m - 1]} ${clockOf(t)}`;
}

const MONTHS = ['Jan', 'Feb', 'Mar', 'Apr', 'May', 'Jun', 'Jul', 'Aug', 'Sep', 'Oct', 'Nov', 'Dec'];
