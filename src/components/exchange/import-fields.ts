import type { ImportTarget } from '@shared/schemas/exchange';

/** The words the mapping screen uses for each field an import fills. */
export const FIELD_LABELS: Record<string, string> = {
  at: 'Date and time',
  sg: 'Gravity',
  temperature: 'Sample temperature',
  ph: 'pH',
  name: 'Name',
  capacity: 'Capacity',
  kind: 'Kind (carboy, jug…)',
  material: 'Material',
  state: 'State (dirty, clean, sanitised)',
  notes: 'Notes',
};

export const TARGET_TITLES: Record<ImportTarget, string> = { readings: 'Import readings', vessels: 'Import vessels' };

export const DELIMITER_OPTIONS = [
  { value: ',', label: 'Comma ,' },
  { value: ';', label: 'Semicolon ;' },
  { value: '\t', label: 'Tab' },
  { value: '|', label: 'Bar |' },
];
export const DATE_OPTIONS = [
  { value: 'iso', label: '2026-03-01 (ISO)' },
  { value: 'dmy', label: '01/03/2026 (day first)' },
  { value: 'mdy', label: '03/01/2026 (month first)' },
];
export const GRAVITY_OPTIONS = [
  { value: 'sg', label: 'Specific gravity (1.050)' },
  { value: 'plato', label: '°Plato' },
  { value: 'brix', label: '°Brix' },
];
export const TEMPERATURE_OPTIONS = [
  { value: 'C', label: '°C' },
  { value: 'F', label: '°F' },
];
export const VOLUME_OPTIONS = [
  { value: 'L', label: 'Litres' },
  { value: 'US gal', label: 'US gallons' },
  { value: 'imp gal', label: 'Imperial gallons' },
];
