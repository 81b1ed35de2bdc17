import type { DataSource } from 'typeorm';
import type { z } from 'zod';
import type { OperationResult } from '../../shared/schemas/batch-detail';
import type { rackRequestSchema } from '../../shared/schemas/journal';
import { Vessel } from '../entities/vessel.entity';
import { BadRequestError } from '../errors';
import { findBatch, litres, loadCellar, lockBatch, occurredAt, requireInVessels, roundLitres } from './batch-context';
import { operationResult } from './batch-detail';
import { checkFillTarget, glassCautions, headspaceWarnings, markEmptied, markFilled, requireHolds, vesselVolume } from './batch-vessel-rules';
import type { CellarContext } from './cellar.service';
import { appendEntry } from './journal-writer';
import { lockVessels } from './vessel-lock';

type RackRequest = z.output<typeof rackRequestSchema>;

/** Refuses a vessel named as both source and target before anything is locked. */
export function refuseSourceAsTarget(from: { vesselId: string }[], to: { vesselId: string }[]): void {
  const sources = new Set(from.map((f) => f.vesselId));
  if (to.some((t) => sources.has(t.vesselId))) {
    throw new BadRequestError('A vessel cannot be both a source and a target; rack into a different vessel.');
  }
}

/** 400 when the targets are to receive more than the sources hold. */
export function refuseMoreThanSources(fromL: number, toL: number, verb: string): void {
  if (toL > fromL + 1e-9) {
    throw new BadRequestError(`You cannot ${verb} more than the source holds: the sources hold ${litres(fromL)} L, the targets would get ${litres(toL)} L.`);
  }
}

/**
 * Racks a batch off its lees: every source vessel (which must hold this batch) is emptied
 * completely and left dirty; the targets (empty, in use, sanitised or overridden, big
 * enough) are filled. The loss to the lees is journalled. Warns about headspace and glass.
 */
export async function rackBatch(ds: DataSource, ctx: CellarContext, batchId: string, request: RackRequest): Promise<OperationResult> {
  refuseSourceAsTarget(request.from, request.to);
  return ds.transaction(async (tx) => {
    const now = new Date();
    await findBatch(tx, ctx.cellarId, batchId);
    const locked = await lockVessels(tx, ctx.cellarId, [...request.from, ...request.to]);
    const batch = await lockBatch(tx, ctx.cellarId, batchId);
    await requireInVessels(tx, batch);
    const cellar = await loadCellar(tx, ctx.cellarId);
    const at = occurredAt(request.at, now, batch, cellar.timeZone);

    // Re-checked on the locked rows: a racking that committed while we waited shows here.
    const sources = request.from.map((f) => locked.get(f.vesselId)!);
    for (const vessel of sources) await requireHolds(tx, vessel, batch);
    const overrideReason = request.override?.reason ?? null;
    let overrideUsed = false;
    const targets = request.to.map((t) => ({ vessel: locked.get(t.vesselId)!, volumeL: t.volumeL }));
    for (const { vessel, volumeL } of targets) {
      overrideUsed = (await checkFillTarget(tx, vessel, volumeL, cellar, overrideReason, now)) || overrideUsed;
    }
    const fromL = sources.reduce((sum, v) => sum + (v.volumeL ?? 0), 0);
    const toL = targets.reduce((sum, t) => sum + t.volumeL, 0);
    refuseMoreThanSources(fromL, toL, 'rack');

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
      ctx,
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
    return operationResult(tx, ctx, batch.id, entry.id, warnings);
  });
}
