import type { Period } from '../../schemas/plans';

/**
 * Calendar arithmetic on local dates (YYYY-MM-DD). Tasks fall due on a date in the cellar's
 * time zone, so the engine never touches clock times: a daylight-saving change cannot move a
 * due date. Months clamp to the month's end (31 January + 1 month = 28 or 29 February).
 */

const DAY_MS = 86_400_000;

/** The digit at `i` of a YYYY-MM-DD date, read without cutting the string: this runs for every task of every batch. */
const digit = (date: string, i: number): number => date.charCodeAt(i) - 48;

const yearOf = (date: string): number => digit(date, 0) * 1000 + digit(date, 1) * 100 + digit(date, 2) * 10 + digit(date, 3);

/** Milliseconds since the epoch of a YYYY-MM-DD date at 00:00 UTC (Date.UTC carries the calendar). */
function toUtc(date: string): number {
  return Date.UTC(yearOf(date), digit(date, 5) * 10 + digit(date, 6) - 1, digit(date, 8) * 10 + digit(date, 9));
}

const twoDigits = (n: number): string => (n < 10 ? `0${n}` : `${n}`);

/** The YYYY-MM-DD date of a UTC moment (a four-digit year, as the dates are written). */
function fromUtc(ms: number): string {
  const at = new Date(ms);
  return `${String(at.getUTCFullYear()).padStart(4, '0')}-${twoDigits(at.getUTCMonth() + 1)}-${twoDigits(at.getUTCDate())}`;
}

export function addDays(date: string, days: number): string {
  return fromUtc(toUtc(date) + days * DAY_MS);
}

/** The same day `months` later, or the month's last day when it has no such day. */
export function addMonths(date: string, months: number): string {
  const monthIndex = digit(date, 5) * 10 + digit(date, 6) - 1 + months;
  const year = yearOf(date) + Math.floor(monthIndex / 12);
  const month = ((monthIndex % 12) + 12) % 12;
  const lastDay = new Date(Date.UTC(year, month + 1, 0)).getUTCDate();
  return fromUtc(Date.UTC(year, month, Math.min(digit(date, 8) * 10 + digit(date, 9), lastDay)));
}

/** `date` plus `times` periods, counted from `date` itself so month ends do not drift. */
export function addPeriod(date: string, period: Period, times = 1): string {
  const n = period.count * times;
  if (period.unit === 'months') return addMonths(date, n);
  return addDays(date, period.unit === 'weeks' ? n * 7 : n);
}

/** Whole days from `from` to `to` (negative when `to` is earlier). */
export function daysBetween(from: string, to: string): number {
  return Math.round((toUtc(to) - toUtc(from)) / DAY_MS);
}

export const maxDate = (a: string, b: string): string => (a > b ? a : b);
