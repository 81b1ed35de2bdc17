import { headspace } from '@shared/calc';
import type { Vessel } from '@shared/schemas/vessels';

/**
 * Headspace of a vessel holding a batch (shared/calc), or null when it holds nothing. Contents past
 * the vessel's size count as full: the database refuses them (ck_vessels_volume), so only a stale
 * record could show them, and a list should not break on it.
 */
export function headspaceOf(vessel: Pick<Vessel, 'capacityL' | 'volumeL'>): { litres: number; percent: number } | null {
  if (vessel.volumeL == null || vessel.capacityL <= 0) return null;
  return headspace({ capacityL: vessel.capacityL, volumeL: Math.min(vessel.volumeL, vessel.capacityL) });
}

/**
 * "4.3 % headspace", worded one way on every list. No-break spaces keep the figure, its sign and
 * the word on one line in a narrow column.
 */
export function headspaceWords(percent: number): string {
  return `${percent.toFixed(1)}\u00a0%\u00a0headspace`;
}
