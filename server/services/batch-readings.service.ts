import type { DataSource } from 'typeorm';
import type { z } from 'zod';
import { correctGravity } from '../../shared/calc';
import type { OperationResult } from '../../shared/schemas/batch-detail';
import type { readingRequestSchema } from '../../shared/schemas/journal';
import { calc } from './batch-context';
import { onBatch } from './batch-operation';
import type { CellarContext } from './cellar.service';
import { appendEntry } from './journal-writer';

type ReadingRequest = z.output<typeof readingRequestSchema>;

/**
 * The gravity corrected to the hydrometer's calibration temperature (shared/calc), or the
 * reading itself when no sample temperature was taken.
 */
export function correctedGravity(sg: number, temperatureC: number | null, calibrationC: number): number {
  return temperatureC === null ? sg : calc(() => correctGravity(sg, temperatureC, calibrationC));
}

/** Logs a gravity reading (with pH and temperature if taken) for a batch still in vessels. */
export function addReading(ds: DataSource, ctx: CellarContext, batchId: string, request: ReadingRequest): Promise<OperationResult> {
  const vessels = request.vesselId ? [{ vesselId: request.vesselId }] : [];
  return onBatch(ds, ctx, batchId, { vessels, needsVessels: true }, async ({ tx, batch, at }) => {
    const entry = await appendEntry(
      tx,
      ctx,
      batch.id,
      {
        kind: 'reading',
        sg: request.sg,
        temperatureC: request.temperatureC,
        calibrationC: request.calibrationC,
        correctedSg: correctedGravity(request.sg, request.temperatureC, request.calibrationC),
        ph: request.ph,
        vesselId: request.vesselId,
      },
      { occurredAt: at(request.at) },
    );
    return { entryId: entry.id };
  });
}
