import { fahrenheitFrom, LITRES_PER_US_GALLON } from '../../shared/calc/units';

/** A value as it goes into one CSV cell. */
export type Cell = string | number | boolean | null | undefined;

/** Units a file is written in: the ones the person works in on the page they export from. */
export type UnitSystem = 'metric' | 'us';

/**
 * A text cell made safe to open in a spreadsheet: one beginning with `=`, `+`, `-` or `@` (or a
 * tab or carriage return, which some spreadsheets skip before reading a formula) gets a leading
 * apostrophe, so it is shown as text and never run as a formula. Numbers we write ourselves are
 * left as numbers: a negative temperature stays a number.
 */
export function neutraliseCell(value: Cell): string | number | boolean | null {
  if (value === undefined || value === null) return null;
  if (typeof value !== 'string') return value;
  return /^[=+\-@\t\r]/.test(value) ? `'${value}` : value;
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

/** How volumes and temperatures are written, and what a header says about them. */
export interface UnitWriter {
  volumeHeader: string;
  temperatureHeader: string;
  volume: (litres: number | null) => number | null;
  temperature: (celsius: number | null) => number | null;
}

const round = (value: number, places: number) => Math.round(value * 10 ** places) / 10 ** places;

export function unitWriter(system: UnitSystem): UnitWriter {
  if (system === 'us') {
    return {
      volumeHeader: 'US gal',
      temperatureHeader: '°F',
      volume: (l) => (l === null ? null : round(l / LITRES_PER_US_GALLON, 3)),
      temperature: (c) => (c === null ? null : round(fahrenheitFrom(c), 1)),
    };
  }
  return {
    volumeHeader: 'L',
    temperatureHeader: '°C',
    volume: (l) => (l === null ? null : round(l, 3)),
    temperature: (c) => (c === null ? null : round(c, 1)),
  };
}
