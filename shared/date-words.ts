/**
 * A calendar date in words, "14 Mar 2026": the app's default date style, and the one that
 * needs no setting to read (a label on a jug, a mail), since it cannot be taken for another
 * day the way 03/04 can.
 */
export const MONTH_ABBREVIATIONS = ['Jan', 'Feb', 'Mar', 'Apr', 'May', 'Jun', 'Jul', 'Aug', 'Sep', 'Oct', 'Nov', 'Dec'] as const;

/** "2026-03-14" → "14 Mar 2026" (a calendar date: no time zone involved); anything else as given. */
export function dayMonthYear(iso: string): string {
  const [y, m, d] = iso.slice(0, 10).split('-').map(Number);
  return y && m && d && m <= 12 ? `${d} ${MONTH_ABBREVIATIONS[m - 1]} ${y}` : iso;
}
