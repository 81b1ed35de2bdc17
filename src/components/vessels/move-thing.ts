import type { SlotRef } from '@shared/schemas/vessels';
import { moveCase } from '@/api/cases';
import { moveVessel } from '@/api/vessels';

/** A vessel or a bottle case that can take a slot. */
export interface MovableThing {
  kind: 'vessel' | 'case';
  id: string;
  name: string;
  /** The version shown, so a stale move answers 409. */
  version?: number;
  place: SlotRef | null;
  /** Glass vessels get the carrying caution. */
  glass?: boolean;
}

/**
 * Puts a vessel or case into a slot, or takes it off its shelf with `to: null`.
 * @param to - the free slot chosen
 */
export async function moveThing(cellarId: string, thing: MovableThing, to: { shelfId: string; slot: number } | null): Promise<void> {
  const move = { to, expectedVersion: thing.version };
  if (thing.kind === 'vessel') await moveVessel(cellarId, thing.id, move);
  else await moveCase(cellarId, thing.id, move);
}
