// Local clock arithmetic for the sheet: minutes from the plan date's midnight ↔ "YYYY-MM-DDTHH:MM".
// The plan's times are local wall-clock times with no zone; they are computed on a UTC calendar so
// that no time zone (and no daylight-saving jump) of the machine running Panform can shift them.
import type { LocalDateTime } from './types.ts';

const MS_PER_MINUTE = 60_000;

function midnightUtc(date: string): number {
  const [y, m, d] = date.split('-').map(Number);
  return Date.UTC(y, m - 1, d);
}

const MINUTES_PER_DAY = 1440;
const two = (n: number) => (n < 10 ? `0${n}` : String(n));

const shifted = new Map<string, string>();

/** "2026-12-03" shifted by whole days ("2026-12-02" for -1), on the UTC calendar. */
export function shiftDate(date: string, days: number): string {
  if (days === 0) return date;
  const key = `${date}${days}`;
  let day = shifted.get(key);
  if (day === undefined) {
    day = new Date(midnightUtc(date) + days * MINUTES_PER_DAY * MS_PER_MINUTE).toISOString().slice(0, 10);
    if (shifted.size > 1000) shifted.clear();
    shifted.set(key, day);
  }
  return day;
}

/** "2026-12-03", 250 → "2026-12-03T04:10"; -120 → "2026-12-02T22:00". Minutes are rounded to whole minutes. */
export function localDateTime(date: string, minute: number): LocalDateTime {
  // Plain arithmetic on the same day (a sheet asks this hundreds of times); the calendar only
  // for another day.
  const total = Math.round(minute);
  const days = Math.floor(total / MINUTES_PER_DAY);
  const m = total - days * MINUTES_PER_DAY;
  return `${shiftDate(date, days)}T${two(Math.floor(m / 60))}:${two(m % 60)}`;
}

const WRITTEN = /^(\d{4})-(\d{2})-(\d{2})[T ]([01]\d|2[0-3]):([0-5]\d)$/;

/**
 * A date and time as a person writes it, "2026-12-02 18:00" (or with a T), → "2026-12-02T18:00";
 * null when it is not one (a day that is not on the calendar, an hour past 23). The one reader of
 * typed window times: `panform sheet --from/--to`, `panform shift`, and the server's sheet routes.
 */
export function parseLocalDateTime(text: string): LocalDateTime | null {
  const m = WRITTEN.exec(text.trim());
  if (!m) return null;
  const date = `${m[1]}-${m[2]}-${m[3]}`;
  // A day past the month's end (2026-02-30) comes back from the calendar as another day.
  if (new Date(midnightUtc(date)).toISOString().slice(0, 10) !== date) return null;
  return `${date}T${m[4]}:${m[5]}`;
}

/** "2026-12-03T04:10" → minutes from midnight of `date` (negative the day before). */
export function minuteOf(t: LocalDateTime, date: string): number {
  const clock = clockMinutes(t.slice(11, 16));
  const day = t.slice(0, 10);
  if (day === date) return clock;
  return Math.round((midnightUtc(day) - midnightUtc(date)) / MS_PER_MINUTE) + clock;
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
  return `${dayMonth(t.slice(0, 10))} ${clockOf(t)}`;
}

const MONTHS = ['Jan', 'Feb', 'Mar', 'Apr', 'May', 'Jun', 'Jul', 'Aug', 'Sep', 'Oct', 'Nov', 'Dec'];

/** "3 Dec" for a yyyy-mm-dd day: the one way the sheet, the chart and the records name a day. */
export function dayMonth(date: string): string {
  const [, m, d] = date.split('-').map(Number);
  return `${d} ${MONTHS[m - 1]}`;
}
