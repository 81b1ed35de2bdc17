import type { Vessel } from '@shared/schemas/vessels';
import { numberOrNull } from './form-values';

/** One vessel to fill, as the form holds it: the volume in the user's unit. */
export interface FillRow {
  vesselId: string | null;
  volume: number | string | null;
}

/**
 * The rows as the API wants them (litres, with the vessel's version for the conflict check).
 * Empty rows are passed on as they are so the shared schema names what is missing.
 */
export function fillsForRequest(rows: FillRow[], candidates: Vessel[], toLitres: (value: number) => number) {
  return rows.map((row) => {
    const volume = numberOrNull(row.volume);
    const vessel = candidates.find((v) => v.id === row.vesselId);
    return {
      vesselId: row.vesselId ?? '',
      volumeL: volume === null ? (null as unknown as number) : toLitres(volume),
      ...(vessel ? { expectedVersion: vessel.version } : {}),
    };
  });
}

/** Litres planned across the rows (empty rows count as nothing). */
export function plannedLitres(rows: FillRow[], toLitres: (value: number) => number): number {
  return rows.reduce((sum, row) => sum + toLitres(numberOrNull(row.volume) ?? 0), 0);
}
