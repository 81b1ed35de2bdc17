import { addDays, daysBetween } from '@shared/domain/plans/local-dates';
import type { TaskWhat } from '@shared/schemas/plans';
import type { Task } from '@shared/schemas/tasks';

/** An icon for each kind of work. */
export const TASK_ICONS: Record<TaskWhat, string> = {
  reading: 'straighten',
  racking: 'move_down',
  'headspace-check': 'vertical_align_top',
  'oak-check': 'forest',
  'oak-out': 'forest',
  stabilise: 'science',
  bottle: 'wine_bar',
  tasting: 'local_bar',
  milestone: 'flag',
  custom: 'task_alt',
};

/** "Due today", "3 days overdue", "Due in 5 days", "Snoozed until 4 Dec", "Done by a reading". */
export function whenWords(task: Task, today: string, date: (iso: string) => string): string {
  if (task.status === 'done') return task.closed?.byJournal ? `Done: ${task.closed.reason}` : `Done${task.closed?.by ? ` by ${task.closed.by}` : ''}`;
  if (task.status === 'dismissed') return `Dismissed${task.closed?.reason ? `: ${task.closed.reason}` : ''}`;
  if (task.status === 'snoozed' && task.snoozedUntil) return `Snoozed until ${date(task.snoozedUntil)}`;
  const days = daysBetween(today, task.dueOn);
  if (days === 0) return 'Due today';
  if (days < 0) return `${-days} day${days === -1 ? '' : 's'} overdue`;
  return days === 1 ? 'Due tomorrow' : `Due in ${days} days (${date(task.dueOn)})`;
}

/** Snooze choices: one tap snoozes to tomorrow, the menu offers longer. */
export const SNOOZE_CHOICES = [
  { days: 1, label: 'Until tomorrow' },
  { days: 3, label: 'For 3 days' },
  { days: 7, label: 'For a week' },
] as const;

export const snoozeUntil = (today: string, days: number) => addDays(today, days);

/** A repeating task shows its next time only: later repeats of the same rule on the same batch wait. */
export function firstOfEachRule(tasks: Task[]): Task[] {
  const seen = new Set<string>();
  return tasks.filter((t) => {
    const rule = `${t.batch.id}/${t.rule?.id ?? t.key}`;
    if (seen.has(rule)) return false;
    seen.add(rule);
    return true;
  });
}
