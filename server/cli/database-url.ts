import fs from 'node:fs';
import path from 'node:path';
import type { AppConfig } from '../config';
import { ensureDatabase } from '../db/ensure-database';
import { startLocalPostgres } from '../db/local-postgres';

/**
 * The app's database for a tool run beside it: DATABASE_URL, or the app's own cluster in
 * DATA_DIR (started for the tool if the app is not running, and stopped again after).
 */
export async function appDatabaseUrl(config: AppConfig): Promise<{ url: string; stop: () => void }> {
  if (config.databaseUrl) return { url: config.databaseUrl, stop: () => {} };
  if (!fs.existsSync(path.join(config.dataDir, 'pg'))) {
    throw new Error('No database yet: start the app once (npm start), or set DATABASE_URL.');
  }
  const local = startLocalPostgres({ dataDir: path.join(config.dataDir, 'pg'), port: config.pgPort, log: () => undefined });
  await ensureDatabase(local.adminUrl, 'cellarwright');
  return { url: local.urlFor('cellarwright'), stop: () => local.stop() };
}
