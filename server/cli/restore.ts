/**
 * Restores a backup made by `npm run backup` into the app's database (DATABASE_URL, or the
 * app's own cluster in DATA_DIR). Stop the app first. Refuses a database that has tables
 * unless --replace is given. Usage: `npm run restore -- FILE [--replace]`.
 */
import { loadConfig } from '../config';
import { restoreDatabase } from '../db/pg-backup';
import { appDatabaseUrl } from './database-url';

const args = process.argv.slice(2);
const file = args.find((a) => !a.startsWith('--'));
if (!file) {
  console.error('Usage: npm run restore -- FILE [--replace]');
  process.exit(2);
}
const config = loadConfig();
const { url, stop } = await appDatabaseUrl(config);
try {
  await restoreDatabase(url, file, { replace: args.includes('--replace') });
  console.log(`Restored ${file}.`);
} catch (error) {
  console.error(`Restore refused or failed: ${error instanceof Error ? error.message : String(error)}`);
  process.exitCode = 1;
} finally {
  stop();
}
