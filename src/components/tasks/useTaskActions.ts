import { useQuasar } from 'quasar';
import { ref } from 'vue';
import type { Task } from '@shared/schemas/tasks';
import { ApiError } from '@/api/http';
import { dismissTask, markTaskDone, reopenTask, snoozeTask } from '@/api/tasks';
import { snoozeUntil } from './task-words';

export type TaskAction = { kind: 'done' } | { kind: 'snooze'; days: number } | { kind: 'dismiss' };

/**
 * Done, snooze and dismiss in one tap, each with Undo in the message that confirms it.
 * `changed` is called after every change (and undo) so the screen reloads its list.
 */
export function useTaskActions(cellarId: () => string, today: () => string, changed: () => void) {
  const $q = useQuasar();
  const busyKey = ref<string | null>(null);

  const failed = (err: unknown, fallback: string) => $q.notify({ type: 'negative', message: err instanceof ApiError ? err.message : fallback });

  async function undo(task: Task) {
    try {
      await reopenTask(cellarId(), task.key);
      changed();
    } catch (err) {
      failed(err, 'Could not undo.');
    }
  }

  async function act(task: Task, action: TaskAction) {
    busyKey.value = task.key;
    try {
      let message: string;
      if (action.kind === 'done') {
        await markTaskDone(cellarId(), task.key);
        message = `Done: ${task.title}`;
      } else if (action.kind === 'snooze') {
        await snoozeTask(cellarId(), task.key, snoozeUntil(today(), action.days));
        message = `Snoozed: ${task.title}`;
      } else {
        await dismissTask(cellarId(), task.key);
        message = `Dismissed: ${task.title}`;
      }
      changed();
      $q.notify({ message, timeout: 7000, actions: [{ label: 'Undo', color: 'white', handler: () => void undo(task) }] });
    } catch (err) {
      failed(err, 'Could not change the task.');
    } finally {
      busyKey.value = null;
    }
  }

  return { act, busyKey };
}
