import { z } from 'zod';
import { batchKindSchema, isoDateSchema, stageSchema } from './batches';
import { taskWhatSchema } from './plans';

/**
 * Dated tasks: computed from a batch's plan and journal (or added by hand as one-off tasks),
 * with what people did to them (done, snoozed, dismissed) stored under the task's key.
 */

export const TASK_STATUSES = ['open', 'done', 'snoozed', 'dismissed'] as const;
export const taskStatusSchema = z.enum(TASK_STATUSES);
export type TaskStatus = z.infer<typeof taskStatusSchema>;

/** Where a task falls for the maker on the cellar's today. */
export const TASK_BUCKETS = ['overdue', 'today', 'upcoming', 'done'] as const;
export const taskBucketSchema = z.enum(TASK_BUCKETS);
export type TaskBucket = z.infer<typeof taskBucketSchema>;

/** A stable task key: `<batch id>/<rule id>/<occurrence>` or `<batch id>/one-off/<id>`. */
export const taskKeySchema = z.string().regex(/^[0-9a-f-]{36}\/[a-z0-9-]{1,40}\/[A-Za-z0-9:._-]{1,80}$/, 'not a task of this cellar');

export const taskSchema = z.object({
  key: taskKeySchema,
  batch: z.object({ id: z.uuid(), name: z.string(), kind: batchKindSchema, stage: stageSchema }),
  vesselNames: z.array(z.string()),
  what: taskWhatSchema,
  title: z.string(),
  dueOn: isoDateSchema,
  /** The task shows from this date on. */
  showFrom: isoDateSchema,
  /** The rule that made it (null for a one-off task) and why it exists. */
  rule: z.object({ id: z.string(), note: z.string() }).nullable(),
  /** What it counts from, in words ("14 days after the racking of 2026-03-01"). */
  reason: z.string(),
  status: taskStatusSchema,
  bucket: taskBucketSchema,
  snoozedUntil: isoDateSchema.nullable(),
  /** Who closed it and when; `byJournal` when the journal shows the work was done. */
  closed: z
    .object({
      by: z.string().nullable(),
      at: z.string(),
      byJournal: z.boolean(),
      reason: z.string(),
    })
    .nullable(),
});
export type Task = z.infer<typeof taskSchema>;

export const taskListSchema = z.object({
  /** The cellar's local date the list was made for. */
  today: isoDateSchema,
  tasks: z.array(taskSchema),
  /** Tasks left out after `limit`. */
  more: z.number().int(),
});
export type TaskList = z.infer<typeof taskListSchema>;

const queryList = z
  .union([z.string(), z.array(z.string())])
  .transform((v) => (Array.isArray(v) ? v : v.split(',')).filter(Boolean))
  .pipe(z.array(taskBucketSchema));

export const taskListQuerySchema = z.object({
  batchId: z.uuid({ message: 'must be a batch id' }).optional(),
  kind: batchKindSchema.optional(),
  rackId: z.uuid({ message: 'must be a rack id' }).optional(),
  /** Which buckets; default overdue, today and upcoming. */
  buckets: queryList.optional(),
  /** Upcoming tasks due within this many days (default 30). */
  withinDays: z.coerce.number().int().min(0).max(366).default(30),
  limit: z.coerce.number().int().min(1).max(500).default(200),
});
export type TaskListQuery = z.input<typeof taskListQuerySchema>;

export const snoozeRequestSchema = z.object({ until: isoDateSchema });
export const dismissRequestSchema = z.object({ reason: z.string().trim().max(200, 'at most 200 characters').default('') });
export const taskActionParamsSchema = z.object({ key: taskKeySchema });

export const oneOffTaskRequestSchema = z.object({
  batchId: z.uuid({ message: 'choose a batch' }),
  title: z.string().trim().min(1, 'say what needs doing').max(80, 'at most 80 characters'),
  dueOn: isoDateSchema,
  showDaysAhead: z.number().int().min(0, 'cannot be negative').max(90, 'at most 90 days').default(3),
});
export type OneOffTaskRequest = z.input<typeof oneOffTaskRequestSchema>;

export const calendarFeedSchema = z.object({
  on: z.boolean(),
  /** Only in the answer that made the token: it is never shown again. */
  url: z.string().nullable(),
  createdAt: z.string().nullable(),
});
export type CalendarFeed = z.infer<typeof calendarFeedSchema>;
