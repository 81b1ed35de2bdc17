import crypto from 'node:crypto';
import type { Express } from 'express';
import sharp from 'sharp';
import type { DataSource } from 'typeorm';
import { memberActor } from '../../server/core/actor';
import { seedDemoRecords } from '../../server/seed/demo-cellar';
import { crewWithAgents, type Crew } from './crew';
import { testApp } from './test-app';

/** The ids of one seeded cellar, by the name routes give them. */
export interface CellarIds {
  cellarId: string;
  batchId: string;
  vesselId: string;
  /** A vessel that holds nothing (routes that place or clean need one). */
  emptyVesselId: string;
  rackId: string;
  shelfId: string;
  lotId: string;
  caseId: string;
  photoId: string;
  /** An addition entry (for removals and amendments). */
  entryId: string;
  /** The Guest's user id (members are addressed by user id). */
  memberId: string;
  code: string;
  /** Every id of the cellar's records, to look for in answers meant for someone else. */
  all: Set<string>;
}

export interface SweepWorld {
  app: Express;
  ds: DataSource;
  crew: Crew;
  ids: CellarIds;
}

/**
 * A test app and a cellar filled with the demo records (racks, vessels, batches at every
 * stage, lots and cases, journal) plus a photo, with one signed-in agent per role. Limits are
 * raised so a sweep of thousands of requests is not cut short by them.
 */
export async function sweepWorld(app?: Express): Promise<SweepWorld> {
  const made = app
    ? { app, ds: (await testApp()).ds }
    : await testApp({ signInAttempts: 100_000, signInAttemptsPerClient: 100_000, scanLookupsPerMinute: 100_000 });
  const crew = await crewWithAgents(made.app, made.ds);
  const cellarId = crew.cellar.id;
  await made.ds.transaction((tx) =>
    seedDemoRecords(tx, { keeper: memberActor(cellarId, crew.keeper.id, 'keeper'), hand: memberActor(cellarId, crew.hand.id, 'hand') }),
  );
  const [batch] = await made.ds.query(`SELECT id FROM batches WHERE cellar_id = $1 ORDER BY started_on DESC LIMIT 1`, [cellarId]);
  const png = await sharp({ create: { width: 64, height: 48, channels: 3, background: '#6b4226' } })
    .png()
    .toBuffer();
  const upload = await crew.as.hand.post(`/api/cellars/${cellarId}/batches/${batch.id}/photos`).attach('photo', png, 'sweep.png');
  if (upload.status !== 201) throw new Error(`photo upload for the sweep failed: ${upload.status}`);
  return { ...made, crew, ids: await idsOf(made.ds, crew) };
}

async function firstId(ds: DataSource, sql: string, cellarId: string): Promise<string> {
  const [row] = await ds.query(sql, [cellarId]);
  return row?.id ?? crypto.randomUUID();
}

async function idsOf(ds: DataSource, crew: Crew): Promise<CellarIds> {
  const cellarId = crew.cellar.id;
  const q = (sql: string) => firstId(ds, sql, cellarId);
  const ids = {
    cellarId,
    batchId: await q(
      `SELECT id FROM batches WHERE cellar_id = $1 AND EXISTS (SELECT 1 FROM vessels v WHERE v.batch_id = batches.id) ORDER BY id LIMIT 1`,
    ),
    vesselId: await q(`SELECT id FROM vessels WHERE cellar_id = $1 AND batch_id IS NOT NULL ORDER BY id LIMIT 1`),
    emptyVesselId: await q(`SELECT id FROM vessels WHERE cellar_id = $1 AND batch_id IS NULL AND retired_at IS NULL ORDER BY id LIMIT 1`),
    rackId: await q(`SELECT id FROM racks WHERE cellar_id = $1 ORDER BY id LIMIT 1`),
    shelfId: await q(`SELECT s.id FROM shelves s JOIN racks r ON r.id = s.rack_id WHERE r.cellar_id = $1 ORDER BY s.id LIMIT 1`),
    lotId: await q(`SELECT id FROM bottle_lots WHERE cellar_id = $1 ORDER BY id LIMIT 1`),
    caseId: await q(`SELECT c.id FROM bottle_cases c JOIN bottle_lots l ON l.id = c.lot_id WHERE l.cellar_id = $1 ORDER BY c.id LIMIT 1`),
    photoId: await q(`SELECT id FROM photos WHERE cellar_id = $1 LIMIT 1`),
    entryId: await q(`SELECT id FROM journal_entries WHERE cellar_id = $1 AND kind = 'addition' ORDER BY id LIMIT 1`),
    memberId: crew.guest.id,
    code: (await ds.query(`SELECT code FROM vessels WHERE cellar_id = $1 ORDER BY id LIMIT 1`, [cellarId]))[0].code as string,
  };
  const every: { id: string }[] = await ds.query(
    `SELECT id::text FROM batches WHERE cellar_id = $1 UNION ALL SELECT id::text FROM vessels WHERE cellar_id = $1
     UNION ALL SELECT id::text FROM racks WHERE cellar_id = $1 UNION ALL SELECT id::text FROM bottle_lots WHERE cellar_id = $1
     UNION ALL SELECT id::text FROM journal_entries WHERE cellar_id = $1 UNION ALL SELECT id::text FROM photos WHERE cellar_id = $1`,
    [cellarId],
  );
  return { ...ids, all: new Set([cellarId, ...every.map((r) => r.id)]) };
}

/** The id a path parameter or body field of this name should carry in a cellar. */
export function idForField(ids: CellarIds, field: string): string {
  const f = field.toLowerCase();
  if (f === 'cellarid') return ids.cellarId;
  if (f.includes('additionentry') || f === 'entryid') return ids.entryId;
  if (f.includes('vessel')) return ids.vesselId;
  if (f.includes('batch')) return ids.batchId;
  if (f.includes('rack')) return ids.rackId;
  if (f.includes('shelf')) return ids.shelfId;
  if (f.includes('lot')) return ids.lotId;
  if (f.includes('case')) return ids.caseId;
  if (f.includes('photo')) return ids.photoId;
  if (f.includes('member') || f.includes('user')) return ids.memberId;
  return crypto.randomUUID();
}

/** A path pattern with its parameters filled from a cellar's ids. */
export function fillPath(pattern: string, ids: CellarIds, overrides: Partial<Record<string, string>> = {}): string {
  return pattern.replace(/:(\w+)/g, (_m, name: string) => overrides[name] ?? (name === 'code' ? ids.code : idForField(ids, name)));
}

/**
 * A fingerprint of everything stored for a cellar: each table with a cellar_id, hashed row by
 * row, plus the cellar row and its shelves, as `table=hash` lines. Equal before and after
 * means nothing was written; the lines that differ name what was.
 */
export async function cellarFingerprint(ds: DataSource, cellarId: string): Promise<string> {
  const tables: { table_name: string }[] = await ds.query(
    `SELECT table_name FROM information_schema.columns WHERE table_schema = 'public' AND column_name = 'cellar_id' ORDER BY table_name`,
  );
  const parts = tables.map(
    (t) =>
      `'${t.table_name}=' || (SELECT md5(coalesce(string_agg(x::text, '|' ORDER BY x::text), '')) FROM "${t.table_name}" x WHERE x.cellar_id = $1)`,
  );
  parts.push(`'cellars=' || (SELECT md5(c::text) FROM cellars c WHERE c.id = $1)`);
  parts.push(
    `'shelves=' || (SELECT md5(coalesce(string_agg(s::text, '|' ORDER BY s::text), '')) FROM shelves s JOIN racks r ON r.id = s.rack_id WHERE r.cellar_id = $1)`,
  );
  const [row] = await ds.query(`SELECT concat_ws(E'\\n', ${parts.join(', ')}) AS print`, [cellarId]);
  return row.print;
}
