import cron from 'node-cron';
import type { DataSource } from 'typeorm';
import { systemActor } from '../core/actor';
import { inTransaction } from '../core/unit-of-work';
import { refreshTaskSnapshots } from './task-snapshots';

/**
 * Brings every cellar's task snapshots up to date, one cellar per transaction, so the first list
 * of a cellar's day (its snapshots lapse at its own midnight) reads them ready instead of writing
 * them. Returns how many batches it wrote. Any instance may run it: a refresh already running
 * for a cellar makes the others pass that cellar by.
 */
export async function refreshEveryCellarsTaskSnapshots(ds: DataSource): Promise<number> {
  const cellars: { id: string }[] = await ds.query(`SELECT id FROM cellars ORDER BY id`);
  let written = 0;
  for (const { id } of cellars) {
    written += await inTransaction(ds, 'write', (tx) => refreshTaskSnapshots(systemActor(id, 'schedule', 'guest'), tx));
  }
  return written;
}

/** Runs the refresh on a node-cron schedule inside the app's process. */
export function scheduleTaskSnapshotRefresh(ds: DataSource, options: { schedule: string; log?: (line: string) => void }): { stop(): Promise<void> } {
  const task = cron.schedule(
    options.schedule,
    async () => {
      try {
        const written = await refreshEveryCellarsTaskSnapshots(ds);
        if (written) options.log?.(`[tasks] refreshed the task snapshots of ${written} batch(es)`);
      } catch (err) {
        options.log?.(`[tasks] task snapshot refresh failed: ${err instanceof Error ? err.message : String(err)}`);
      }
    },
    { name: 'task-snapshots', noOverlap: true },
  );
  return { stop: async () => void (await task.destroy()) };
}
