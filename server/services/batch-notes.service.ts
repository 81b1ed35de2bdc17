import type { DataSource } from 'typeorm';
import type { z } from 'zod';
import type { OperationResult } from '../../shared/schemas/batch-detail';
import type { degasRequestSchema, noteRequestSchema, tasteRequestSchema, topUpRequestSchema } from '../../shared/schemas/journal';
import { Vessel } from '../entities/vessel.entity';
import { ConflictError } from '../errors';
import { litres, roundLitres } from './batch-context';
import { onBatch } from './batch-operation';
import { headspaceWarnings } from './batch-vessel-rules';
import type { CellarContext } from './cellar.service';
import { appendEntry } from './journal-writer';

type TopUpRequest = z.output<typeof topUpRequestSchema>;
type DegasRequest = z.output<typeof degasRequestSchema>;
type TasteRequest = z.output<typeof tasteRequestSchema>;
type NoteRequest = z.output<typeof noteRequestSchema>;

/**
 * Tops up a vessel holding the batch (to cut headspace); the vessel's volume grows and must
 * still fit. Warns when the headspace is still above the cellar's limit.
 */
export function topUp(ds: DataSource, ctx: CellarContext, batchId: string, request: TopUpRequest): Promise<OperationResult> {
  const ref = { vesselId: request.vesselId, expectedVersion: request.expectedVersion };
  return onBatch(ds, ctx, batchId, { vessels: [ref], needsVessels: true }, async ({ tx, batch, cellar, vessels, at }) => {
    const vessel = vessels.get(request.vesselId)!;
    const before = vessel.volumeL ?? 0;
    const after = roundLitres(before + request.volumeL);
    if (after > vessel.capacityL) {
      throw new ConflictError(
        `${vessel.name} holds ${litres(before)} L of ${litres(vessel.capacityL)} L; ${litres(request.volumeL)} L more will not fit ` +
          `(room for ${litres(vessel.capacityL - before)} L).`,
        { vesselId: vessel.id, currentVersion: vessel.version },
      );
    }
    vessel.volumeL = after;
    await tx.getRepository(Vessel).save(vessel);
    const entry = await appendEntry(
      tx,
      ctx,
      batch.id,
      { kind: 'topped-up', vesselId: vessel.id, vesselName: vessel.name, volumeL: request.volumeL, with: request.with },
      { occurredAt: at(request.at) },
    );
    return { entryId: entry.id, warnings: headspaceWarnings([{ vessel, volumeL: after }], cellar) };
  });
}

/** Records degassing (stirring out CO₂) of the batch, or of one vessel holding it. */
export function degas(ds: DataSource, ctx: CellarContext, batchId: string, request: DegasRequest): Promise<OperationResult> {
  const vessels = request.vesselId ? [{ vesselId: request.vesselId }] : [];
  return onBatch(ds, ctx, batchId, { vessels, needsVessels: true }, async ({ tx, batch, at }) => {
    const entry = await appendEntry(tx, ctx, batch.id, { kind: 'degassed', vesselId: request.vesselId, note: request.note }, { occurredAt: at(request.at) });
    return { entryId: entry.id };
  });
}

/** Records tasting notes and a score; bottles can be tasted after bulk is gone, so always allowed. */
export function taste(ds: DataSource, ctx: CellarContext, batchId: string, request: TasteRequest): Promise<OperationResult> {
  return onBatch(ds, ctx, batchId, { needsVessels: false }, async ({ tx, batch, at }) => {
    const entry = await appendEntry(
      tx,
      ctx,
      batch.id,
      { kind: 'tasted', appearance: request.appearance, aroma: request.aroma, flavour: request.flavour, score: request.score },
      { occurredAt: at(request.at) },
    );
    return { entryId: entry.id };
  });
}

/** A free-text note on the batch's journal. */
export function addNote(ds: DataSource, ctx: CellarContext, batchId: string, request: NoteRequest): Promise<OperationResult> {
  return onBatch(ds, ctx, batchId, { needsVessels: false }, async ({ tx, batch, at }) => {
    const entry = await appendEntry(tx, ctx, batch.id, { kind: 'note', text: request.text }, { occurredAt: at(request.at) });
    return { entryId: entry.id };
  });
}
