import { pipeline } from 'node:stream/promises';
import type { Writable } from 'node:stream';
import zlib from 'node:zlib';
import tar from 'tar-stream';
import type { EntityManager } from 'typeorm';
import { migrations } from '../db/schema';
import { ARCHIVE_FORMAT, ARCHIVE_VERSION, photoEntry, sha256, tableEntry, type ArchivedPerson, type Manifest } from './archive-format';
import { ARCHIVE_TABLES, PHOTO_COLUMNS } from './archive-tables';

type Row = Record<string, unknown>;

/** Every user id a row names (authors, creators), for people.json. */
const USER_COLUMNS = ['author_id', 'created_by', 'uploaded_by', 'by_user_id', 'actor_id'];

/**
 * Writes one cellar's whole record as a tar.gz to `out`, table by table (a table's rows are in
 * memory while it is written; photos go entry by entry). Runs in the caller's read snapshot,
 * so the archive is one moment of the cellar.
 */
export async function writeArchive(tx: EntityManager, cellarId: string, out: Writable): Promise<void> {
  const pack = tar.pack();
  const finished = pipeline(pack, zlib.createGzip(), out);
  const checksums: Record<string, string> = {};
  const add = async (name: string, bytes: Buffer) => {
    checksums[name] = sha256(bytes);
    await new Promise<void>((resolve, reject) => pack.entry({ name, size: bytes.length }, bytes, (err) => (err ? reject(err) : resolve())));
  };
  const json = (value: unknown) => Buffer.from(JSON.stringify(value, null, 1));

  // Rows as PostgreSQL writes them in JSON: timestamps to the microsecond, numerics exact, bytea as \\x hex.
  const rowsOf = async (sql: string): Promise<Row[]> =>
    (await tx.query(`SELECT row_to_json(t) AS r FROM (${sql}) t`, [cellarId])).map((x: { r: Row }) => x.r);
  const [cellar] = await rowsOf(`SELECT * FROM cellars WHERE id = $1`);
  await add('cellar.json', json(cellar));
  const userIds = new Set<string>();
  for (const table of ARCHIVE_TABLES) {
    const rows = await rowsOf(table.rows);
    for (const row of rows) {
      for (const column of USER_COLUMNS) if (typeof row[column] === 'string') userIds.add(row[column] as string);
      if (table.name === 'photos') {
        for (const column of PHOTO_COLUMNS) {
          await add(photoEntry(row.id as string, column), Buffer.from(String(row[column]).replace(/^\\x/, ''), 'hex'));
          row[column] = null;
        }
      }
    }
    await add(tableEntry(table.name), json(rows));
  }
  const people: ArchivedPerson[] = await tx.query(`SELECT id, email, display_name AS name FROM users WHERE id = ANY($1::uuid[]) ORDER BY id`, [
    [...userIds],
  ]);
  await add('people.json', json(people));

  const manifest: Manifest = {
    format: ARCHIVE_FORMAT,
    version: ARCHIVE_VERSION,
    schema: migrations[migrations.length - 1].name,
    exportedAt: new Date().toISOString(),
    cellarName: String(cellar.name),
    checksums,
  };
  const manifestBytes = json(manifest);
  pack.entry({ name: 'manifest.json', size: manifestBytes.length }, manifestBytes);
  pack.finalize();
  await finished;
}
