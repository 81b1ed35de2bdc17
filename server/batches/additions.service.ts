import type { EntityManager } from 'typeorm';
import type { z } from 'zod';
import { CAUTION_BOTTLE_PRESSURE, CAUTION_SORBATE, CAUTION_SULFITES, spiceCaution } from '../../shared/calc';
import type { OperationResult } from '../../shared/schemas/batch-detail';
import type { additionRequestSchema, removalRequestSchema } from '../../shared/schemas/journal';
import { requireRole, type Actor } from '../core/actor';
import type { Batch } from '../entities/batch.entity';
import { ConflictError } from '../http/errors';
import { appendEntry } from '../journal/journal';
import { correctedEntry, hasStabiliser, removalOf } from '../journal/journal-queries';
import { onBatch } from './on-batch';

type AdditionRequest = z.output<typeof additionRequestSchema>;
type RemovalRequest = z.output<typeof removalRequestSchema>;

const SULFITE = /sul(f|ph)ite|campden/i;
const SORBATE = /sorbate/i;

/** Cautions that belong beside this addition: sulfites, sorbate, sweetening an unstabilised batch. */
async function additionCautions(tx: EntityManager, batch: Batch, request: AdditionRequest): Promise<string[]> {
  const batchId = batch.id;
  const cautions: string[] = [];
  const spice = request.category === 'spice' ? spiceCaution(request.name, batch.stage) : null;
  if (spice) cautions.push(spice);
  if (request.category === 'stabiliser' && SULFITE.test(request.name)) cautions.push(CAUTION_SULFITES);
  if (request.category === 'stabiliser' && SORBATE.test(request.name)) cautions.push(CAUTION_SORBATE);
  if (request.category === 'sweetener' && !(await hasStabiliser(tx, batchId))) cautions.push(CAUTION_BOTTLE_PRESSURE);
  return cautions;
}

/**
 * Records fruit, oak, spice, nutrient, stabiliser… added to a batch still in vessels (into
 * one vessel when named, which must hold it). Oak and anything with a removal date stays on
 * the batch's "still in" list until a removal is recorded.
 */
export function addAddition(actor: Actor, tx: EntityManager, batchId: string, request: AdditionRequest): Promise<OperationResult> {
  requireRole(actor, 'hand');
  const vessels = request.vesselId ? [{ vesselId: request.vesselId }] : [];
  return onBatch(actor, tx, batchId, { vessels, needsVessels: true }, async ({ tx, batch, at }) => {
    const warnings = await additionCautions(tx, batch, request);
    const entry = await appendEntry(
      tx,
      actor,
      batch.id,
      {
        kind: 'addition',
        category: request.category,
        name: request.name,
        amount: request.amount,
        unit: request.unit,
        vesselId: request.vesselId,
        removeOn: request.removeOn,
      },
      { occurredAt: at(request.at) },
    );
    return { entryId: entry.id, warnings };
  });
}

/**
 * Records that an addition (oak, a spice bag…) came out. The addition must be this batch's
 * and not already out. Allowed after bottling too: it closes the record.
 */
export function removeAddition(actor: Actor, tx: EntityManager, batchId: string, request: RemovalRequest): Promise<OperationResult> {
  requireRole(actor, 'hand');
  return onBatch(actor, tx, batchId, { needsVessels: false }, async ({ tx, batch, at }) => {
    const addition = await correctedEntry(tx, batch.id, request.additionEntryId);
    if (!addition || addition.payload.kind !== 'addition') {
      throw new ConflictError(`That entry is not an addition to ${batch.name}, so it cannot be taken out.`);
    }
    const name = addition.payload.name;
    const removedAt = await removalOf(tx, batch.id, addition.id);
    if (removedAt) {
      throw new ConflictError(`${name} was already taken out of ${batch.name} on ${removedAt.toISOString().slice(0, 10)}.`);
    }
    const entry = await appendEntry(tx, actor, batch.id, { kind: 'removed', additionEntryId: addition.id, name }, { occurredAt: at(request.at) });
    return { entryId: entry.id };
  });
}
