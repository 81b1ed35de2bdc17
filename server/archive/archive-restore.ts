import crypto from 'node:crypto';
import type { EntityManager } from 'typeorm';
import { JOURNAL_ARCHIVE_TABLE } from '../journal/journal-archive';
import { newLabelCode } from '../labels/label-codes';
import { photoEntry, tableEntry, type ArchivedPerson } from './archive-format';
import type { OpenedArchive } from './archive-reader';
import { ARCHIVE_TABLES, LABEL_CODE_TABLES, PHOTO_COLUMNS } from './archive-tables';
import { rescoredJournalRow, scoresOutOfTwenty } from './former-scores';

type Row = Record<string, unknown>;

/** A label code that was taken on this installation, and the one the restored thing got instead. */
export interface RemappedCode {
  table: (typeof LABEL_CODE_TABLES)[number];
  name: string;
  from: string;
  to: string;
}

const UUID = /[0-9a-f]{8}-[0-9a-f]{4}-[0-9a-f]{4}-[0-9a-f]{4}-[0-9a-f]{12}/g;
const WHOLE_UUID = /^[0-9a-f]{8}-[0-9a-f]{4}-[0-9a-f]{4}-[0-9a-f]{4}-[0-9a-f]{12}$/;

const parse = <T>(archive: OpenedArchive, name: string): T => JSON.parse(archive.entries.get(name)!.toString('utf8')) as T;

/**
 * Restores an opened archive as a new cellar kept by `keeperId`: every row gets a new id, and
 * every reference to an archived id follows it — in columns, inside journal payloads and in
 * text such as import keys. Authors are matched to this installation's accounts by e-mail
 * (unknown ones are left unnamed). Label codes already taken here are replaced and listed:
 * their printed labels must be reprinted. Runs in the caller's transaction: all or nothing.
 */
export async function restoreArchive(
  tx: EntityManager,
  archive: OpenedArchive,
  keeperId: string,
  name: string,
): Promise<{ cellarId: string; remappedCodes: RemappedCode[] }> {
  const cellar = parse<Row>(archive, 'cellar.json');
  const people = parse<ArchivedPerson[]>(archive, 'people.json');
  const tables = new Map(
    ARCHIVE_TABLES.map((t) => [t.name, archive.entries.has(tableEntry(t.name)) ? parse<Row[]>(archive, tableEntry(t.name)) : []]),
  );

  // New ids for the cellar and every archived row that has one.
  const ids = new Map<string, string | null>([[String(cellar.id), crypto.randomUUID()]]);
  for (const rows of tables.values()) for (const row of rows) if (typeof row.id === 'string') ids.set(row.id, crypto.randomUUID());
  // Authors: this installation's account with the same e-mail, or nobody.
  const local: { id: string; email: string }[] = await tx.query(`SELECT id, email FROM users WHERE email = ANY($1::text[])`, [
    people.map((p) => p.email),
  ]);
  const byEmail = new Map(local.map((u) => [u.email, u.id]));
  for (const person of people) ids.set(person.id, byEmail.get(person.email) ?? null);

  // Label codes taken here already: a fresh code each, listed.
  const codes = new Map<string, string>();
  const remappedCodes: RemappedCode[] = [];
  for (const table of LABEL_CODE_TABLES) {
    const rows = tables.get(table) ?? [];
    const taken: { code: string }[] = await tx.query(
      `SELECT code FROM vessels WHERE code = ANY($1) UNION SELECT code FROM bottle_lots WHERE code = ANY($1) UNION SELECT code FROM bottle_cases WHERE code = ANY($1)`,
      [rows.map((r) => r.code)],
    );
    const takenSet = new Set(taken.map((t) => t.code));
    for (const row of rows) {
      if (!takenSet.has(String(row.code))) continue;
      const fresh = await newLabelCode(tx);
      codes.set(String(row.code), fresh);
      remappedCodes.push({ table, name: String(row.name ?? row.number ?? row.code), from: String(row.code), to: fresh });
    }
  }

  const remap = (value: unknown): unknown => {
    if (typeof value === 'string') {
      if (WHOLE_UUID.test(value) && ids.has(value)) return ids.get(value);
      return value.replace(UUID, (id) => (ids.get(id) as string | undefined) ?? id);
    }
    if (Array.isArray(value)) return value.map(remap);
    if (value && typeof value === 'object')
      return Object.fromEntries(Object.entries(value).map(([k, v]) => [k, k === 'lotCode' ? (codes.get(String(v)) ?? v) : remap(v)]));
    return value;
  };

  const cellarId = ids.get(String(cellar.id))!;
  await insertRows(tx, 'cellars', [{ ...(remap(cellar) as Row), name }]);
  await tx.query(`INSERT INTO memberships (cellar_id, user_id, role) VALUES ($1, $2, 'keeper')`, [cellarId, keeperId]);
  for (const table of ARCHIVE_TABLES) {
    const rows = (tables.get(table.name) ?? []).map((row) => {
      let out = remap(row) as Row;
      // Tasting scores of archives written before our own scale move onto it, as the migration moved stored ones.
      if (table.name === JOURNAL_ARCHIVE_TABLE.name && scoresOutOfTwenty(archive.manifest.schema)) out = rescoredJournalRow(out);
      if ((LABEL_CODE_TABLES as readonly string[]).includes(table.name)) out.code = codes.get(String(row.code)) ?? row.code;
      if (table.name === 'photos') {
        for (const column of PHOTO_COLUMNS) out[column] = `\\x${archive.entries.get(photoEntry(String(row.id), column))!.toString('hex')}`;
      }
      return out;
    });
    await insertRows(tx, table.name, rows);
  }
  return { cellarId, remappedCodes };
}

/** Inserts JSON rows into a table by its own column types, a slice at a time. */
async function insertRows(tx: EntityManager, table: string, rows: Row[]): Promise<void> {
  for (let i = 0; i < rows.length; i += 500) {
    await tx.query(`INSERT INTO ${table} SELECT * FROM json_populate_recordset(NULL::${table}, $1::json)`, [JSON.stringify(rows.slice(i, i + 500))]);
  }
}
