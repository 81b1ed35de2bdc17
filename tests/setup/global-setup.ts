import fs from 'node:fs';
import net from 'node:net';
import os from 'node:os';
import path from 'node:path';
import type { TestProject } from 'vitest/node';
import { createDataSource } from '../../server/db/data-source';
import { recreateDatabase } from '../../server/db/ensure-database';
import { startLocalPostgres, type LocalPostgres } from '../../server/db/local-postgres';

declare module 'vitest' {
  export interface ProvidedContext {
    databaseUrl: string;
  }
}

function freePort(): Promise<number> {
  return new Promise((resolve, reject) => {
    const server = net.createServer();
    server.once('error', reject);
    server.listen(0, '127.0.0.1', () => {
      const { port } = server.address() as net.AddressInfo;
      server.close(() => resolve(port));
    });
  });
}

let cluster: LocalPostgres | undefined;
let clusterDir: string | undefined;
// Each run gets its own cluster and database, so parallel runs never trip over each other.
const databaseName = `cellarwright_test_${process.pid}`;

/**
 * Starts a throwaway PostgreSQL cluster on loopback (or uses TEST_DATABASE_URL's server),
 * creates a fresh database, migrates it once and hands its URL to the test files.
 */
export async function setup(project: TestProject): Promise<void> {
  let adminUrl = process.env.TEST_DATABASE_ADMIN_URL;
  let urlFor = (db: string) => adminUrl!.replace(/\/[^/]*$/, `/${db}`);
  if (!adminUrl) {
    clusterDir = fs.mkdtempSync(path.join(os.tmpdir(), 'cellarwright-test-'));
    fs.chmodSync(clusterDir, 0o755);
    cluster = startLocalPostgres({
      dataDir: path.join(clusterDir, 'pg'),
      port: await freePort(),
      log: () => undefined,
    });
    adminUrl = cluster.adminUrl;
    urlFor = cluster.urlFor;
  }
  await recreateDatabase(adminUrl, databaseName);
  const databaseUrl = urlFor(databaseName);
  const ds = createDataSource(databaseUrl);
  await ds.initialize();
  await ds.runMigrations({ transaction: 'each' });
  // Every migration must also undo cleanly: revert all, then apply again.
  for (let i = 0; i < ds.migrations.length; i++) await ds.undoLastMigration({ transaction: 'each' });
  await ds.runMigrations({ transaction: 'each' });
  await ds.destroy();
  project.provide('databaseUrl', databaseUrl);
}

export async function teardown(): Promise<void> {
  cluster?.stop();
  if (clusterDir) fs.rmSync(clusterDir, { recursive: true, force: true });
}
