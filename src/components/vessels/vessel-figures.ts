import { headspace } from '@shared/calc';
import type { Vessel } from '@shared/schemas/vessels';

/** Headspace of a vessel holding a batch (shared/calc), or null when it holds nothing. */
export function headspaceOf(vessel: Pick<Vessel, 'capacityL' | 'volumeL'>): { litres: number; percent: number } | null {
  if (vessel.volumeL == null || vessel.capacityL <= 0) return null;
  return headspace({ capacityL: vessel.capacityL, volumeL: Math.min(vessel.volumeL, vessel.capacityL) });
}
