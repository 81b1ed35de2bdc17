import type { ExportTable } from '@shared/schemas/exchange';

/** The CSV files each page offers, in the words the menu shows. */
export interface ExportChoice {
  table: ExportTable;
  label: string;
}

export const BATCH_EXPORTS: ExportChoice[] = [{ table: 'batches', label: 'Batches' }];
export const VESSEL_EXPORTS: ExportChoice[] = [{ table: 'vessels', label: 'Vessels' }];
export const BOTTLE_EXPORTS: ExportChoice[] = [
  { table: 'lots', label: 'Bottle lots' },
  { table: 'cases', label: 'Cases' },
];

/** Settings offers the whole record, one file per table. */
export const ALL_EXPORTS: ExportChoice[] = [
  { table: 'batches', label: 'Batches' },
  { table: 'journal', label: 'Journal entries (one row each)' },
  { table: 'readings', label: 'Readings (corrections applied)' },
  { table: 'vessels', label: 'Vessels' },
  { table: 'lots', label: 'Bottle lots' },
  { table: 'cases', label: 'Cases' },
  { table: 'departures', label: 'Bottles that left' },
];
