import type { Stage } from '../schemas/batches';
import type { JournalKind } from '../schemas/journal';

/** Racking this many times means the batch has moved on from secondary (common practice). */
export const RACKINGS_FOR_BULK_AGEING = 2;

export interface StageInput {
  /** Kinds of the batch's entries, oldest first. */
  kinds: JournalKind[];
  /** Stabiliser additions also mark the start of bulk ageing. */
  hasStabiliser: boolean;
  /** Litres still in vessels. */
  volumeInVesselsL: number;
  /** Bottles still in cases, across its lots. */
  bottlesLeft: number;
  /**
   * Rackings the liquid had before this batch began, for a batch made by a split or a blend
   * (a split keeps its parent's count; a blend moves the liquid off its lees, so it counts one
   * more than its most-racked parent). 0 for a batch started from a must.
   */
  inheritedRackings?: number;
}

/**
 * The batch's stage, derived from its journal:
 * primary until the first racking; secondary after it; bulk ageing after the second racking
 * or once stabilised; bottled when a bottling left nothing in vessels; finished when nothing
 * is left in vessels or bottles. A split or blend carries on from where its parents were.
 */
export function deriveStage(input: StageInput): Stage {
  const bottled = input.kinds.includes('bottled');
  if (input.volumeInVesselsL <= 0) {
    if (bottled && input.bottlesLeft > 0) return 'bottled';
    if (bottled || input.kinds.includes('split') || input.kinds.includes('blended')) return 'finished';
  }
  const rackings = input.kinds.filter((k) => k === 'racked').length + (input.inheritedRackings ?? 0);
  if (rackings >= RACKINGS_FOR_BULK_AGEING || input.hasStabiliser) return 'bulk-ageing';
  if (rackings >= 1) return 'secondary';
  return 'primary';
}
