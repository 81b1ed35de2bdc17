/**
 * The calendar date (YYYY-MM-DD) of a moment in the cellar's time zone.
 * @param timeZone - an IANA zone such as Europe/Berlin
 */
export function localDate(at: Date, timeZone: string): string {
  return isoInZone(at, timeZone)!.slice(0, 10);
}

/**
 * A moment as ISO 8601 with the offset of the cellar's time zone at that moment,
 * e.g. 2026-03-01T14:05:00+01:00 (seconds kept, milliseconds dropped).
 * @param timeZone - an IANA zone such as Europe/Berlin
 */
export function isoInZone(at: Date | string | null, timeZone: string): string | null {
  if (at === null) return null;
  const moment = typeof at === 'string' ? new Date(at) : at;
  const parts = new Intl.DateTimeFormat('en-GB', {
    timeZone,
    hourCycle: 'h23',
    year: 'numeric',
    month: '2-digit',
    day: '2-digit',
    hour: '2-digit',
    minute: '2-digit',
    second: '2-digit',
    timeZoneName: 'longOffset',
  }).formatToParts(moment);
  const part = (type: string) => parts.find((p) => p.type === type)?.value ?? '';
  // "GMT+01:00", or plain "GMT" at offset zero.
  const offset = part('timeZoneName').replace('GMT', '') || '+00:00';
  return `${part('year')}-${part('month')}-${part('day')}T${part('hour')}:${part('minute')}:${part('second')}${offset}`;
}

/**
 * A moment as the cellar's wall clock showed it, "YYYY-MM-DD HH:mm" (24-hour).
 * @param timeZone - an IANA zone such as Europe/Berlin
 */
export function localDateTime(at: Date, timeZone: string): string {
  return isoInZone(at, timeZone)!.slice(0, 16).replace('T', ' ');
}
