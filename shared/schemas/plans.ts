import { z } from 'zod';
import { batchKindSchema, isoDateSchema, STAGES, type Stage } from './batches';

/**
 * Ageing plans as data: a plan is a named list of rules, each saying what to do, when (after
 * an anchor, or every so often while a condition holds, or once the gravity has held), until
 * when, and how many days ahead the task shows. The rule engine (shared/domain/plans) turns
 * a plan and a batch's journal into dated tasks.
 */

export const TASK_WHATS = [
  'reading',
  'racking',
  'headspace-check',
  'oak-check',
  'oak-out',
  'stabilise',
  'bottle',
  'tasting',
  'milestone',
  'custom',
] as const;
export const TASK_WHAT_LABELS: Record<(typeof TASK_WHATS)[number], string> = {
  reading: 'Take a reading',
  racking: 'Rack off the lees',
  'headspace-check': 'Check the headspace',
  'oak-check': 'Check the oak',
  'oak-out': 'Take it out',
  stabilise: 'Stabilise',
  bottle: 'Bottle',
  tasting: 'Taste',
  milestone: 'Milestone',
  custom: 'Task',
};
export const taskWhatSchema = z.enum(TASK_WHATS, { error: 'choose what the task is (reading, racking, headspace check…)' });
export type TaskWhat = z.infer<typeof taskWhatSchema>;

/** Moments a rule counts from. Each racking and each addition anchor a task of their own. */
export const ANCHORS = ['start', 'first-racking', 'each-racking', 'addition-in', 'take-out-date', 'bottling'] as const;
export const ANCHOR_LABELS: Record<(typeof ANCHORS)[number], string> = {
  start: 'the start',
  'first-racking': 'the first racking',
  'each-racking': 'each racking',
  'addition-in': 'an addition going in',
  'take-out-date': "an addition's take-out date",
  bottling: 'bottling',
};
export type Anchor = (typeof ANCHORS)[number];

/** Spans of a batch's life a repeating rule runs in. */
export const CONDITIONS = ['primary', 'secondary', 'bulk-ageing', 'racked', 'in-vessels', 'oak-in'] as const;
export const CONDITION_LABELS: Record<(typeof CONDITIONS)[number], string> = {
  primary: 'in primary',
  secondary: 'in secondary',
  'bulk-ageing': 'in bulk ageing',
  racked: 'racked and still in vessels',
  'in-vessels': 'in vessels',
  'oak-in': 'oak is in',
};
export type Condition = (typeof CONDITIONS)[number];

/** Events that end a rule. */
export const END_EVENTS = ['racking', 'stabilised', 'bottling'] as const;
export type EndEvent = (typeof END_EVENTS)[number];

export const PERIOD_UNITS = ['days', 'weeks', 'months'] as const;
export type PeriodUnit = (typeof PERIOD_UNITS)[number];

/** Ten years: anything longer is a typing slip, not a plan. */
export const MAX_PLAN_DAYS = 3650;
/** Ten years is 120 months. */
const UNIT_DAYS: Record<PeriodUnit, number> = { days: 1, weeks: 7, months: MAX_PLAN_DAYS / 120 };

const count = z.number({ error: 'enter a number of days, weeks or months' }).int('a whole number');

/** A length of time; `allowZero` for "on the day" (0 days after an anchor), never for a repeat. */
function periodSchema(allowZero: boolean) {
  return z
    .object({
      count: allowZero ? count.min(0, 'cannot be negative') : count.min(1, 'must be at least 1'),
      unit: z.enum(PERIOD_UNITS, { error: 'days, weeks or months' }),
    })
    .refine((p) => p.count * UNIT_DAYS[p.unit] <= MAX_PLAN_DAYS, { message: 'at most ten years', path: ['count'] });
}
export const periodSchema0 = periodSchema(true);
export type Period = z.infer<typeof periodSchema0>;

const whenSchema = z.discriminatedUnion(
  'type',
  [
    z.object({
      type: z.literal('after'),
      anchor: z.enum(ANCHORS, { error: 'count from the start, a racking, an addition or bottling' }),
      after: periodSchema(true),
    }),
    z.object({
      type: z.literal('every'),
      every: periodSchema(false),
      while: z.enum(CONDITIONS, { error: 'say while what it repeats (in primary, in secondary, oak is in…)' }),
      /** The first one falls this long after the span begins (default: one period). */
      firstAfter: periodSchema(true).optional(),
    }),
    z.object({
      type: z.literal('gravity-held'),
      days: count.min(1, 'must be at least 1').max(60, 'at most 60 days'),
      while: z.enum(CONDITIONS, { error: 'say while what it applies' }),
    }),
  ],
  { error: 'say when: after an anchor, every so often, or once the gravity has held' },
);
export type RuleWhen = z.infer<typeof whenSchema>;

const untilSchema = z.union([
  z.object({ stage: z.enum(STAGES, { error: 'a stage such as bottled' }) }),
  z.object({ event: z.enum(END_EVENTS, { error: 'racking, stabilised or bottling' }) }),
]);
export type RuleUntil = z.infer<typeof untilSchema>;

const STAGE_ORDER: Record<Stage, number> = { primary: 0, secondary: 1, 'bulk-ageing': 2, bottled: 3, finished: 4 };
/** The earliest stage a rule's own start can fall in; null when it can be any. */
function startsInStage(when: RuleWhen): Stage | null {
  if (when.type === 'after') return when.anchor === 'bottling' ? 'bottled' : when.anchor.includes('racking') ? 'secondary' : null;
  if (when.while === 'racked') return 'secondary';
  return when.while === 'secondary' || when.while === 'bulk-ageing' ? when.while : null;
}

/** Why a rule can never give a task, or null when it can. */
export function neverFiresReason(rule: { when: RuleWhen; until?: RuleUntil | null }): string | null {
  const until = rule.until;
  if (!until) return null;
  const from = startsInStage(rule.when);
  if ('stage' in until) {
    if (until.stage === 'primary') return 'every batch starts in primary, so this would end before it begins';
    if (from && STAGE_ORDER[until.stage] <= STAGE_ORDER[from])
      return `it starts ${from === 'bottled' ? 'at bottling' : `in ${from}`}, after it would end`;
  } else if (until.event === 'bottling' && from === 'bottled') return 'it starts at bottling, when it would already have ended';
  else if (until.event === 'racking' && rule.when.type === 'after' && rule.when.anchor.includes('racking'))
    return 'it counts from a racking, which is when it ends';
  return null;
}

export const ruleIdSchema = z.string().regex(/^[a-z0-9][a-z0-9-]{0,39}$/, 'a short id of lowercase letters, digits and dashes (it keys the tasks)');

export const planRuleSchema = z
  .object({
    id: ruleIdSchema,
    what: taskWhatSchema,
    /** Shown instead of the usual wording; required for a custom task. */
    title: z.string().trim().max(80, 'at most 80 characters').default(''),
    when: whenSchema,
    until: untilSchema.nullable().default(null),
    showDaysAhead: count.min(0, 'cannot be negative').max(90, 'at most 90 days'),
    /** Why this rule, e.g. "common practice: …". */
    note: z.string().trim().max(300, 'at most 300 characters').default(''),
  })
  .superRefine((rule, ctx) => {
    if (rule.what === 'custom' && !rule.title) ctx.addIssue({ code: 'custom', path: ['title'], message: 'give a custom task a title' });
    const never = neverFiresReason(rule);
    if (never) ctx.addIssue({ code: 'custom', path: ['until'], message: `this rule can never fire: ${never}` });
  });
export type PlanRule = z.output<typeof planRuleSchema>;
export type PlanRuleInput = z.input<typeof planRuleSchema>;

export const planRulesSchema = z
  .array(planRuleSchema)
  .max(40, 'at most 40 rules')
  .superRefine((rules, ctx) => {
    const seen = new Set<string>();
    rules.forEach((r, i) => {
      if (seen.has(r.id)) ctx.addIssue({ code: 'custom', path: [i, 'id'], message: `another rule already has the id ${r.id}` });
      seen.add(r.id);
    });
  });

export const planSchema = z.object({
  id: z.uuid(),
  name: z.string(),
  /** Batch kinds that follow this plan unless a Keeper assigns another. */
  defaultFor: z.array(batchKindSchema),
  rules: z.array(planRuleSchema),
  batchCount: z.number().int(),
  version: z.number().int(),
});
export type Plan = z.infer<typeof planSchema>;

export const planListSchema = z.array(planSchema);

export const planWriteSchema = z.object({
  name: z.string().trim().min(1, 'name the plan').max(80, 'at most 80 characters'),
  defaultFor: z.array(batchKindSchema).max(20).default([]),
  rules: planRulesSchema,
  /** The version the Keeper edited (for PUT); a stale one answers 409. */
  expectedVersion: z.number().int().optional(),
});
export type PlanWrite = z.input<typeof planWriteSchema>;

export const planAssignSchema = z.object({
  /** null: follow the default plan for the batch's kind. */
  planId: z.uuid().nullable(),
});

export const batchPlanSchema = z.object({
  batchId: z.uuid(),
  plan: z.object({ id: z.uuid(), name: z.string() }).nullable(),
  /** True when the plan is the default for the batch's kind, not one a Keeper chose. */
  byDefault: z.boolean(),
});
export type BatchPlan = z.infer<typeof batchPlanSchema>;

export { isoDateSchema };
