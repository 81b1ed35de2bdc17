import type { DataSource, EntityManager } from 'typeorm';
import type { z } from 'zod';
import { CAUTION_BOTTLE_PRESSURE, CAUTION_SORBATE, CAUTION_SULFITES } from '../../shared/calc';
import type { OperationResult } from '../../shared/schemas/batch-detail';
import type { additionRequestSchema, JournalPayload, removalRequestSchema } from '../../shared/schemas/journal';
import { ConflictError } from '../errors';
import { onBatch } from './batch-operation';
import type { CellarContext } from './cellar.service';
import { appendEntry } from './journal-writer';

type AdditionRequest = z.output<typeof additionRequestSchema>;
type RemovalRequest = z.output<typeof removalRequestSchema>;
type Addition = Extract<JournalPayload, { kind: 'addition' }>;

const SULFITE = /sul(f|ph)ite|campden/i;
const SORBATE = /sorbate/i;

async function isStabilised(tx: EntityManager, batchId: string): Promise<boolean> {
  const [row]: { stabilised: boolean }[] = await tx.query(
    `SELECT EXISTS (SELECT 1 FROM journal_entries WHERE batch_id = $1 AND kind = 'addition' AND payload->>'category' = 'stabiliser') AS stabilised`,
    [batchId],
  );
  return row.stabilised;
}

/** Cautions that belong beside this addition: sulfites, sorbate, sweetening an unstabilised batch. */
async function additionCautions(tx: EntityManager, batchId: string, request: AdditionRequest): Promise<string[]> {
  const cautions: string[] = [];
  if (request.category === 'stabiliser' && SULFITE.test(request.name)) cautions.push(CAUTION_SULFITES);
  if (request.category === 'stabiliser' && SORBATE.test(request.name)) cautions.push(CAUTION_SORBATE);
  if (request.category === 'sweetener' && !(await isStabilised(tx, batchId))) cautions.push(CAUTION_BOTTLE_PRESSURE);
  return cautions;
}

/**
 * Records fruit, oak, spice, nutrient, stabiliser… added to a batch still in vessels (into
 * one vessel when named, which must hold it). Oak and anything with a removal date stays on
 * the batch's "still in" list until a removal is recorded.
 */
export function addAddition(ds: DataSource, ctx: CellarContext, batchId: string, request: AdditionRequest): Promise<OperationResult> {
  const vessels = request.vesselId ? [{ vesselId: request.vesselId }] : [];
  return onBatch(ds, ctx, batchId, { vessels, needsVessels: true }, async ({ tx, batch, at }) => {
    const warnings = await additionCautions(tx, batch.id, request);
    const entry = await appendEntry(
      tx,
      ctx,
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

/** The addition's name as last amended. */
async function currentAdditionName(tx: EntityManager, entryId: string, original: Addition): Promise<string> {
  const amendments: { payload: Extract<JournalPayload, { kind: 'amendment' }> }[] = await tx.query(
    `SELECT payload FROM journal_entries WHERE amends_entry_id = $1 ORDER BY recorded_at`,
    [entryId],
  );
  let name = original.name;
  for (const { payload } of amendments) if (typeof payload.changes.name === 'string') name = payload.changes.name;
  return name;
}

/**
 * Records that an addition (oak, a spice bag…) came out. The addition must be this batch's
 * and not already out. Allowed after bottling too: it closes the record.
 */
export function removeAddition(ds: DataSource, ctx: CellarContext, batchId: string, request: RemovalRequest): Promise<OperationResult> {
  return onBatch(ds, ctx, batchId, { needsVessels: false }, async ({ tx, batch, at }) => {
    const [addition]: { id: string; payload: JournalPayload }[] = await tx.query(
      `SELECT id, payload FROM journal_entries WHERE id = $1 AND batch_id = $2 AND kind = 'addition'`,
      [request.additionEntryId, batch.id],
    );
    if (!addition || addition.payload.kind !== 'addition') {
      throw new ConflictError(`That entry is not an addition to ${batch.name}, so it cannot be taken out.`);
    }
    const [removed]: { occurred_at: Date }[] = await tx.query(
      `SELECT occurred_at FROM journal_entries WHERE batch_id = $1 AND kind = 'removed' AND payload->>'additionEntryId' = $2`,
      [batch.id, addition.id],
    );
    const name = await currentAdditionName(tx, addition.id, addition.payload);
    if (removed) {
      throw new ConflictError(`${name} was already taken out of ${batch.name} on ${removed.occurred_at.toISOString().slice(0, 10)}.`);
    }
    const entry = await appendEntry(tx, ctx, batch.id, { kind: 'removed', additionEntryId: addition.id, name }, { occurredAt: at(request.at) });
    return { entryId: entry.id };
  });
}
