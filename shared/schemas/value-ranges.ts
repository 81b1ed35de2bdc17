/** Dates the cellar's record can hold: nothing before 1900 or after 2200 is a real cellar date. */
export const EARLIEST_YEAR = 1900;
export const LATEST_YEAR = 2200;
export const DATE_RANGE_MESSAGE = `a date between ${EARLIEST_YEAR} and ${LATEST_YEAR}`;

/** True when an ISO date or date-time string's year lies in the range the record holds. */
export function yearInRange(iso: string): boolean {
  const year = Number(iso.slice(0, 4));
  return Number.isInteger(year) && year >= EARLIEST_YEAR && year <= LATEST_YEAR;
}

/**
 * Smallest volume the record keeps: volume columns hold litres to 3 decimals, so anything
 * below 0.001 L would be stored as 0.
 */
export const MIN_LITRES = 0.001;
export const MIN_LITRES_MESSAGE = 'at least 0.001 L';

/** True when a stored YYYY-MM-DD is a real calendar day the record can hold (a guard for values stored before the checks). */
export function isReadableDate(iso: string): boolean {
  if (!/^\d{4}-\d{2}-\d{2}$/.test(iso) || !yearInRange(iso)) return false;
  const day = new Date(`${iso}T00:00:00Z`);
  return !Number.isNaN(day.getTime()) && day.toISOString().slice(0, 10) === iso;
}
