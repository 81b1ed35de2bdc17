import type { EntityManager } from 'typeorm';
import type { z } from 'zod';
import type { OperationResult } from '../../shared/schemas/batch-detail';
import type { degasRequestSchema, noteRequestSchema, tasteRequestSchema } from '../../shared/schemas/journal';
import { requireRole, type Actor } from '../core/actor';
import { appendEntry } from '../journal/journal';
import { onBatch } from './on-batch';

type DegasRequest = z.output<typeof degasRequestSchema>;
type TasteRequest = z.output<typeof tasteRequestSchema>;
type NoteRequest = z.output<typeof noteRequestSchema>;

/** Records degassing (stirring out CO₂) of the batch, or of one vessel holding it. */
export function degas(actor: Actor, tx: EntityManager, batchId: string, request: DegasRequest): Promise<OperationResult> {
  requireRole(actor, 'hand');
  const vessels = request.vesselId ? [{ vesselId: request.vesselId }] : [];
  return onBatch(actor, tx, batchId, { vessels, needsVessels: true }, async ({ tx, batch, at }) => {
    const entry = await appendEntry(
      tx,
      actor,
      batch.id,
      { kind: 'degassed', vesselId: request.vesselId, note: request.note },
      { occurredAt: at(request.at) },
    );
    return { entryId: entry.id };
  });
}

/** Records tasting notes and a score; bottles can be tasted after bulk is gone, so always allowed. */
export function taste(actor: Actor, tx: EntityManager, batchId: string, request: TasteRequest): Promise<OperationResult> {
  requireRole(actor, 'hand');
  return onBatch(actor, tx, batchId, { needsVessels: false }, async ({ tx, batch, at }) => {
    const entry = await appendEntry(
      tx,
      actor,
      batch.id,
      { kind: 'tasted', appearance: request.appearance, aroma: request.aroma, flavour: request.flavour, score: request.score },
      { occurredAt: at(request.at) },
    );
    return { entryId: entry.id };
  });
}

/** A free-text note on the batch's journal. */
export function addNote(actor: Actor, tx: EntityManager, batchId: string, request: NoteRequest): Promise<OperationResult> {
  requireRole(actor, 'hand');
  return onBatch(actor, tx, batchId, { needsVessels: false }, async ({ tx, batch, at }) => {
    const entry = await appendEntry(tx, actor, batch.id, { kind: 'note', text: request.text }, { occurredAt: at(request.at) });
    return { entryId: entry.id };
  });
}
