import type { Period } from '../../schemas/plans';

/**
 * Calendar arithmetic on local dates (YYYY-MM-DD). Tasks fall due on a date in the cellar's
 * time zone, so the engine never touches clock times: a daylight-saving change cannot move a
 * due date. Months clamp to the month's end (31 January + 1 month = 28 or 29 February).
 */

const DAY_MS = 86_400_000;

function toUtc(date: string): number {
  const [y, m, d] = date.split('-').map(Number);
  return Date.UTC(y!, m! - 1, d!);
}

function fromUtc(ms: number): string {
  return new Date(ms).toISOString().slice(0, 10);
}

export function addDays(date: string, days: number): string {
  return fromUtc(toUtc(date) + days * DAY_MS);
}

/** The same day `months` later, or the month's last day when it has no such day. */
export function addMonths(date: string, months: number): string {
  const [y, m, d] = date.split('-').map(Number);
  const monthIndex = m! - 1 + months;
  const year = y! + Math.floor(monthIndex / 12);
  const month = ((monthIndex % 12) + 12) % 12;
  const lastDay = new Date(Date.UTC(year, month + 1, 0)).getUTCDate();
  return fromUtc(Date.UTC(year, month, Math.min(d!, lastDay)));
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

export const minDate = (a: string, b: string): string => (a < b ? a : b);
