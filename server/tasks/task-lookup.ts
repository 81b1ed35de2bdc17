import type { EntityManager } from 'typeorm';
import type { Task } from '../../shared/schemas/tasks';
import type { Actor } from '../core/actor';
import { localDate } from '../core/local-date';
import { loadCellar } from '../cellars/load-cellar';
import { NotFoundError } from '../http/errors';
import { cellarTasks } from './cellar-tasks';

/** Far enough ahead that any task a screen shows can be found again by its key. */
export const FIND_LOOKAHEAD_DAYS = 400;

/** The cellar's time zone and local date now. */
export async function cellarToday(tx: EntityManager, cellarId: string, now = new Date()): Promise<{ timeZone: string; today: string }> {
  const { timeZone } = await loadCellar(tx, cellarId);
  return { timeZone, today: localDate(now, timeZone) };
}

/** One task of the actor's cellar by its key; 404 when the batch is not the cellar's or no such task exists now. */
export async function findTask(actor: Actor, tx: EntityManager, key: string): Promise<{ task: Task; today: string }> {
  const batchId = key.split('/')[0]!;
  const { timeZone, today } = await cellarToday(tx, actor.cellarId);
  const tasks = await cellarTasks(tx, actor.cellarId, timeZone, { batchId }, today, FIND_LOOKAHEAD_DAYS);
  const task = tasks.find((t) => t.key === key);
  if (!task) throw new NotFoundError('No such task in this cellar (it may have been completed by the journal or its plan changed).');
  return { task, today };
}
