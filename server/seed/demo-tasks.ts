import type { EntityManager } from 'typeorm';
import { addDays } from '../../shared/domain/plans/local-dates';
import type { Actor } from '../core/actor';
import { ensureDefaultPlans } from '../plans/plan-queries';
import { listTasks, snoozeTask } from '../tasks/tasks.service';

/**
 * The demo cellar's plans and one snoozed task. The other tasks need no seeding: they follow
 * from the default plans and the demo journal (the stuck cyser's racking is overdue, the
 * traditional's first weekly reading was done by the reading logged on day six, the
 * melomel's oak comes out within the week).
 */
export async function seedDemoTasks(tx: EntityManager, people: { keeper: Actor; hand: Actor }): Promise<void> {
  await ensureDefaultPlans(tx, people.keeper.cellarId);
  const { today, tasks } = await listTasks(people.hand, tx, { withinDays: 14, limit: 200 });
  const waiting = tasks.find((t) => t.status === 'open' && t.bucket !== 'upcoming' && t.what !== 'racking' && t.what !== 'oak-out');
  if (waiting) await snoozeTask(people.hand, tx, waiting.key, addDays(today, 2));
}
