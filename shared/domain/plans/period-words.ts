import type { Period } from '../../schemas/plans';

/** A unit for one of it: "weeks" → "week". */
const singular = (unit: Period['unit']) => unit.replace(/s$/, '');

/**
 * A plan's period in words, one of a unit in the singular: "1 week", "30 days", "0 days".
 * @param period - a count of days, weeks or months
 */
export function periodWords(period: Period): string {
  return `${period.count} ${period.count === 1 ? singular(period.unit) : period.unit}`;
}

/**
 * A repeat in words: "every week", "every 3 months".
 * @param period - how often
 */
export function everyWords(period: Period): string {
  return period.count === 1 ? `every ${singular(period.unit)}` : `every ${periodWords(period)}`;
}

/**
 * A span of days in words: "1 day", "5 days".
 * @param days - a whole number of days
 */
export function daysWords(days: number): string {
  return periodWords({ count: days, unit: 'days' });
}
