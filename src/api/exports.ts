import type { ExportTable } from '@shared/schemas/exchange';
import { cellarPath, withQuery } from './http';

/** How a CSV file is written: the units the person works in, and a byte-order mark for spreadsheets. */
export interface ExportFormatChoice {
  units: 'metric' | 'us';
  bom: boolean;
}

/**
 * The address of a CSV download of one table, with the list's filter (paging left out: the
 * file holds every row the filter keeps). A plain link: the browser streams it to a file.
 */
export function exportUrl(cellarId: string, table: ExportTable, filter: object, format: ExportFormatChoice): string {
  const { page: _page, pageSize: _pageSize, ...rest } = filter as Record<string, unknown>;
  return withQuery(cellarPath(cellarId, 'exports', table), { ...rest, units: format.units, bom: format.bom ? 'true' : undefined });
}
