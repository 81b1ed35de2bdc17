/**
 * Ages and milestones. Calendar arithmetic is done in UTC: pass ISO dates
 * (YYYY-MM-DD, read as UTC midnight) or instants; converting to the cellar's
 * own time zone is the caller's job.
 */
import { CalcInputError, requireDate, requireInteger } from './guards';

const DAY_MS = 86_400_000;

/** Milestones the cellar tracks by default, in months since the start. */
export const AGE_MILESTONE_MONTHS: readonly number[] = [3, 6, 12];

/**
 * Whole days from `a` to `b` (complete 24-hour periods; negative when `b` is earlier).
 * @param a - the earlier date (Date or ISO 8601 string)
 * @param b - the later date (Date or ISO 8601 string)
 */
export function daysBetween(a: Date | string, b: Date | string): number {
  const from = requireDate(a, 'a', 'Start date');
  const to = requireDate(b, 'b', 'End date');
  const days = (to.getTime() - from.getTime()) / DAY_MS;
  const whole = Math.floor(Math.abs(days));
  return days < 0 ? -whole : whole;
}

const CALENDAR_DATE = /^(\d{4})-(\d{2})-(\d{2})/;

/**
 * The one age rule of the cellar: whole calendar days from the day something started to
 * `today`, both local calendar dates (the start day itself is day 0, never negative). Every
 * screen counts a batch's or vessel's age with this, so the same start shows the same number.
 * @param startedOn - the local start date, YYYY-MM-DD (a longer ISO string is cut to its date)
 * @param today - the local date to count to, YYYY-MM-DD
 */
export function ageInDays(startedOn: string, today: string): number {
  const from = calendarDay(startedOn, 'startedOn', 'Start date');
  const to = calendarDay(today, 'today', 'Today');
  return Math.max(0, Math.round((to - from) / DAY_MS));
}

/** A YYYY-MM-DD date as the UTC midnight of that calendar day, in milliseconds. */
function calendarDay(value: unknown, field: string, label: string): number {
  const m = typeof value === 'string' ? CALENDAR_DATE.exec(value) : null;
  const ms = m ? Date.UTC(Number(m[1]), Number(m[2]) - 1, Number(m[3])) : NaN;
  if (!m || Number.isNaN(ms) || new Date(ms).getUTCDate() !== Number(m[3])) {
    throw new CalcInputError(field, `${label} must be a calendar date written YYYY-MM-DD (got ${JSON.stringify(value)}).`);
  }
  return ms;
}

/**
 * The same day-of-month `months` calendar months later, in UTC; a day that the
 * target month lacks falls back to its last day (31 Jan + 1 month = 28/29 Feb).
 * @param date - the starting date (Date or ISO 8601 string)
 * @param months - whole months to add (zero or more)
 */
export function addMonths(date: Date | string, months: number): Date {
  const d = requireDate(date, 'date', 'Date');
  return monthsLater(d, requireInteger(months, 'months', 'Months', 0, 12_000), 'months');
}

/** The months-later date; `field` is blamed when it falls past the last date a Date can hold. */
function monthsLater(d: Date, m: number, field: string): Date {
  const y = d.getUTCFullYear();
  const targetMonth = d.getUTCMonth() + m;
  const lastDay = new Date(Date.UTC(y, targetMonth + 1, 0)).getUTCDate();
  const out = new Date(d.getTime());
  out.setUTCFullYear(y, targetMonth, Math.min(d.getUTCDate(), lastDay));
  if (Number.isNaN(out.getTime())) {
    throw new CalcInputError(field, `${m} months after ${d.toISOString().split('T')[0]} is past the last date that can be kept (year 275760).`);
  }
  return out;
}

/** One age milestone. */
export interface AgeMilestone {
  /** Months after the start. */
  months: number;
  /** When it falls. */
  date: Date;
  /** Whether `now` is on or after it. */
  reached: boolean;
}

/**
 * Which ageing milestones (3, 6 and 12 months by default) a batch or bottling has reached.
 * @param start - when the ageing started (Date or ISO 8601 string)
 * @param now - the moment to judge at
 * @param months - milestones to check, in whole months
 */
export function ageMilestones(start: Date | string, now: Date | string, months: readonly number[] = AGE_MILESTONE_MONTHS): AgeMilestone[] {
  const s = requireDate(start, 'start', 'Start date');
  const n = requireDate(now, 'now', 'Date of judgement');
  if (!Array.isArray(months)) throw new CalcInputError('months', 'Milestones must be a list of month counts.');
  return months.map((m, i) => {
    const whole = requireInteger(m, `months[${i}]`, `Milestone ${i + 1}`, 1, 1200);
    const date = monthsLater(s, whole, `months[${i}]`);
    return { months: whole, date, reached: n.getTime() >= date.getTime() };
  });
}
