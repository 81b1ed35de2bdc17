import type { EntityManager } from 'typeorm';
import type { z } from 'zod';
import type { BatchPlan, Plan, planWriteSchema } from '../../shared/schemas/plans';
import type { BatchKind } from '../../shared/schemas/batches';
import { requireRole, type Actor } from '../core/actor';
import { ConflictError, NotFoundError } from '../http/errors';
import { ensureDefaultPlans, findPlan, planFor, plansOf } from './plan-queries';

type PlanWrite = z.output<typeof planWriteSchema>;

/** TypeORM answers UPDATE and DELETE … RETURNING as [rows, count]. */
const returnedRows = (result: unknown[]): unknown[] => (Array.isArray(result[0]) ? (result[0] as unknown[]) : result);

/** The cellar's plans (the default ones until a Keeper changes something). */
export async function listPlans(actor: Actor, tx: EntityManager): Promise<Plan[]> {
  requireRole(actor, 'guest');
  return plansOf(tx, actor.cellarId);
}

/** A new plan; its rules were validated by the shared schema. */
export async function createPlan(actor: Actor, tx: EntityManager, write: PlanWrite): Promise<Plan> {
  requireRole(actor, 'keeper');
  await ensureDefaultPlans(tx, actor.cellarId);
  const [row]: { id: string }[] = await tx.query(`INSERT INTO plans (cellar_id, name, default_for, rules) VALUES ($1, $2, $3, $4) RETURNING id`, [
    actor.cellarId,
    write.name,
    write.defaultFor,
    JSON.stringify(write.rules),
  ]);
  return (await findPlan(tx, actor.cellarId, row!.id))!;
}

/** Replaces a plan's name, default kinds and rules; its batches' tasks follow at once (they are derived). */
export async function updatePlan(actor: Actor, tx: EntityManager, planId: string, write: PlanWrite): Promise<Plan> {
  requireRole(actor, 'keeper');
  await ensureDefaultPlans(tx, actor.cellarId);
  const [current]: { version: number }[] = await tx.query(`SELECT version FROM plans WHERE id = $1 AND cellar_id = $2 FOR UPDATE`, [
    planId,
    actor.cellarId,
  ]);
  if (!current) throw new NotFoundError('No such plan in this cellar.');
  if (write.expectedVersion !== undefined && write.expectedVersion !== current.version) {
    throw new ConflictError('Someone changed this plan meanwhile. Reload it and make your change again.');
  }
  await tx.query(
    `UPDATE plans SET name = $3, default_for = $4, rules = $5, version = version + 1, updated_at = now() WHERE id = $1 AND cellar_id = $2`,
    [planId, actor.cellarId, write.name, write.defaultFor, JSON.stringify(write.rules)],
  );
  return (await findPlan(tx, actor.cellarId, planId))!;
}

/** Deletes a plan; batches that followed it by choice go back to the default for their kind. */
export async function deletePlan(actor: Actor, tx: EntityManager, planId: string): Promise<void> {
  requireRole(actor, 'keeper');
  await ensureDefaultPlans(tx, actor.cellarId);
  const deleted = returnedRows(await tx.query(`DELETE FROM plans WHERE id = $1 AND cellar_id = $2 RETURNING id`, [planId, actor.cellarId]));
  if (deleted.length === 0) throw new NotFoundError('No such plan in this cellar.');
}

async function batchPlanOf(tx: EntityManager, cellarId: string, batchId: string): Promise<BatchPlan> {
  const [batch]: { kind: BatchKind; plan_id: string | null }[] = await tx.query(
    `SELECT kind, plan_id FROM batches WHERE id = $1 AND cellar_id = $2`,
    [batchId, cellarId],
  );
  if (!batch) throw new NotFoundError('No such batch in this cellar.');
  const { plan, byDefault } = planFor(await plansOf(tx, cellarId), { kind: batch.kind, planId: batch.plan_id });
  return { batchId, plan: plan ? { id: plan.id, name: plan.name } : null, byDefault };
}

/** The plan a batch follows, and whether it is the default for its kind. */
export async function getBatchPlan(actor: Actor, tx: EntityManager, batchId: string): Promise<BatchPlan> {
  requireRole(actor, 'guest');
  return batchPlanOf(tx, actor.cellarId, batchId);
}

/** Puts a batch on a plan of the cellar, or back on the default for its kind (null). */
export async function assignPlan(actor: Actor, tx: EntityManager, batchId: string, planId: string | null): Promise<BatchPlan> {
  requireRole(actor, 'keeper');
  await ensureDefaultPlans(tx, actor.cellarId);
  if (planId && !(await findPlan(tx, actor.cellarId, planId))) throw new NotFoundError('No such plan in this cellar.');
  const updated = returnedRows(
    await tx.query(`UPDATE batches SET plan_id = $3 WHERE id = $1 AND cellar_id = $2 RETURNING id`, [batchId, actor.cellarId, planId]),
  );
  if (updated.length === 0) throw new NotFoundError('No such batch in this cellar.');
  return batchPlanOf(tx, actor.cellarId, batchId);
}
