import {
  abvBy,
  abvSimple,
  ageMilestones,
  apparentAttenuation,
  daysBetween,
  fermentationState,
  potentialAbv,
  predictFinish,
  type AgeMilestone,
  type FermentationState,
  type PredictedFinish,
} from '@shared/calc';
import type { BatchDetail } from '@shared/schemas/batch-detail';

/** Everything the Batch page computes from the record, all with shared/calc. */
export interface BatchFigures {
  og: number | null;
  /** Latest temperature-corrected reading. */
  currentSg: number | null;
  /** By the default formula (shared/calc DEFAULT_ABV_FORMULA). */
  abvEstimate: number | null;
  abvSimple: number | null;
  attenuation: number | null;
  potentialAbv: number | null;
  predicted: PredictedFinish | null;
  state: FermentationState | null;
  ageDays: number | null;
  daysSinceRacking: number | null;
  milestones: AgeMilestone[];
}

/** The figure, or null when the record does not allow it (no OG, a reading above the OG…). */
function maybe<T>(compute: () => T): T | null {
  try {
    return compute();
  } catch {
    return null;
  }
}

/**
 * Figures of a batch as of `now`.
 * @param batch - the batch detail (readings oldest first)
 * @param now - the moment to judge at
 */
export function batchFigures(batch: Pick<BatchDetail, 'og' | 'yeastToleranceAbv' | 'readings' | 'startedOn' | 'lastRackedAt'>, now: Date = new Date()): BatchFigures {
  const og = batch.og;
  const last = batch.readings.at(-1) ?? null;
  const currentSg = last?.correctedSg ?? null;
  const withBoth = <T>(compute: (o: number, sg: number) => T) => (og !== null && currentSg !== null ? maybe(() => compute(og, currentSg)) : null);
  return {
    og,
    currentSg,
    abvEstimate: withBoth((og, sg) => abvBy(og, sg)),
    abvSimple: withBoth(abvSimple),
    attenuation: withBoth(apparentAttenuation),
    potentialAbv: og === null ? null : maybe(() => potentialAbv(og)),
    predicted: og === null ? null : maybe(() => predictFinish({ og, toleranceAbv: batch.yeastToleranceAbv })),
    state:
      og === null
        ? null
        : maybe(() =>
            fermentationState({
              og,
              toleranceAbv: batch.yeastToleranceAbv,
              readings: batch.readings.map((r) => ({ at: r.at, sg: r.correctedSg })),
              now,
            }),
          ),
    ageDays: maybe(() => daysBetween(batch.startedOn, now)),
    daysSinceRacking: batch.lastRackedAt ? maybe(() => daysBetween(batch.lastRackedAt as string, now)) : null,
    milestones: maybe(() => ageMilestones(batch.startedOn, now)) ?? [],
  };
}
