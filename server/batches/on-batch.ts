import type { EntityManager } from 'typeorm';
import type { OperationResult } from '../../shared/schemas/batch-detail';
import { loadCellar } from '../cellars/load-cellar';
import type { Actor } from '../core/actor';
import type { Batch } from '../entities/batch.entity';
import type { Cellar } from '../entities/cellar.entity';
import type { Vessel } from '../entities/vessel.entity';
import { lockVessels, type VesselRef } from '../vessels/vessel-lock';
import { operationResult } from './batch-detail';
import { findBatch, lockBatch, occurredAt, requireInVessels } from './batch-lookup';
import { requireHolds } from './fill-rules';

/** What an operation on one batch works with, all read inside its transaction. */
export interface BatchScope {
  tx: EntityManager;
  batch: Batch;
  cellar: Cellar;
  now: Date;
  /** The vessels named in the request, locked and checked to hold the batch. */
  vessels: Map<string, Vessel>;
  /** When the request says it happened (checked: not in the future, not before the start). */
  at: (requested: string | undefined) => Date;
}

export interface BatchOperationOptions {
  /** Vessels the request names; each must hold the batch. */
  vessels?: VesselRef[];
  /** Work on the liquid itself: refused (409) once the batch is in no vessel. */
  needsVessels: boolean;
}

/**
 * Runs one journal operation on a batch in one transaction: 404 unless the batch is in this
 * cellar, named vessels locked (before the batch row, the order every writer follows) and
 * checked to hold it, then `work`, then the batch as it is now.
 */
export async function onBatch(
  actor: Actor,
  tx: EntityManager,
  batchId: string,
  options: BatchOperationOptions,
  work: (scope: BatchScope) => Promise<{ entryId: string | null; warnings?: string[] }>,
): Promise<OperationResult> {
  const now = new Date();
  await findBatch(tx, actor.cellarId, batchId);
  const vessels = await lockVessels(tx, actor, options.vessels ?? []);
  const batch = await lockBatch(tx, actor.cellarId, batchId);
  if (options.needsVessels) await requireInVessels(tx, batch);
  for (const vessel of vessels.values()) await requireHolds(tx, vessel, batch, actor.units);
  const cellar = await loadCellar(tx, actor.cellarId);
  const at = (requested: string | undefined) => occurredAt(requested, now, batch, cellar.timeZone);
  const { entryId, warnings = [] } = await work({ tx, batch, cellar, now, vessels, at });
  return operationResult(tx, actor, batch.id, entryId, warnings);
}
