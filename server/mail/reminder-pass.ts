import type { DataSource } from 'typeorm';
import { systemActor } from '../core/actor';
import { localDate } from '../core/local-date';
import { inTransaction } from '../core/unit-of-work';
import { tasksDue } from '../tasks/tasks.service';
import type { Task } from '../../shared/schemas/tasks';
import { enqueueMails, type OutgoingMessage } from './outbox';
import { reminderRecipients, type ReminderRecipient } from './reminder-settings';
import { reminderMail, type ReminderTask } from './templates/task-reminder-mail';
import { unsubscribeUrl } from './unsubscribe-links';

export interface ReminderPassOptions {
  /** The clock: tests move it. */
  now: Date;
  publicUrl: string;
  /** Signs unsubscribe links. */
  secret: string;
}

export interface ReminderPassResult {
  /** False when another instance was running the pass (it holds the lock). */
  ran: boolean;
  /** Messages new to the outbox (a key already there adds nothing). */
  enqueued: number;
}

/** The advisory lock of the pass: one key for the whole database, any number of app instances. */
export const REMINDER_PASS_LOCK = 7_204_931_001;

/** The hour (0–23) of a moment in a time zone. */
export function localHour(at: Date, timeZone: string): number {
  return Number(new Intl.DateTimeFormat('en-GB', { timeZone, hour: '2-digit', hourCycle: 'h23' }).format(at));
}

/**
 * The reminder pass. One transaction holds a PostgreSQL advisory lock, so two app instances
 * never run it at once (the second one skips). Each due, open task reaches each member who
 * asked for its kind: at once, one mail per task, or in one digest a day at the member's hour
 * in the cellar's time zone. Every message has a key the outbox keeps unique — task
 * occurrence × recipient for a reminder (the occurrence is the task key and its due or snooze
 * date), cellar × recipient × day for a digest — so running the pass again sends nothing twice.
 * The messages are enqueued in the same transaction: a failed pass sends nothing.
 */
export async function runReminderPass(ds: DataSource, options: ReminderPassOptions): Promise<ReminderPassResult> {
  return inTransaction(ds, 'write', async (tx) => {
    const [{ locked }]: { locked: boolean }[] = await tx.query(`SELECT pg_try_advisory_xact_lock($1) AS locked`, [REMINDER_PASS_LOCK]);
    if (!locked) return { ran: false, enqueued: 0 };
    const byCellar = new Map<string, ReminderRecipient[]>();
    for (const r of await reminderRecipients(tx)) byCellar.set(r.cellarId, [...(byCellar.get(r.cellarId) ?? []), r]);
    const messages: OutgoingMessage[] = [];
    for (const [cellarId, recipients] of byCellar) {
      const timeZone = recipients[0]!.timeZone;
      const today = localDate(options.now, timeZone);
      const tasks = await tasksDue(systemActor(cellarId, 'schedule', 'guest'), tx, { until: today });
      if (tasks.length === 0) continue;
      const hour = localHour(options.now, timeZone);
      for (const recipient of recipients) messages.push(...reminders(recipient, tasks, { ...options, today, hour }));
    }
    // One statement for all of them: the pass costs the same number of statements for 10 tasks or 2,000.
    return { ran: true, enqueued: await enqueueMails(tx, messages, options.publicUrl) };
  });
}

/** The messages one member should get now: a mail per wanted task, or today's digest. */
function reminders(r: ReminderRecipient, due: Task[], o: ReminderPassOptions & { today: string; hour: number }): OutgoingMessage[] {
  const wanted = due.filter((t) => r.settings.kinds.includes(t.what));
  if (wanted.length === 0) return [];
  const common = {
    cellarName: r.cellarName,
    recipientName: r.displayName,
    unsubscribeUrl: unsubscribeUrl(o.publicUrl, o.secret, r.cellarId, r.userId),
  };
  const message = (kind: 'task-reminder' | 'task-digest', dedupeKey: string, tasks: Task[]): OutgoingMessage => ({
    kind,
    cellarId: r.cellarId,
    to: r.email,
    dedupeKey,
    ...reminderMail({
      ...common,
      today: o.today,
      form: kind === 'task-digest' ? 'digest' : 'reminder',
      tasks: tasks.map((t) => asReminderTask(t, r.cellarId, o.publicUrl)),
    }),
  });
  if (r.settings.delivery === 'instant') {
    return wanted.map((t) => message('task-reminder', `task-reminder:${t.key}@${t.snoozedUntil ?? t.dueOn}:${r.userId}`, [t]));
  }
  if (r.settings.delivery === 'digest' && o.hour >= r.settings.digestHour) {
    return [message('task-digest', `task-digest:${r.cellarId}:${r.userId}:${o.today}`, wanted)];
  }
  return [];
}

function asReminderTask(t: Task, cellarId: string, publicUrl: string): ReminderTask {
  return {
    title: t.title,
    dueOn: t.snoozedUntil ?? t.dueOn,
    subject: t.vesselNames.length ? `${t.batch.name} in ${t.vesselNames.join(', ')}` : t.batch.name,
    url: `${publicUrl}/c/${cellarId}/batches/${t.batch.id}`,
  };
}
