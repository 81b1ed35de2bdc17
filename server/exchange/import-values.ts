import type { DateFormat } from '../../shared/schemas/exchange';

/**
 * Reading one cell of an imported file: numbers (with a decimal point or comma) and moments
 * in the formats a spreadsheet writes. Each returns null for a cell it cannot read, so the
 * caller reports it by row and column.
 */

const NUMBER = /^[-+]?(\d+(\.\d*)?|\.\d+)$/;

/** A plain decimal number: no thousands separators, no units. */
export function readNumber(cell: string, decimalComma: boolean): number | null {
  const text = cell.trim();
  const normal = decimalComma ? text.replace(',', '.') : text;
  if (!NUMBER.test(normal)) return null;
  const value = Number(normal);
  return Number.isFinite(value) ? value : null;
}

interface WallClock {
  year: number;
  month: number;
  day: number;
  hour: number;
  minute: number;
  second: number;
  /** Minutes east of UTC when the cell says (Z, +02:00); null: the cellar's time zone. */
  offsetMinutes: number | null;
  dateOnly: boolean;
}

const TIME = String.raw`(?:[T ](\d{1,2}):(\d{2})(?::(\d{2})(?:\.\d+)?)?)?\s*(Z|[+-]\d{2}:?\d{2})?`;
const ISO = new RegExp(String.raw`^(\d{4})-(\d{2})-(\d{2})${TIME}$`);
const DAY_FIRST_OR_MONTH_FIRST = new RegExp(String.raw`^(\d{1,2})[./-](\d{1,2})[./-](\d{4})${TIME}$`);

function clockFrom(year: string, month: string, day: string, m: RegExpMatchArray, from: number): WallClock | null {
  const [hour, minute, second, zone] = [m[from], m[from + 1], m[from + 2], m[from + 3]];
  const clock: WallClock = {
    year: Number(year),
    month: Number(month),
    day: Number(day),
    hour: hour ? Number(hour) : 12,
    minute: minute ? Number(minute) : 0,
    second: second ? Number(second) : 0,
    offsetMinutes: zone ? offsetOf(zone) : null,
    dateOnly: !hour,
  };
  return validClock(clock) ? clock : null;
}

function offsetOf(zone: string): number {
  if (zone === 'Z') return 0;
  const sign = zone.startsWith('-') ? -1 : 1;
  const digits = zone.slice(1).replace(':', '');
  return sign * (Number(digits.slice(0, 2)) * 60 + Number(digits.slice(2)));
}

function validClock(c: WallClock): boolean {
  if (c.month < 1 || c.month > 12 || c.day < 1 || c.hour > 23 || c.minute > 59 || c.second > 59) return false;
  const probe = new Date(Date.UTC(c.year, c.month - 1, c.day));
  return probe.getUTCDate() === c.day && probe.getUTCMonth() === c.month - 1;
}

function wallClock(cell: string, format: DateFormat): WallClock | null {
  const text = cell.trim();
  if (format === 'iso') {
    const m = text.match(ISO);
    return m ? clockFrom(m[1], m[2], m[3], m, 4) : null;
  }
  const m = text.match(DAY_FIRST_OR_MONTH_FIRST);
  if (!m) return null;
  return format === 'dmy' ? clockFrom(m[3], m[2], m[1], m, 4) : clockFrom(m[3], m[1], m[2], m, 4);
}

/** Minutes the zone is ahead of UTC at `utcMs`. */
function zoneOffsetMinutes(utcMs: number, timeZone: string): number {
  const name = new Intl.DateTimeFormat('en-GB', { timeZone, timeZoneName: 'longOffset' })
    .formatToParts(new Date(utcMs))
    .find((p) => p.type === 'timeZoneName')!.value;
  return name === 'GMT' ? 0 : offsetOf(name.replace('GMT', ''));
}

/**
 * The moment a cell names. Without an offset it is the cellar's local time; a date alone is
 * taken as noon there (a reading logged by day, kept on its day in every time zone).
 */
export function readMoment(cell: string, format: DateFormat, timeZone: string): Date | null {
  const c = wallClock(cell, format);
  if (!c) return null;
  const asUtc = Date.UTC(c.year, c.month - 1, c.day, c.hour, c.minute, c.second);
  if (c.offsetMinutes !== null) return new Date(asUtc - c.offsetMinutes * 60_000);
  // Local wall time → UTC: the zone's offset near that moment, checked once more across a change.
  const first = asUtc - zoneOffsetMinutes(asUtc, timeZone) * 60_000;
  return new Date(asUtc - zoneOffsetMinutes(first, timeZone) * 60_000);
}

/** Formats each sample could be read in. */
export function formatsOf(cell: string): DateFormat[] {
  return (['iso', 'dmy', 'mdy'] as const).filter((f) => wallClock(cell, f) !== null);
}

/**
 * The date format that reads the most samples, and notes when the file mixes two formats or
 * every date reads both day-first and month-first (the person must choose).
 */
export function detectDateFormat(samples: string[]): { format: DateFormat | null; notes: string[] } {
  const readable = samples.filter((s) => s.trim());
  if (!readable.length) return { format: null, notes: [] };
  const counts = { iso: 0, dmy: 0, mdy: 0 };
  for (const s of readable) for (const f of formatsOf(s)) counts[f]++;
  const best = (Object.keys(counts) as DateFormat[]).sort((a, b) => counts[b] - counts[a])[0];
  const notes: string[] = [];
  if (counts[best] === 0) return { format: null, notes: ['No date in the first rows could be read; check the date column.'] };
  if (counts[best] < readable.length)
    notes.push('The dates are written in more than one way; rows that do not match the chosen format will be listed.');
  if (best !== 'iso' && counts.dmy === counts.mdy) {
    notes.push('Every date reads both day-first and month-first (like 03/04/2026): choose which it is.');
    return { format: 'dmy', notes };
  }
  return { format: best, notes };
}
