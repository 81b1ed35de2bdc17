import type { EntityManager } from 'typeorm';
import type { z } from 'zod';
import type { OperationResult } from '../../shared/schemas/batch-detail';
import type { topUpRequestSchema } from '../../shared/schemas/journal';
import { requireRole, type Actor } from '../core/actor';
import { roundLitres, volumeText } from '../core/litres';
import { Vessel } from '../entities/vessel.entity';
import { ConflictError } from '../http/errors';
import { appendEntry } from '../journal/journal';
import { headspaceWarnings } from './fill-rules';
import { onBatch } from './on-batch';

type TopUpRequest = z.output<typeof topUpRequestSchema>;

/**
 * Tops up a vessel holding the batch (to cut headspace); the vessel's volume grows and must
 * still fit. The liquid (what, its gravity and strength if known) is recorded with the batch's
 * litres before it, so gravity and strength follow by the mixing rule (shared/domain/top-up-figures.ts).
 * Warns when the headspace is still above the cellar's limit (not in primary).
 */
export function topUp(actor: Actor, tx: EntityManager, batchId: string, request: TopUpRequest): Promise<OperationResult> {
  requireRole(actor, 'hand');
  const ref = { vesselId: request.vesselId, expectedVersion: request.expectedVersion };
  return onBatch(actor, tx, batchId, { vessels: [ref], needsVessels: true }, async ({ tx, batch, cellar, vessels, at }) => {
    const vessel = vessels.get(request.vesselId)!;
    const volume = (value: number) => volumeText(value, actor.units);
    const before = vessel.volumeL ?? 0;
    const after = roundLitres(before + request.volumeL);
    if (after > vessel.capacityL) {
      throw new ConflictError(
        `${vessel.name} holds ${volume(before)} of ${volume(vessel.capacityL)}; ${volume(request.volumeL)} more will not fit ` +
          `(room for ${volume(vessel.capacityL - before)}).`,
        { vesselId: vessel.id, currentVersion: vessel.version },
      );
    }
    // The batch's litres before the top-up: the mixing rule weighs the liquid added against them.
    const [{ litres: batchVolumeBeforeL }]: { litres: number }[] = await tx.query(
      `SELECT COALESCE(SUM(volume_l), 0)::float8 AS litres FROM vessels WHERE batch_id = $1`,
      [batch.id],
    );
    vessel.volumeL = after;
    await tx.getRepository(Vessel).save(vessel);
    const entry = await appendEntry(
      tx,
      actor,
      batch.id,
      {
        kind: 'topped-up',
        vesselId: vessel.id,
        vesselName: vessel.name,
        volumeL: request.volumeL,
        with: request.with,
        ...(request.liquid ? { liquid: request.liquid, batchVolumeBeforeL } : {}),
      },
      { occurredAt: at(request.at) },
    );
    return { entryId: entry.id, warnings: headspaceWarnings([{ vessel, volumeL: after }], cellar, batch.stage) };
  });
}
