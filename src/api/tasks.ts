import {
  calendarFeedSchema,
  taskListSchema,
  taskSchema,
  type CalendarFeed,
  type OneOffTaskRequest,
  type Task,
  type TaskBucket,
  type TaskList,
} from '@shared/schemas/tasks';
import type { BatchKind } from '@shared/schemas/batches';
import { request, cellarPath, withQuery } from './http';

export interface TaskFilter {
  batchId?: string;
  kind?: BatchKind;
  rackId?: string;
  buckets?: TaskBucket[];
  withinDays?: number;
}

export const fetchTasks = (cellarId: string, filter: TaskFilter = {}): Promise<TaskList> =>
  request('GET', withQuery(cellarPath(cellarId, 'tasks'), { ...filter, buckets: filter.buckets?.join(',') }), taskListSchema);

export const markTaskDone = (cellarId: string, key: string): Promise<Task> =>
  request('POST', cellarPath(cellarId, 'tasks', 'done'), taskSchema, { key });

export const snoozeTask = (cellarId: string, key: string, until: string): Promise<Task> =>
  request('POST', cellarPath(cellarId, 'tasks', 'snooze'), taskSchema, { key, until });

export const dismissTask = (cellarId: string, key: string, reason = ''): Promise<Task> =>
  request('POST', cellarPath(cellarId, 'tasks', 'dismiss'), taskSchema, { key, reason });

/** Undo of done, snooze and dismiss. */
export const reopenTask = (cellarId: string, key: string): Promise<Task> =>
  request('POST', cellarPath(cellarId, 'tasks', 'reopen'), taskSchema, { key });

export const addOneOffTask = (cellarId: string, body: OneOffTaskRequest): Promise<Task> =>
  request('POST', cellarPath(cellarId, 'tasks', 'one-off'), taskSchema, body);

export const fetchCalendarFeed = (cellarId: string): Promise<CalendarFeed> =>
  request('GET', cellarPath(cellarId, 'calendar-feed'), calendarFeedSchema);

/** Turns the feed on or gives it a new URL; the answer is the only time the URL is shown. */
export const turnOnCalendarFeed = (cellarId: string): Promise<CalendarFeed> =>
  request('POST', cellarPath(cellarId, 'calendar-feed'), calendarFeedSchema);

export const turnOffCalendarFeed = (cellarId: string): Promise<CalendarFeed> =>
  request('POST', cellarPath(cellarId, 'calendar-feed', 'off'), calendarFeedSchema);
