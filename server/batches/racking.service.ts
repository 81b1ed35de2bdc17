import type { EntityManager } from 'typeorm';
import type { z } from 'zod';
import type { OperationResult } from '../../shared/schemas/batch-detail';
import type { rackRequestSchema } from '../../shared/schemas/journal';
import { loadCellar } from '../cellars/load-cellar';
import { requireRole, type Actor } from '../core/actor';
import { roundLitres } from '../core/litres';
import { Vessel } from '../entities/vessel.entity';
import { appendEntry } from '../journal/journal';
import { lockVessels } from '../vessels/vessel-lock';
import { operationResult } from './batch-detail';
import { findBatch, lockBatch, occurredAt, requireInVessels } from './batch-lookup';
import {
  checkFillTarget,
  glassCautions,
  headspaceWarnings,
  markEmptied,
  markFilled,
  refuseMoreThanSources,
  refuseSourceAsTarget,
  requireHolds,
  vesselVolume,
} from './fill-rules';

type RackRequest = z.output<typeof rackRequestSchema>;

/**
 * Racks a batch off its lees: every source vessel (which must hold this batch) is emptied
 * completely and left dirty; the targets (empty, in use, sanitised or overridden, big
 * enough) are filled. The loss to the lees is journalled. Warns about headspace and glass.
 */
export async function rackBatch(actor: Actor, tx: EntityManager, batchId: string, request: RackRequest): Promise<OperationResult> {
  requireRole(actor, 'hand');
  refuseSourceAsTarget(request.from, request.to);
  const now = new Date();
  await findBatch(tx, actor.cellarId, batchId);
  const locked = await lockVessels(tx, actor, [...request.from, ...request.to]);
  const batch = await lockBatch(tx, actor.cellarId, batchId);
  await requireInVessels(tx, batch);
  const cellar = await loadCellar(tx, actor.cellarId);
  const at = occurredAt(request.at, now, batch, cellar.timeZone);

  // Re-checked on the locked rows: a racking that committed while we waited shows here.
  const sources = request.from.map((f) => locked.get(f.vesselId)!);
  for (const vessel of sources) await requireHolds(tx, vessel, batch, actor.units);
  const overrideReason = request.override?.reason ?? null;
  let overrideUsed = false;
  const targets = request.to.map((t) => ({ vessel: locked.get(t.vesselId)!, volumeL: t.volumeL }));
  for (const { vessel, volumeL } of targets) {
    overrideUsed = (await checkFillTarget(tx, vessel, volumeL, cellar, overrideReason, now, actor.units)) || overrideUsed;
  }
  const fromL = sources.reduce((sum, v) => sum + (v.volumeL ?? 0), 0);
  const toL = targets.reduce((sum, t) => sum + t.volumeL, 0);
  refuseMoreThanSources(fromL, toL, 'rack', actor.units);

  const from = sources.map((v) => vesselVolume(v, v.volumeL ?? 0));
  const repo = tx.getRepository(Vessel);
  for (const vessel of sources) {
    markEmptied(vessel);
    await repo.save(vessel);
  }
  for (const { vessel, volumeL } of targets) {
    markFilled(vessel, batch.id, volumeL, at);
    await repo.save(vessel);
  }
  const entry = await appendEntry(
    tx,
    actor,
    batch.id,
    {
      kind: 'racked',
      from,
      to: targets.map((t) => vesselVolume(t.vessel, t.volumeL)),
      lossL: roundLitres(fromL - toL),
      override: overrideUsed ? overrideReason : null,
    },
    { occurredAt: at },
  );
  const warnings = [...headspaceWarnings(targets, cellar), ...glassCautions([...sources, ...targets.map((t) => t.vessel)])];
  return operationResult(tx, actor, batch.id, entry.id, warnings);
}
