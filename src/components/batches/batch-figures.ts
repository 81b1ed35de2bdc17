import {
  abvBy,
  abvSimple,
  ageInDays,
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
import { figuresAfterTopUps, type TopUpEvent } from '@shared/domain/top-up-figures';
import type { BatchDetail } from '@shared/schemas/batch-detail';

/** Everything the Batch page computes from the record, all with shared/calc. */
export interface BatchFigures {
  /** The original gravity, after top-ups by the mixing rule (shared/domain/top-up-figures.ts). */
  og: number | null;
  /** The original gravity recorded at the start. */
  ogAtStart: number | null;
  /** Latest temperature-corrected reading, or that reading mixed with later top-ups. */
  currentSg: number | null;
  /** The current gravity is worked out from top-ups since the last reading. */
  sgEstimated: boolean;
  /** Top-ups whose liquid's gravity is not known, left out of the figures. */
  unknownTopUps: number;
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

/** Top-ups that recorded their liquid, as the mixing rule takes them. */
function topUpEvents(journal: BatchDetail['journal']): TopUpEvent[] {
  return journal.flatMap((e) =>
    e.payload.kind === 'topped-up' && e.payload.liquid && e.payload.batchVolumeBeforeL !== undefined
      ? [{ at: e.occurredAt, addedL: e.payload.volumeL, batchVolumeBeforeL: e.payload.batchVolumeBeforeL, liquid: e.payload.liquid }]
      : [],
  );
}

/** The local calendar day of a moment, YYYY-MM-DD. */
const localDay = (now: Date) => `${now.getFullYear()}-${String(now.getMonth() + 1).padStart(2, '0')}-${String(now.getDate()).padStart(2, '0')}`;

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
export function batchFigures(
  batch: Pick<BatchDetail, 'og' | 'yeastToleranceAbv' | 'readings' | 'startedOn' | 'lastRackedAt'> & { journal?: BatchDetail['journal'] },
  now: Date = new Date(),
): BatchFigures {
  const last = batch.readings.at(-1) ?? null;
  const topUps = topUpEvents(batch.journal ?? []);
  const mixed =
    batch.og !== null && topUps.length
      ? maybe(() =>
          figuresAfterTopUps(
            batch.og as number,
            batch.readings.map((r) => ({ at: r.at, sg: r.correctedSg })),
            topUps,
          ),
        )
      : null;
  const og = mixed?.og ?? batch.og;
  const currentSg = mixed ? mixed.currentSg : (last?.correctedSg ?? null);
  const withBoth = <T>(compute: (o: number, sg: number) => T) => (og !== null && currentSg !== null ? maybe(() => compute(og, currentSg)) : null);
  return {
    og,
    ogAtStart: batch.og,
    currentSg,
    sgEstimated: mixed?.sgEstimated ?? false,
    unknownTopUps: mixed?.unknownTopUps ?? 0,
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
    ageDays: maybe(() => ageInDays(batch.startedOn, localDay(now))),
    daysSinceRacking: batch.lastRackedAt ? maybe(() => daysBetween(batch.lastRackedAt as string, now)) : null,
    milestones: maybe(() => ageMilestones(batch.startedOn, now)) ?? [],
  };
}
