import cron from 'node-cron';
import type { DataSource } from 'typeorm';
import { runReminderPass } from './reminder-pass';

export interface ReminderJobOptions {
  /** Cron expression of the pass, e.g. every five minutes. */
  schedule: string;
  publicUrl: string;
  secret: string;
  log?: (line: string) => void;
}

/**
 * Runs the reminder pass on a node-cron schedule inside the app's process. Every instance may
 * run it: the pass's advisory lock lets one through at a time, and the outbox's unique keys
 * keep a later run from repeating a mail.
 */
export function scheduleReminderPass(ds: DataSource, options: ReminderJobOptions): { stop(): Promise<void> } {
  const task = cron.schedule(
    options.schedule,
    async () => {
      try {
        const result = await runReminderPass(ds, { now: new Date(), publicUrl: options.publicUrl, secret: options.secret });
        if (result.enqueued) options.log?.(`[mail] reminder pass queued ${result.enqueued} mail(s)`);
      } catch (err) {
        options.log?.(`[mail] reminder pass failed: ${err instanceof Error ? err.message : String(err)}`);
      }
    },
    { name: 'reminder-pass', noOverlap: true },
  );
  return { stop: async () => void (await task.destroy()) };
}
