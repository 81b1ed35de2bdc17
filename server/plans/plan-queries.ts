import crypto from 'node:crypto';
import type { EntityManager } from 'typeorm';
import { DEFAULT_PLANS } from '../../shared/domain/plans/default-plans';
import type { BatchKind } from '../../shared/schemas/batches';
import { planRulesSchema, type Plan, type PlanRule } from '../../shared/schemas/plans';

/**
 * The plans table: the cellar's plans with their rules (validated JSON), the default plans,
 * and which plan each batch follows. Until a cellar's plans are first written (by a write:
 * a Keeper's edit, an assignment, the demo seed), reads see the default plans as they would
 * be written, with the same ids, so a read never has to write and two first reads never race.
 */

/** The id a default plan gets in a cellar: the same before and after it is written. */
export function defaultPlanId(cellarId: string, name: string): string {
  const h = crypto.createHash('sha1').update(`cellarwright-default-plan:${cellarId}:${name}`).digest('hex');
  // Laid out as a name-based UUID (version 5, RFC 4122 variant).
  return `${h.slice(0, 8)}-${h.slice(8, 12)}-5${h.slice(13, 16)}-${((parseInt(h[16]!, 16) & 0x3) | 0x8).toString(16)}${h.slice(17, 20)}-${h.slice(20, 32)}`;
}

interface PlanRow {
  id: string;
  name: string;
  default_for: BatchKind[];
  rules: unknown;
  version: number;
  batch_count: number;
}

const toPlan = (row: PlanRow): Plan => ({
  id: row.id,
  name: row.name,
  defaultFor: row.default_for,
  // Rules were validated on the way in; parsing again fills defaults added since.
  rules: planRulesSchema.parse(row.rules),
  batchCount: row.batch_count,
  version: row.version,
});

/**
 * Writes the default plans (mead, fruit wine, cider) before a cellar's plans are first changed.
 * Once only: a Keeper who deletes a default plan does not get it back. Call it from writes only.
 */
export async function ensureDefaultPlans(tx: EntityManager, cellarId: string): Promise<void> {
  if (await plansWritten(tx, cellarId)) return;
  const seeded: unknown[] = await tx.query(`INSERT INTO plan_seedings (cellar_id) VALUES ($1) ON CONFLICT DO NOTHING RETURNING cellar_id`, [
    cellarId,
  ]);
  if (seeded.length === 0) return;
  for (const plan of DEFAULT_PLANS) {
    await tx.query(`INSERT INTO plans (id, cellar_id, name, default_for, rules) VALUES ($1, $2, $3, $4, $5) ON CONFLICT DO NOTHING`, [
      defaultPlanId(cellarId, plan.name),
      cellarId,
      plan.name,
      plan.defaultFor,
      JSON.stringify(planRulesSchema.parse(plan.rules)),
    ]);
  }
}

const PLAN_COLUMNS = `p.id, p.name, p.default_for, p.rules, p.version,
  (SELECT COUNT(*)::int FROM batches b WHERE b.cellar_id = p.cellar_id AND b.stage <> 'finished'
     AND (b.plan_id = p.id OR (b.plan_id IS NULL AND b.kind = ANY(p.default_for)))) AS batch_count`;

async function plansWritten(tx: EntityManager, cellarId: string): Promise<boolean> {
  const [row]: unknown[] = await tx.query(`SELECT 1 FROM plan_seedings WHERE cellar_id = $1`, [cellarId]);
  return row !== undefined;
}

/** The default plans as they will be written, for a cellar whose plans were never written. */
async function unwrittenDefaults(tx: EntityManager, cellarId: string): Promise<Plan[]> {
  // No batch can have chosen a plan yet (choosing one writes the plans first).
  const counts: { kind: BatchKind; n: number }[] = await tx.query(
    `SELECT kind, COUNT(*)::int AS n FROM batches WHERE cellar_id = $1 AND stage <> 'finished' GROUP BY kind`,
    [cellarId],
  );
  return DEFAULT_PLANS.map((plan) => ({
    id: defaultPlanId(cellarId, plan.name),
    name: plan.name,
    defaultFor: plan.defaultFor,
    rules: planRulesSchema.parse(plan.rules),
    batchCount: counts.filter((c) => plan.defaultFor.includes(c.kind)).reduce((sum, c) => sum + c.n, 0),
    version: 1,
  })).sort((a, b) => a.name.localeCompare(b.name));
}

/** The cellar's plans by name. */
export async function plansOf(tx: EntityManager, cellarId: string): Promise<Plan[]> {
  if (!(await plansWritten(tx, cellarId))) return unwrittenDefaults(tx, cellarId);
  const rows: PlanRow[] = await tx.query(`SELECT ${PLAN_COLUMNS} FROM plans p WHERE p.cellar_id = $1 ORDER BY p.name`, [cellarId]);
  return rows.map(toPlan);
}

/** One plan of the cellar, or null. */
export async function findPlan(tx: EntityManager, cellarId: string, planId: string): Promise<Plan | null> {
  if (!(await plansWritten(tx, cellarId))) return (await unwrittenDefaults(tx, cellarId)).find((p) => p.id === planId) ?? null;
  const rows: PlanRow[] = await tx.query(`SELECT ${PLAN_COLUMNS} FROM plans p WHERE p.cellar_id = $1 AND p.id = $2`, [cellarId, planId]);
  return rows[0] ? toPlan(rows[0]) : null;
}

/** Which plan a batch follows: the one a Keeper assigned, else the first plan (by name) that is the default for its kind. */
export function planFor(plans: readonly Plan[], batch: { kind: BatchKind; planId: string | null }): { plan: Plan | null; byDefault: boolean } {
  if (batch.planId) {
    const chosen = plans.find((p) => p.id === batch.planId);
    if (chosen) return { plan: chosen, byDefault: false };
  }
  return { plan: plans.find((p) => p.defaultFor.includes(batch.kind)) ?? null, byDefault: true };
}

export type { PlanRule };
