// Display helpers for the viewer, on top of shared/units (rounding only ever happens here).
import { formatGrams, formatPercent, formatTemperature } from '#shared/units';
import type { NumberRange } from '#shared/units';

export const grams = (g: number): string => formatGrams(g);
/** A piece weight as written: "70 g", "320 g", "62.5 g". */
export const pieceWeight = (g: number): string => (Number.isInteger(g) ? formatGrams(g).replace(/\.0 g$/, ' g') : formatGrams(g));
export const percent = (p: number, decimals = 1): string => formatPercent(p, decimals);
export const celsius = (c: number, decimals = 1): string => formatTemperature(c, 'C', decimals);

/** 28 500 g → "28.5 kg"; below a kilo stays in grams. */
export function weight(g: number): string {
  if (Math.abs(g) >= 10_000) return `${(g / 1000).toFixed(1)} kg`;
  if (Math.abs(g) >= 1_000) return `${(g / 1000).toFixed(2)} kg`;
  return formatGrams(g);
}

export function minutes(m: number): string {
  if (m < 60) return `${round1(m)} min`;
  const h = Math.floor(m / 60);
  const rest = Math.round(m - h * 60);
  return rest === 0 ? `${h} h` : `${h} h ${rest} min`;
}

export function minutesRange(r: NumberRange): string {
  return r.min === r.max ? minutes(r.min) : `${minutes(r.min)} – ${minutes(r.max)}`;
}

export function hoursRange(r: NumberRange): string {
  return r.min === r.max ? `${round1(r.min)} h` : `${round1(r.min)}–${round1(r.max)} h`;
}

function round1(x: number): string {
  return String(Number(x.toFixed(1)));
}

const WEEKDAYS = ['Sunday', 'Monday', 'Tuesday', 'Wednesday', 'Thursday', 'Friday', 'Saturday'];
const MONTHS = ['January', 'February', 'March', 'April', 'May', 'June', 'July', 'August', 'September', 'October', 'November', 'December'];

/** The weekday, day, month and year of a calendar day "YYYY-MM-DD" (a day, not an instant: no time zone). */
export function dayParts(isoDay: string): { weekday: string; day: number; month: string; year: number } | null {
  const [y, m, d] = isoDay.split('-').map(Number);
  if (!y || !m || !d) return null;
  const date = new Date(Date.UTC(y, m - 1, d));
  return { weekday: WEEKDAYS[date.getUTCDay()], day: d, month: MONTHS[m - 1], year: y };
}

/** "2026-12-03" → "Thursday 3 December 2026". */
export function longDate(isoDay: string): string {
  const p = dayParts(isoDay);
  return p ? `${p.weekday} ${p.day} ${p.month} ${p.year}` : isoDay;
}

/** An instant in this device's local time: "2 Dec 2026, 02:09". Built by hand: the first call to
 * the browser's date formatter costs tens of milliseconds, on the formula page's critical path. */
export function shortDateTime(iso: string): string {
  const date = new Date(iso);
  if (Number.isNaN(date.getTime())) return iso;
  const two = (n: number) => String(n).padStart(2, '0');
  return `${date.getDate()} ${MONTHS[date.getMonth()].slice(0, 3)} ${date.getFullYear()}, ${two(date.getHours())}:${two(date.getMinutes())}`;
}

export function money(amount: number, currency = '€'): string {
  return `${currency}\u202f${amount.toFixed(2)}`;
}
