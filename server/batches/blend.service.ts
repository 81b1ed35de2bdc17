import type { EntityManager } from 'typeorm';
import type { z } from 'zod';
import type { OperationResult } from '../../shared/schemas/batch-detail';
import type { BatchKind } from '../../shared/schemas/batches';
import type { blendRequestSchema } from '../../shared/schemas/journal';
import { loadCellar } from '../cellars/load-cellar';
import { requireRole, type Actor } from '../core/actor';
import { roundLitres } from '../core/litres';
import { localDate } from '../core/local-date';
import { BatchParent } from '../entities/batch-parent.entity';
import { Batch } from '../entities/batch.entity';
import { Vessel } from '../entities/vessel.entity';
import { ConflictError } from '../http/errors';
import { appendEntry } from '../journal/journal';
import { lockVessels, vesselChangedError } from '../vessels/vessel-lock';
import { operationResult } from './batch-detail';
import { lockBatch, occurredAt } from './batch-lookup';
import { blendedOg, blendYeastName } from './blend-rules';
import {
  checkFillTarget,
  glassCautions,
  headspaceWarnings,
  markEmptied,
  markFilled,
  refuseMoreThanSources,
  refuseSourceAsTarget,
  vesselVolume,
} from './fill-rules';

export type BlendRequest = Omit<z.output<typeof blendRequestSchema>, 'kind'> & { kind: BatchKind };

interface Share {
  batch: Batch;
  volumeL: number;
}

/** Locks the parents (in id order, after the vessels) and sums what each gives to the blend. */
async function lockShares(tx: EntityManager, actor: Actor, sources: Vessel[]): Promise<Share[]> {
  for (const vessel of sources) if (!vessel.batchId) throw await vesselChangedError(tx, vessel, actor.units);
  const ids = [...new Set(sources.map((v) => v.batchId as string))].sort();
  if (ids.length < 2) throw new ConflictError('A blend needs vessels of at least two batches. To move one batch into other vessels, rack it.');
  const shares: Share[] = [];
  for (const id of ids) {
    const batch = await lockBatch(tx, actor.cellarId, id);
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
export async function blendBatches(actor: Actor, tx: EntityManager, request: BlendRequest): Promise<OperationResult> {
  requireRole(actor, 'hand');
  refuseSourceAsTarget(request.from, request.to);
  const now = new Date();
  const locked = await lockVessels(tx, actor, [...request.from, ...request.to]);
  const sources = request.from.map((f) => locked.get(f.vesselId)!);
  const shares = await lockShares(tx, actor, sources);
  const cellar = await loadCellar(tx, actor.cellarId);
  // Checked against the parent started last: a blend cannot happen before any parent began.
  const youngest = shares.reduce((a, b) => (b.batch.startedOn > a.batch.startedOn ? b : a)).batch;
  const at = occurredAt(request.at, now, youngest, cellar.timeZone);

  const overrideReason = request.override?.reason ?? null;
  let overrideUsed = false;
  const targets = request.to.map((t) => ({ vessel: locked.get(t.vesselId)!, volumeL: t.volumeL }));
  for (const { vessel, volumeL } of targets) {
    overrideUsed = (await checkFillTarget(tx, vessel, volumeL, cellar, overrideReason, now, actor.units)) || overrideUsed;
  }
  const fromL = shares.reduce((sum, s) => sum + s.volumeL, 0);
  const toL = roundLitres(targets.reduce((sum, t) => sum + t.volumeL, 0));
  refuseMoreThanSources(fromL, toL, 'blend', actor.units);

  const batches = tx.getRepository(Batch);
  const child = await batches.save(
    batches.create({
      cellarId: actor.cellarId,
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
      createdBy: actor.userId,
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
    await appendEntry(tx, actor, batch.id, { kind: 'blended', childBatchId: child.id, childName: child.name, volumeL }, { occurredAt: at });
  }
  const entry = await appendEntry(
    tx,
    actor,
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
  return operationResult(tx, actor, child.id, entry.id, warnings);
}
