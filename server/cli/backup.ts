/**
 * Backs up the app's database with pg_dump (custom format) into DATA_DIR/backups, named with
 * the time. Usage: `npm run backup` (DATABASE_URL, or the app's own cluster in DATA_DIR).
 */
import path from 'node:path';
import { loadConfig } from '../config';
import { backupDatabase, backupFileName } from '../db/pg-backup';
import { appDatabaseUrl } from './database-url';

const config = loadConfig();
const { url, stop } = await appDatabaseUrl(config);
try {
  const file = path.resolve(config.dataDir, 'backups', backupFileName());
  await backupDatabase(url, file);
  console.log(`Backup written: ${file}`);
} catch (error) {
  console.error(`Backup failed: ${error instanceof Error ? error.message : String(error)}`);
  process.exitCode = 1;
} finally {
  stop();
}
