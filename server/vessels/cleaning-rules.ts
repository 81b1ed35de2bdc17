import { vesselState } from '../../shared/domain/vessel-state';
import type { CleaningState } from '../../shared/schemas/vessels';
import type { Vessel } from '../entities/vessel.entity';

/**
 * Why a cleaning change is refused, or null when it is allowed. Only an empty vessel in use is
 * cleaned; it goes dirty → clean → sanitised (a lapsed one counts as clean, and a sanitised one
 * may be sanitised again), and anything may be marked dirty.
 */
export function cleaningRefusal(vessel: Vessel, target: CleaningState, days: number, now: Date): string | null {
  if (vessel.retiredAt) return `${vessel.name} is retired. Bring it back into use first.`;
  if (vessel.batchId) return `${vessel.name} holds a batch. Only an empty vessel is cleaned or sanitised.`;
  const current = vesselState(vessel, days, now);
  if (target === 'dirty') return null;
  if (target === 'sanitised') {
    return current === 'dirty' ? `Clean it first: ${vessel.name} is dirty, and sanitiser only works on a clean surface.` : null;
  }
  if (current === 'dirty') return null;
  if (current === 'clean') return `${vessel.name} is already clean.`;
  return `${vessel.name} is sanitised, which includes clean. To start over, mark it dirty.`;
}
