import dayjs from 'dayjs';
import { addMonths, ageInDays } from '@shared/calc';

/** Whole calendar months from `start` to `now` (shared/calc addMonths, UTC). */
function wholeMonths(start: string | Date, now: Date): number {
  let months = 0;
  while (months < 1200 && addMonths(start, months + 1).getTime() <= now.getTime()) months++;
  return months;
}

/**
 * Time in bottle as people say it: "12 days", or "7 months (214 days)".
 * @param bottledOn - ISO date of the bottling
 */
export function ageInBottle(bottledOn: string, now: Date = new Date()): string {
  const days = ageInDays(bottledOn, dayjs(now).format('YYYY-MM-DD'));
  const dayText = `${days} ${days === 1 ? 'day' : 'days'}`;
  const months = days < 28 ? 0 : wholeMonths(bottledOn, now);
  return months === 0 ? dayText : `${months} ${months === 1 ? 'month' : 'months'} (${dayText})`;
}
