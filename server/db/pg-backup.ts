import { execFile } from 'node:child_process';
import fs from 'node:fs';
import path from 'node:path';
import { promisify } from 'node:util';
import pg from 'pg';
import { findPostgresBin } from './local-postgres';

const run = promisify(execFile);

/** Debian's client tools (pg_dump, pg_restore) of the newest installed PostgreSQL. */
function tool(name: 'pg_dump' | 'pg_restore'): string {
  const bin = findPostgresBin();
  const candidate = bin ? path.join(bin, name) : name;
  return bin && fs.existsSync(candidate) ? candidate : name;
}

/** `cellarwright-2026-12-03T06-30-00Z.dump`: sortable, and safe in every file system. */
export function backupFileName(at = new Date()): string {
  return `cellarwright-${at.toISOString().slice(0, 19).replace(/:/g, '-')}Z.dump`;
}

/**
 * Writes a pg_dump custom-format file of the database at `url` (every table, photos included:
 * they live in the database). The file is written beside its final name and renamed when
 * complete, so a half-written backup never carries a backup's name.
 */
export async function backupDatabase(url: string, file: string): Promise<void> {
  fs.mkdirSync(path.dirname(file), { recursive: true });
  const partial = `${file}.partial`;
  await run(tool('pg_dump'), ['--format=custom', '--no-owner', '--no-privileges', `--file=${partial}`, `--dbname=${url}`], {
    maxBuffer: 16 * 1024 * 1024,
  });
  fs.renameSync(partial, file);
}

/** Tables in the database's public schema: a fresh database has none. */
export async function tablesIn(url: string): Promise<string[]> {
  const client = new pg.Client({ connectionString: url });
  await client.connect();
  try {
    const { rows } = await client.query<{ name: string }>(`SELECT tablename AS name FROM pg_tables WHERE schemaname = 'public' ORDER BY tablename`);
    return rows.map((r) => r.name);
  } finally {
    await client.end();
  }
}

export class NotEmptyDatabaseError extends Error {}

/**
 * Restores a backup into the database at `url`, in one transaction (all or nothing). Refuses
 * a database that already has tables unless `replace` is set; then what the backup holds
 * replaces them (tables, data, functions and triggers of the backup are dropped first).
 */
export async function restoreDatabase(url: string, file: string, options: { replace?: boolean } = {}): Promise<void> {
  if (!fs.existsSync(file)) throw new Error(`No such backup file: ${file}`);
  const existing = await tablesIn(url);
  if (existing.length && !options.replace) {
    throw new NotEmptyDatabaseError(
      `The database already has ${existing.length} tables. Restore into an empty database, or add --replace to overwrite what is there.`,
    );
  }
  const args = ['--no-owner', '--no-privileges', '--single-transaction', '--exit-on-error', `--dbname=${url}`];
  if (existing.length) args.push('--clean', '--if-exists');
  await run(tool('pg_restore'), [...args, file], { maxBuffer: 16 * 1024 * 1024 });
}
