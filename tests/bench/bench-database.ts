import fs from 'node:fs';
import os from 'node:os';
import path from 'node:path';
import type { DataSource } from 'typeorm';
import { createDataSource } from '../../server/db/data-source';
import { recreateDatabase } from '../../server/db/ensure-database';
import { startLocalPostgres } from '../../server/db/local-postgres';
import { freePort } from '../helpers/app-process';

/**
 * Runs a benchmark against a throwaway PostgreSQL cluster in a temporary folder, with every
 * migration applied; the cluster and the folder are gone afterwards, whatever happens.
 * @param work - gets the data source and the temporary folder (for files the bench writes)
 */
export async function withBenchDatabase<T>(work: (db: { ds: DataSource; dir: string }) => Promise<T>): Promise<T> {
  const dir = fs.mkdtempSync(path.join(os.tmpdir(), 'cellarwright-bench-'));
  fs.chmodSync(dir, 0o755);
  const cluster = startLocalPostgres({ dataDir: path.join(dir, 'pg'), port: await freePort(), log: () => undefined });
  try {
    await recreateDatabase(cluster.adminUrl, 'bench');
    const ds = createDataSource(cluster.urlFor('bench'));
    await ds.initialize();
    try {
      await ds.runMigrations();
      return await work({ ds, dir });
    } finally {
      await ds.destroy();
    }
  } finally {
    cluster.stop();
    fs.rmSync(dir, { recursive: true, force: true });
  }
}
