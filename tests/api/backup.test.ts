import crypto from 'node:crypto';
import fs from 'node:fs';
import os from 'node:os';
import path from 'node:path';
import { afterAll, beforeAll, describe, expect, inject, it } from 'vitest';
import type { DataSource } from 'typeorm';
import { createDataSource } from '../../server/db/data-source';
import { recreateDatabase } from '../../server/db/ensure-database';
import { backupDatabase, backupFileName, NotEmptyDatabaseError, restoreDatabase } from '../../server/db/pg-backup';
import { makeBatchInVessels } from '../helpers/batches';
import { makeLotWithCases } from '../helpers/bottles';
import { makeCellarWithCrew } from '../helpers/crew';
import { addReadings, amendEntry } from '../helpers/journal';

/** Two databases of their own beside the test database: the one backed up and the one restored into. */
const suffix = crypto.randomBytes(4).toString('hex');
const urlOf = (db: string) => inject('databaseUrl').replace(/\/[^/?]*(\?.*)?$/, `/${db}$1`);
const adminUrl = urlOf('postgres');
const sourceUrl = urlOf(`backup_src_${suffix}`);
const targetUrl = urlOf(`backup_dst_${suffix}`);
const dir = fs.mkdtempSync(path.join(os.tmpdir(), 'cellarwright-backup-test-'));
let source: DataSource;

/** Every public table with its row count and a digest of its rows (in a fixed order). */
async function contents(url: string): Promise<Record<string, { rows: number; digest: string }>> {
  const ds = createDataSource(url);
  await ds.initialize();
  try {
    const tables: { name: string }[] = await ds.query(`SELECT tablename AS name FROM pg_tables WHERE schemaname = 'public' ORDER BY tablename`);
    const out: Record<string, { rows: number; digest: string }> = {};
    for (const { name } of tables) {
      const [row] = await ds.query(
        `SELECT count(*)::int AS rows, md5(coalesce(string_agg(t::text, '|' ORDER BY t::text), '')) AS digest FROM "${name}" t`,
      );
      out[name] = row;
    }
    return out;
  } finally {
    await ds.destroy();
  }
}

beforeAll(async () => {
  await recreateDatabase(adminUrl, `backup_src_${suffix}`);
  await recreateDatabase(adminUrl, `backup_dst_${suffix}`);
  source = createDataSource(sourceUrl);
  await source.initialize();
  await source.runMigrations();
  const crew = await makeCellarWithCrew(source);
  const { batch } = await makeBatchInVessels(source, crew, { name: 'Backed-up melomel', volumesL: [10] });
  const [first] = await addReadings(source, crew, batch.id, [
    { daysAgo: 20, sg: 1.09 },
    { daysAgo: 5, sg: 1.02 },
  ]);
  await amendEntry(source, crew, batch.id, first, { sg: 1.088 });
  await makeLotWithCases(source, crew.cellar.id, batch);
}, 60_000);

afterAll(async () => {
  await source?.destroy();
  fs.rmSync(dir, { recursive: true, force: true });
});

describe('database backup and restore (pg_dump / pg_restore)', () => {
  it('restores into an empty database with the same tables, row counts and contents', async () => {
    const file = path.join(dir, backupFileName(new Date('2026-12-03T06:30:00Z')));
    expect(path.basename(file)).toBe('cellarwright-2026-12-03T06-30-00Z.dump');
    await backupDatabase(sourceUrl, file);
    // The custom format starts with the magic bytes "PGDMP" (PostgreSQL docs, pg_dump -Fc; from memory).
    expect(fs.readFileSync(file).subarray(0, 5).toString('latin1')).toBe('PGDMP');

    await restoreDatabase(targetUrl, file);
    const [before, after] = [await contents(sourceUrl), await contents(targetUrl)];
    expect(Object.keys(after)).toEqual(Object.keys(before));
    expect(before.journal_entries.rows).toBe(4);
    expect(after).toEqual(before);
  }, 60_000);

  it('refuses a database that already has tables unless told to replace them', async () => {
    const file = path.join(dir, 'again.dump');
    await backupDatabase(sourceUrl, file);
    await expect(restoreDatabase(targetUrl, file)).rejects.toBeInstanceOf(NotEmptyDatabaseError);
    await restoreDatabase(targetUrl, file, { replace: true });
    expect(await contents(targetUrl)).toEqual(await contents(sourceUrl));
  }, 60_000);
});
