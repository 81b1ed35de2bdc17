import fs from 'node:fs';
import os from 'node:os';
import path from 'node:path';
import type { DataSource } from 'typeorm';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { createDataSource } from '../../server/db/data-source';
import type { Vessel } from '../../server/entities/vessel.entity';
import { recreateDatabase } from '../../server/db/ensure-database';
import { startLocalPostgres, type LocalPostgres } from '../../server/db/local-postgres';
import { freePort, signInCookie, startAppProcess, type AppProcess } from '../helpers/app-process';
import { makeBatchInVessels } from '../helpers/batches';
import { makeCellarWithCrew, TEST_PASSWORD, type CellarCrew } from '../helpers/crew';
import { sanitisedVessel } from '../helpers/vessels';

/**
 * Faults around a running app, a real child process on a cluster of this file's own: the
 * database stopped and started under it, and the app killed with SIGKILL in a burst of
 * rackings. Nothing here is mocked; the checks read the database afterwards.
 */

let dir: string;
let pgPort: number;
let cluster: LocalPostgres;
let databaseUrl: string;
let ds: DataSource | undefined;
let app: AppProcess | undefined;
let appPort: number;
let crew: CellarCrew;

const startCluster = () => startLocalPostgres({ dataDir: path.join(dir, 'pg'), port: pgPort, log: () => undefined });
const startApp = () => startAppProcess({ databaseUrl, port: appPort, dataDir: path.join(dir, 'app') });

async function openDataSource(): Promise<DataSource> {
  ds = createDataSource(databaseUrl);
  return ds.initialize();
}

async function closeDataSource(): Promise<void> {
  await ds?.destroy();
  ds = undefined;
}

beforeAll(async () => {
  dir = fs.mkdtempSync(path.join(os.tmpdir(), 'cellarwright-faults-'));
  fs.chmodSync(dir, 0o755);
  pgPort = await freePort();
  appPort = await freePort();
  cluster = startCluster();
  await recreateDatabase(cluster.adminUrl, 'cellarwright_faults');
  databaseUrl = cluster.urlFor('cellarwright_faults');
  const db = await openDataSource();
  await db.runMigrations({ transaction: 'each' });
  crew = await makeCellarWithCrew(db, 'Faults cellar');
  app = await startApp();
}, 90_000);

afterAll(async () => {
  await app?.kill('SIGTERM');
  await closeDataSource();
  cluster?.stop();
  if (dir) fs.rmSync(dir, { recursive: true, force: true });
}, 60_000);

const get = (cookie: string, url: string) => fetch(`${app!.baseUrl}${url}`, { headers: { cookie, accept: 'application/json' } });

describe('the database stopped and started under a running app', () => {
  it('answers a plain 503 while it is down, keeps running, and answers again once it is back, without a restart', async () => {
    const db = ds!;
    const { vessels } = await makeBatchInVessels(db, crew, { volumesL: [10] });
    const cookie = await signInCookie(app!.baseUrl, crew.hand.email, TEST_PASSWORD);
    const vesselUrl = `/api/cellars/${crew.cellar.id}/vessels/${vessels[0].id}`;
    expect((await get(cookie, vesselUrl)).status).toBe(200);

    await closeDataSource();
    cluster.stop();
    for (const url of [vesselUrl, `/api/cellars/${crew.cellar.id}/batches`, '/api/health']) {
      const res = await get(cookie, url);
      expect(res.status, url).toBe(503);
      const body = await res.json();
      // The session is read first, so even the health check meets the plain answer.
      expect(body, url).toEqual({
        error: 'database_unavailable',
        message: 'The cellar’s database is not answering just now. Try again in a moment.',
      });
      expect(JSON.stringify(body), url).not.toMatch(/ECONNREFUSED|at .*\.ts|stack/i);
    }
    const write = await fetch(`${app!.baseUrl}/api/cellars/${crew.cellar.id}/vessels/${vessels[0].id}/cleaning`, {
      method: 'POST',
      headers: { cookie, 'content-type': 'application/json' },
      body: JSON.stringify({ state: 'clean' }),
    });
    expect(write.status).toBe(503);
    expect(app!.child.exitCode, app!.output()).toBeNull();

    cluster = startCluster();
    const backAt = Date.now();
    let status = 0;
    while (Date.now() - backAt < 15_000) {
      status = (await get(cookie, vesselUrl).catch(() => null))?.status ?? 0;
      if (status === 200) break;
      await new Promise((resolve) => setTimeout(resolve, 100));
    }
    expect(status, app!.output()).toBe(200);
    console.log(`[faults] the app answered again ${Date.now() - backAt} ms after its database was back, same process ${app!.child.pid}`);
    await openDataSource();
  }, 60_000);
});

/** What the journal says each vessel holds: the start, then every racking (source emptied, targets filled). */
async function contentsFromJournal(db: DataSource, batchId: string): Promise<Map<string, number>> {
  type Held = { vesselId: string; volumeL: number };
  const entries: { kind: string; payload: { vessels?: Held[]; from?: Held[]; to?: Held[] } }[] = await db.query(
    `SELECT kind, payload FROM journal_entries WHERE batch_id = $1 ORDER BY occurred_at, recorded_at, id`,
    [batchId],
  );
  const held = new Map<string, number>();
  for (const e of entries) {
    if (e.kind === 'started') for (const v of e.payload.vessels!) held.set(v.vesselId, v.volumeL);
    else if (e.kind === 'racked') {
      for (const v of e.payload.from!) held.delete(v.vesselId);
      for (const v of e.payload.to!) held.set(v.vesselId, v.volumeL);
    } else throw new Error(`unexpected ${e.kind} entry in this scenario`);
  }
  return held;
}

describe('a kill -9 in a burst of rackings', () => {
  it('leaves every batch’s journal agreeing with what its vessels hold, after a restart', async () => {
    const db = ds ?? (await openDataSource());
    const BATCHES = 20;
    const batches: Awaited<ReturnType<typeof makeBatchInVessels>>[] = [];
    for (let i = 0; i < BATCHES; i++) batches.push(await makeBatchInVessels(db, crew, { volumesL: [10], name: `Burst batch ${i}` }));
    const spares: Vessel[] = [];
    for (let i = 0; i < BATCHES; i++) spares.push(await sanitisedVessel(db, crew.cellar.id, { capacityL: 12 }));
    const cookie = await signInCookie(app!.baseUrl, crew.hand.email, TEST_PASSWORD);

    // Two rackings per batch, into its own spare and its neighbour's: each batch and each spare
    // can be won once, so some requests lose with 409 and some are cut off by the kill.
    const answers: { status: number; entryId?: string }[] = [];
    const requests = batches.flatMap(({ batch, vessels }, i) =>
      [spares[i], spares[(i + 1) % BATCHES]].map((target) =>
        fetch(`${app!.baseUrl}/api/cellars/${crew.cellar.id}/batches/${batch.id}/rackings`, {
          method: 'POST',
          headers: { cookie, 'content-type': 'application/json' },
          body: JSON.stringify({ from: [{ vesselId: vessels[0].id }], to: [{ vesselId: target.id, volumeL: 9.5 }] }),
        })
          .then(async (res) => answers.push({ status: res.status, entryId: res.status === 201 ? (await res.json()).entryId : undefined }))
          .catch(() => answers.push({ status: 0 })),
      ),
    );
    while (answers.length < 10) await new Promise((resolve) => setTimeout(resolve, 5));
    await app!.kill('SIGKILL');
    await Promise.all(requests);
    const cut = answers.filter((a) => a.status === 0).length;
    const won = answers.filter((a) => a.status === 201);
    console.log(
      `[faults] ${requests.length} rackings: ${won.length} recorded, ${answers.filter((a) => a.status === 409).length} refused, ${cut} cut off by the kill`,
    );
    expect(cut).toBeGreaterThan(0);
    expect(answers.every((a) => [0, 201, 409].includes(a.status))).toBe(true);

    app = await startApp();
    let rackedBatches = 0;
    for (const { batch } of batches) {
      const fromJournal = await contentsFromJournal(db, batch.id);
      const rows: { id: string; volumeL: number }[] = await db.query(`SELECT id, volume_l::float8 AS "volumeL" FROM vessels WHERE batch_id = $1`, [
        batch.id,
      ]);
      expect(new Map(rows.map((r) => [r.id, r.volumeL])), batch.name).toEqual(fromJournal);
      if (!fromJournal.has(batches.find((b) => b.batch.id === batch.id)!.vessels[0].id)) rackedBatches += 1;
    }
    // Every answer of 201 the client saw is in the journal (it was committed before the answer).
    for (const { entryId } of won) {
      expect((await db.query(`SELECT 1 FROM journal_entries WHERE id = $1`, [entryId])).length).toBe(1);
    }
    expect(rackedBatches).toBeGreaterThanOrEqual(won.length);
    // No spare holds two batches, and an emptied source is dirty, as a racking leaves it.
    const sources = batches.map((b) => b.vessels[0].id);
    const emptiedDirty: { n: number }[] = await db.query(
      `SELECT count(*)::int AS n FROM vessels WHERE id = ANY($1) AND batch_id IS NULL AND cleaning_state <> 'dirty'`,
      [sources],
    );
    expect(emptiedDirty[0].n).toBe(0);
    // The restarted app reads the same.
    const fresh = await signInCookie(app.baseUrl, crew.keeper.email, TEST_PASSWORD);
    const page = await (await get(fresh, `/api/cellars/${crew.cellar.id}/batches?q=Burst&pageSize=50`)).json();
    expect(page.items.map((b: { volumeL: number }) => b.volumeL).sort()).toEqual(
      await Promise.all(batches.map(async ({ batch }) => [...(await contentsFromJournal(db, batch.id)).values()].reduce((a, b) => a + b, 0))).then(
        (v) => v.sort(),
      ),
    );
  }, 60_000);
});
