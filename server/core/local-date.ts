/**
 * The calendar date (YYYY-MM-DD) of a moment in the cellar's time zone.
 * @param timeZone - an IANA zone such as Europe/Berlin
 */
export function localDate(at: Date, timeZone: string): string {
  const parts = new Intl.DateTimeFormat('en-GB', { timeZone, year: 'numeric', month: '2-digit', day: '2-digit' }).formatToParts(at);
  const part = (type: string) => parts.find((p) => p.type === type)?.value ?? '';
  return `${part('year')}-${part('month')}-${part('day')}`;
}

/**
 * A moment as the cellar's wall clock showed it, "YYYY-MM-DD HH:mm" (24-hour).
 * @param timeZone - an IANA zone such as Europe/Berlin
 */
export function localDateTime(at: Date, timeZone: string): string {
  const parts = new Intl.DateTimeFormat('en-GB', {
    timeZone,
    year: 'numeric',
    month: '2-digit',
    day: '2-digit',
    hour: '2-digit',
    minute: '2-digit',
    hourCycle: 'h23',
  }).formatToParts(at);
  const part = (type: string) => parts.find((p) => p.type === type)?.value ?? '';
  return `${localDate(at, timeZone)} ${part('hour')}:${part('minute')}`;
}
