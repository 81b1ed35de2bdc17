import type { DataSource, EntityManager } from 'typeorm';
import type { z } from 'zod';
import { gravityPoints } from '../../shared/calc';
import type { OperationResult } from '../../shared/schemas/batch-detail';
import type { BatchKind } from '../../shared/schemas/batches';
import type { blendRequestSchema } from '../../shared/schemas/journal';
import { BatchParent } from '../entities/batch-parent.entity';
import { Batch } from '../entities/batch.entity';
import { Vessel } from '../entities/vessel.entity';
import { ConflictError } from '../errors';
import { calc, localDate, loadCellar, lockBatch, occurredAt, roundLitres } from './batch-context';
import { operationResult } from './batch-detail';
import { checkFillTarget, glassCautions, headspaceWarnings, markEmptied, markFilled, vesselVolume } from './batch-vessel-rules';
import type { CellarContext } from './cellar.service';
import { appendEntry } from './journal-writer';
import { refuseMoreThanSources, refuseSourceAsTarget } from './racking.service';
import { lockVessels, vesselChangedError } from './vessel-lock';

export type BlendRequest = Omit<z.output<typeof blendRequestSchema>, 'kind'> & { kind: BatchKind };

interface Share {
  batch: Batch;
  volumeL: number;
}

/**
 * The blend's original gravity: the volume-weighted mean of its parents' OG in gravity points
 * (shared/calc gravityPoints); unknown when any parent's OG is unknown.
 */
export function blendedOg(shares: { og: number | null; volumeL: number }[]): number | null {
  if (shares.some((s) => s.og === null)) return null;
  const totalL = shares.reduce((sum, s) => sum + s.volumeL, 0);
  const points = shares.reduce((sum, s) => sum + calc(() => gravityPoints(s.og as number)) * s.volumeL, 0) / totalL;
  return Number((1 + points / 1000).toFixed(3));
}

/** "Blend of Heather mead, Quince cyser and Sloe wine", cut to the column's 80 characters. */
export function blendYeastName(names: string[]): string {
  const list = names.length > 1 ? `${names.slice(0, -1).join(', ')} and ${names.at(-1)}` : names.join('');
  const text = `Blend of ${list}`;
  return text.length <= 80 ? text : `${text.slice(0, 79)}…`;
}

/** Locks the parents (in id order, after the vessels) and sums what each gives to the blend. */
async function lockShares(tx: EntityManager, ctx: CellarContext, sources: Vessel[]): Promise<Share[]> {
  for (const vessel of sources) if (!vessel.batchId) throw await vesselChangedError(tx, vessel);
  const ids = [...new Set(sources.map((v) => v.batchId as string))].sort();
  if (ids.length < 2) throw new ConflictError('A blend needs vessels of at least two batches. To move one batch into other vessels, rack it.');
  const shares: Share[] = [];
  for (const id of ids) {
    const batch = await lockBatch(tx, ctx.cellarId, id);
    const volumeL = roundLitres(sources.filter((v) => v.batchId === id).reduce((sum, v) => sum + (v.volumeL ?? 0), 0));
    shares.push({ batch, volumeL });
  }
  return shares.sort((a, b) => a.batch.name.localeCompare(b.batch.name));
}

/**
 * Blends the contents of vessels of two or more batches into new vessels as a new batch:
 * the sources are emptied and left dirty, the targets follow the racking rules, the child
 * records each parent with the litres it gave, an OG weighted by volume and the highest yeast
 * tolerance. 'blended' entries go on the parents, 'started' on the child.
 * @returns the new batch
 */
export async function blendBatches(ds: DataSource, ctx: CellarContext, request: BlendRequest): Promise<OperationResult> {
  refuseSourceAsTarget(request.from, request.to);
  return ds.transaction(async (tx) => {
    const now = new Date();
    const locked = await lockVessels(tx, ctx.cellarId, [...request.from, ...request.to]);
    const sources = request.from.map((f) => locked.get(f.vesselId)!);
    const shares = await lockShares(tx, ctx, sources);
    const cellar = await loadCellar(tx, ctx.cellarId);
    // Checked against the parent started last: a blend cannot happen before any parent began.
    const youngest = shares.reduce((a, b) => (b.batch.startedOn > a.batch.startedOn ? b : a)).batch;
    const at = occurredAt(request.at, now, youngest, cellar.timeZone);

    const overrideReason = request.override?.reason ?? null;
    let overrideUsed = false;
    const targets = request.to.map((t) => ({ vessel: locked.get(t.vesselId)!, volumeL: t.volumeL }));
    for (const { vessel, volumeL } of targets) {
      overrideUsed = (await checkFillTarget(tx, vessel, volumeL, cellar, overrideReason, now)) || overrideUsed;
    }
    const fromL = shares.reduce((sum, s) => sum + s.volumeL, 0);
    const toL = roundLitres(targets.reduce((sum, t) => sum + t.volumeL, 0));
    refuseMoreThanSources(fromL, toL, 'blend');

    const batches = tx.getRepository(Batch);
    const child = await batches.save(
      batches.create({
        cellarId: ctx.cellarId,
        name: request.name,
        kind: request.kind,
        ingredients: [],
        yeastName: blendYeastName(shares.map((s) => s.batch.name)),
        yeastToleranceAbv: Math.max(...shares.map((s) => s.batch.yeastToleranceAbv)),
        plannedVolumeL: toL,
        startedOn: localDate(at, cellar.timeZone),
        og: blendedOg(shares.map((s) => ({ og: s.batch.og, volumeL: s.volumeL }))),
        targetSweetness: null,
        notes: '',
        createdBy: ctx.userId,
      }),
    );
    await tx.getRepository(BatchParent).insert(shares.map((s) => ({ childId: child.id, parentId: s.batch.id, volumeL: s.volumeL })));
    const repo = tx.getRepository(Vessel);
    for (const vessel of sources) {
      markEmptied(vessel);
      await repo.save(vessel);
    }
    for (const { vessel, volumeL } of targets) {
      markFilled(vessel, child.id, volumeL, at);
      await repo.save(vessel);
    }
    for (const { batch, volumeL } of shares) {
      await appendEntry(tx, ctx, batch.id, { kind: 'blended', childBatchId: child.id, childName: child.name, volumeL }, { occurredAt: at });
    }
    const entry = await appendEntry(
      tx,
      ctx,
      child.id,
      {
        kind: 'started',
        volumeL: toL,
        og: child.og,
        vessels: targets.map((t) => vesselVolume(t.vessel, t.volumeL)),
        parents: shares.map((s) => ({ batchId: s.batch.id, name: s.batch.name, volumeL: s.volumeL })),
        override: overrideUsed ? overrideReason : null,
      },
      { occurredAt: at },
    );
    const warnings = [...headspaceWarnings(targets, cellar), ...glassCautions([...sources, ...targets.map((t) => t.vessel)])];
    return operationResult(tx, ctx, child.id, entry.id, warnings);
  });
}
