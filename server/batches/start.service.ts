import type { EntityManager } from 'typeorm';
import type { z } from 'zod';
import type { OperationResult } from '../../shared/schemas/batch-detail';
import type { batchStartSchema } from '../../shared/schemas/batches';
import { loadCellar } from '../cellars/load-cellar';
import { requireRole, type Actor } from '../core/actor';
import { roundLitres } from '../core/litres';
import { localDate } from '../core/local-date';
import { Batch } from '../entities/batch.entity';
import { Vessel } from '../entities/vessel.entity';
import { BadRequestError } from '../http/errors';
import { appendEntry } from '../journal/journal';
import { lockVessels } from '../vessels/vessel-lock';
import { operationResult } from './batch-detail';
import { checkFillTarget, glassCautions, markFilled, vesselVolume } from './fill-rules';

type BatchStart = z.output<typeof batchStartSchema>;

/** Today's start happened now; an earlier date is recorded at midday UTC of that day. */
function startMoment(startedOn: string, today: string, now: Date): Date {
  return startedOn === today ? now : new Date(`${startedOn}T12:00:00Z`);
}

/**
 * Starts a batch in the chosen vessels: each must be in this cellar, empty, in use, big
 * enough and sanitised (an unsanitised one only with an override reason, which is journalled).
 * Writes the 'started' entry. One transaction.
 */
export async function startBatch(actor: Actor, tx: EntityManager, request: BatchStart): Promise<OperationResult> {
  requireRole(actor, 'hand');
  const now = new Date();
  const cellar = await loadCellar(tx, actor.cellarId);
  const today = localDate(now, cellar.timeZone);
  if (request.startedOn > today)
    throw new BadRequestError(`body.startedOn: ${request.startedOn} is in the future; start the batch on the day it is made.`);

  const locked = await lockVessels(tx, actor, request.vessels);
  const overrideReason = request.override?.reason ?? null;
  let overrideUsed = false;
  for (const fill of request.vessels) {
    const needed = await checkFillTarget(tx, locked.get(fill.vesselId)!, fill.volumeL, cellar, overrideReason, now, actor.units);
    overrideUsed ||= needed;
  }

  const repo = tx.getRepository(Batch);
  const batch = await repo.save(
    repo.create({
      cellarId: actor.cellarId,
      name: request.name,
      kind: request.kind,
      ingredients: request.ingredients,
      yeastName: request.yeast.name,
      yeastToleranceAbv: request.yeast.toleranceAbv,
      plannedVolumeL: request.plannedVolumeL,
      startedOn: request.startedOn,
      og: request.og,
      targetSweetness: request.targetSweetness,
      notes: request.notes,
      createdBy: actor.userId,
    }),
  );
  const at = startMoment(request.startedOn, today, now);
  const filled = request.vessels.map((fill) => ({ vessel: locked.get(fill.vesselId)!, volumeL: fill.volumeL }));
  for (const { vessel, volumeL } of filled) {
    markFilled(vessel, batch.id, volumeL, at);
    await tx.getRepository(Vessel).save(vessel);
  }
  const entry = await appendEntry(
    tx,
    actor,
    batch.id,
    {
      kind: 'started',
      volumeL: roundLitres(filled.reduce((sum, f) => sum + f.volumeL, 0)),
      og: request.og,
      vessels: filled.map((f) => vesselVolume(f.vessel, f.volumeL)),
      parents: [],
      override: overrideUsed ? overrideReason : null,
    },
    { occurredAt: at },
  );
  return operationResult(tx, actor, batch.id, entry.id, glassCautions(filled.map((f) => f.vessel)));
}
