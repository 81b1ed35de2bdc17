import type { CleaningState, VesselState } from '../schemas/vessels';

const DAY_MS = 24 * 60 * 60 * 1000;

export interface VesselStateInput {
  batchId: string | null;
  retiredAt: Date | string | null;
  cleaningState: CleaningState;
  sanitisedAt: Date | string | null;
}

/**
 * A vessel's state now. Sanitising lapses after the cellar's set days: computed from the
 * timestamp, so no job has to rewrite rows and the answer is right at any moment.
 * @param sanitisedValidDays - the cellar's setting
 * @param now - the moment to judge at
 */
export function vesselState(vessel: VesselStateInput, sanitisedValidDays: number, now: Date = new Date()): VesselState {
  if (vessel.retiredAt) return 'retired';
  if (vessel.batchId) return 'holding';
  if (vessel.cleaningState !== 'sanitised') return vessel.cleaningState;
  if (!vessel.sanitisedAt) return 'clean';
  const age = now.getTime() - new Date(vessel.sanitisedAt).getTime();
  return age <= sanitisedValidDays * DAY_MS ? 'sanitised' : 'clean';
}

/** The moment a sanitised vessel counts as merely clean again. */
export function sanitisedUntil(sanitisedAt: Date | string, sanitisedValidDays: number): Date {
  return new Date(new Date(sanitisedAt).getTime() + sanitisedValidDays * DAY_MS);
}
