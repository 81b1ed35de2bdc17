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
