import type { BatchDetail } from '@shared/schemas/batch-detail';
import type { VesselDetail } from '@shared/schemas/vessels';

/**
 * What the reading form needs from the page it opens on — the batch's OG (ABV so far), its
 * last corrected gravity (a rise is noted) and the vessels it may be drawn from — so the
 * dialog asks the server for nothing before it can be filled in.
 */
export interface ReadingContext {
  og: number | null;
  lastCorrectedSg: number | null;
  vessels: { id: string; name: string; volumeL: number }[];
}

/** On the Batch page: every vessel holding the batch. */
export const readingContextOfBatch = (batch: BatchDetail): ReadingContext => ({
  og: batch.og,
  lastCorrectedSg: batch.readings.at(-1)?.correctedSg ?? null,
  vessels: batch.vessels.map((v) => ({ id: v.id, name: v.name, volumeL: v.volumeL })),
});

/** On the Vessel page: this vessel (or the batch as a whole). */
export const readingContextOfVessel = (vessel: VesselDetail): ReadingContext => ({
  og: vessel.batchOg,
  lastCorrectedSg: vessel.lastReading?.correctedSg ?? null,
  vessels: [{ id: vessel.id, name: vessel.name, volumeL: vessel.volumeL ?? 0 }],
});
