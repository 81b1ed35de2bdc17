import type { BatchFacts, FactEvent } from '../../../shared/domain/plans/batch-facts';
import type { computeTasks } from '../../../shared/domain/plans/compute-tasks';
import { DEFAULT_PLANS } from '../../../shared/domain/plans/default-plans';
import { planRulesSchema, type ANCHORS, type PlanRule, type PlanRuleInput } from '../../../shared/schemas/plans';

/** What the plan engine's tests share: one batch, the Mead plan, and short ways to write rules and facts. */
export const B = '00000000-0000-4000-8000-000000000001';
export const mead = planRulesSchema.parse(DEFAULT_PLANS.find((p) => p.name === 'Mead')!.rules);
export const rules = (...input: PlanRuleInput[]): PlanRule[] => planRulesSchema.parse(input);
export const facts = (stage: BatchFacts['stage'], events: FactEvent[], startedOn = '2026-03-01'): BatchFacts => ({
  batchId: B,
  startedOn,
  stage,
  events,
});
/** Each task as [its key without the batch id, its due date]. */
export const keysDue = (tasks: ReturnType<typeof computeTasks>) => tasks.map((t) => [t.key.slice(B.length + 1), t.dueOn]);
/** A rule's "when": so long after an anchor. */
export const after = (anchor: (typeof ANCHORS)[number], count: number, unit: 'days' | 'months' = 'days') =>
  ({ type: 'after', anchor, after: { count, unit } }) as const;
