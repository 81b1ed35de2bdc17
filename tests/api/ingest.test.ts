import request from 'supertest';
import { beforeAll, describe, expect, it } from 'vitest';
import { deviceListSchema, deviceSeriesSchema, deviceWithTokenSchema, type DeviceWithToken } from '../../shared/schemas/devices';
import crypto from 'node:crypto';
import { memberActor } from '../../server/core/actor';
import { seedDemoRecords } from '../../server/seed/demo-cellar';
import { seedDemoDevice } from '../../server/seed/demo-device';
import { makeBatchInVessels } from '../helpers/batches';
import { crewWithAgents, type Crew } from '../helpers/crew';
import { sanitisedVessel } from '../helpers/vessels';
import { testApp } from '../helpers/test-app';

let app: Awaited<ReturnType<typeof testApp>>['app'];
let ds: Awaited<ReturnType<typeof testApp>>['ds'];
let crew: Crew;

const HOUR_MS = 3_600_000;
const DAY_MS = 86_400_000;
const INGEST = '/api/ingest/readings';

beforeAll(async () => {
  ({ app, ds } = await testApp());
  crew = await crewWithAgents(app, ds);
});

const devicesPath = () => `/api/cellars/${crew.cellar.id}/devices`;
const seriesPath = (batchId: string) => `${crew.batches}/${batchId}/device-readings`;

/** A device made by the Keeper through the API, in a vessel of its own batch (unless given one). */
async function deviceInBatch(vesselId?: string): Promise<DeviceWithToken & { batchId: string; vesselId: string }> {
  const { batch, vessels } = await makeBatchInVessels(ds, crew, { volumesL: [20], startedDaysAgo: 30 });
  const target = vesselId ?? vessels[0].id;
  const res = await crew.as.keeper.post(devicesPath()).send({ name: 'Float one', vesselId: target });
  expect(res.status).toBe(201);
  return { ...deviceWithTokenSchema.parse(res.body), batchId: batch.id, vesselId: target };
}

const post = (token: string, body: object) => request(app).post(INGEST).set('Authorization', `Bearer ${token}`).send(body);
const issuePaths = (res: request.Response) => (res.body.issues as { path: string }[] | undefined)?.map((i) => i.path);
const storedReadings = async (deviceId: string) =>
  (await ds.query(`SELECT count(*)::int AS n FROM device_readings WHERE device_id = $1`, [deviceId]))[0].n as number;

describe('devices (Keeper side)', () => {
  it('shows a new token once, keeps only its hash, and lists the device by the token end', async () => {
    const { device, token } = await deviceInBatch();
    expect(token).toMatch(/^cwd_[A-Za-z0-9_-]{43}$/);
    expect(device.tokenEnd).toBe(token.slice(-4));
    const [row] = await ds.query(`SELECT encode(token_hash, 'hex') AS hash FROM devices WHERE id = $1`, [device.id]);
    expect(row.hash).not.toContain(Buffer.from(token).toString('hex'));
    expect(row.hash).toHaveLength(64);
    const list = await crew.as.keeper.get(devicesPath());
    expect(list.status).toBe(200);
    expect(JSON.stringify(list.body)).not.toContain(token);
    expect(deviceListSchema.parse(list.body).find((d) => d.id === device.id)?.vessel?.id).toBeDefined();
  });

  it('leaves device administration to Keepers', async () => {
    const { vessels } = await makeBatchInVessels(ds, crew, { volumesL: [5] });
    expect((await crew.as.hand.post(devicesPath()).send({ name: 'Hand float', vesselId: vessels[0].id })).status).toBe(403);
    expect((await crew.as.guest.get(devicesPath())).status).toBe(403);
  });
});

describe('POST /api/ingest/readings', () => {
  it('answers 401 without a token, with a wrong one, and with a revoked one', async () => {
    const { device, token } = await deviceInBatch();
    expect((await request(app).post(INGEST).send({ sg: 1.05 })).status).toBe(401);
    const wrong = await post(`${token.slice(0, -4)}AAAA`, { sg: 1.05 });
    expect(wrong.status).toBe(401);
    expect(wrong.headers['www-authenticate']).toContain('Bearer');
    expect((await post(token, { sg: 1.05 })).status).toBe(201);
    expect((await crew.as.keeper.post(`${devicesPath()}/${device.id}/revoke`)).status).toBe(200);
    expect((await post(token, { sg: 1.049 })).status).toBe(401);
    expect(await storedReadings(device.id)).toBe(1);
  });

  it('also takes the token in X-Device-Token', async () => {
    const { token } = await deviceInBatch();
    const res = await request(app).post(INGEST).set('X-Device-Token', token).send({ sg: 1.05 });
    expect(res.status).toBe(201);
  });

  it('answers 400 naming the field of a malformed body', async () => {
    const { token, device } = await deviceInBatch();
    const cases: [object, string][] = [
      [{ sg: 'heavy' }, 'body.sg'],
      [{ sg: 1.5 }, 'body.sg'],
      [{ temperature: 18 }, 'body.sg'],
      [{ sg: 1.05, plato: 12 }, 'body.plato'],
      [{ sg: 1.05, temperature: 18, temperatureUnit: 'K' }, 'body.temperatureUnit'],
      [{ sg: 1.05, temperature: 95 }, 'body.temperature'],
      [{ sg: 1.05, battery: -1 }, 'body.battery'],
      [{ sg: 1.05, tilt: 200 }, 'body.tilt'],
      [{ sg: 1.05, takenAt: 'yesterday' }, 'body.takenAt'],
      [{ sg: 1.05, takenAt: new Date(Date.now() + HOUR_MS).toISOString() }, 'body.takenAt'],
      // The batch in the device's vessel started 30 days ago.
      [{ sg: 1.05, takenAt: new Date(Date.now() - 40 * DAY_MS).toISOString() }, 'body.takenAt'],
    ];
    for (const [body, field] of cases) {
      const res = await post(token, body);
      expect([JSON.stringify(body), res.status, issuePaths(res)]).toEqual([JSON.stringify(body), 400, [field]]);
      expect(res.body.message).toContain(field);
    }
    expect(await storedReadings(device.id)).toBe(0);
  });

  it('keeps a reading sent twice for the same moment once, and says so', async () => {
    const { token, device } = await deviceInBatch();
    const takenAt = new Date(Date.now() - HOUR_MS).toISOString();
    const first = await post(token, { sg: 1.04, takenAt });
    expect(first.status).toBe(201);
    expect(first.body).toMatchObject({ stored: true, duplicate: false, takenAt });
    const again = await post(token, { sg: 1.041, takenAt });
    expect(again.status).toBe(200);
    expect(again.body).toMatchObject({ stored: false, duplicate: true, takenAt });
    expect(await storedReadings(device.id)).toBe(1);
    const [row] = await ds.query(`SELECT sg::float8 AS sg FROM device_readings WHERE device_id = $1`, [device.id]);
    expect(row.sg).toBe(1.04);
  });

  it('converts °Plato to SG and °F to °C', async () => {
    const { token, device } = await deviceInBatch();
    const res = await post(token, { plato: 12, temperature: 64.4, temperatureUnit: 'F', battery: 3.9, tilt: 52.5 });
    expect(res.status).toBe(201);
    // Wikipedia, "Plato scale": 12 °P corresponds to an original gravity of 1.048; the ASBC extract
    // table gives 1.04837 for 12.0 °P (from memory).
    expect(Math.abs(res.body.sg - 1.0484)).toBeLessThanOrEqual(0.0002);
    const [row] = await ds.query(
      `SELECT temperature_c::float8 AS t, battery_v::float8 AS battery, tilt_deg::float8 AS tilt FROM device_readings WHERE device_id = $1`,
      [device.id],
    );
    // (64.4 − 32) × 5/9 = 18 °C, worked by hand.
    expect(row).toEqual({ t: 18, battery: 3.9, tilt: 52.5 });
  });

  it('limits one device to a burst, so 1,000 posts in a minute are mostly refused with 429', async () => {
    const { token, device } = await deviceInBatch();
    const start = Date.now() - 10 * HOUR_MS;
    const statuses: number[] = [];
    for (let i = 0; i < 1000; i += 25) {
      const wave = Array.from({ length: 25 }, (_, j) => post(token, { sg: 1.05, takenAt: new Date(start + (i + j) * 1000).toISOString() }));
      for (const res of await Promise.all(wave)) statuses.push(res.status);
    }
    const accepted = statuses.filter((s) => s === 201).length;
    const limited = statuses.filter((s) => s === 429).length;
    expect(accepted + limited).toBe(1000);
    expect(accepted).toBe(20);
    expect(await storedReadings(device.id)).toBe(20);
    const refused = await post(token, { sg: 1.05 });
    expect(refused.status).toBe(429);
    expect(Number(refused.headers['retry-after'])).toBeGreaterThan(0);
    // Another device of the same cellar is not held back by this one.
    const { token: other } = await deviceInBatch();
    expect((await post(other, { sg: 1.05 })).status).toBe(201);
  });

  it('answers 409 with a plain message for a device on an empty vessel', async () => {
    const empty = await sanitisedVessel(ds, crew.cellar.id, { name: 'Empty demijohn' });
    const { token } = await deviceInBatch(empty.id);
    const res = await post(token, { sg: 1.05 });
    expect(res.status).toBe(409);
    expect(res.body.message).toBe(
      'Empty demijohn is empty, so there is no batch to give this reading to. Move the device to a vessel with a batch in it.',
    );
  });

  it('follows the device to another vessel with one move', async () => {
    const { token, device, batchId: firstBatch } = await deviceInBatch();
    const second = await makeBatchInVessels(ds, crew, { volumesL: [10], startedDaysAgo: 5 });
    expect((await post(token, { sg: 1.03 })).body.batchId).toBe(firstBatch);
    const moved = await crew.as.keeper.post(`${devicesPath()}/${device.id}/move`).send({ vesselId: second.vessels[0].id });
    expect(moved.status).toBe(200);
    expect(moved.body.batch.id).toBe(second.batch.id);
    const next = await post(token, { sg: 1.09 });
    expect(next.status).toBe(201);
    expect(next.body.batchId).toBe(second.batch.id);
    const perBatch = await ds.query(`SELECT batch_id, count(*)::int AS n FROM device_readings WHERE device_id = $1 GROUP BY batch_id ORDER BY n`, [
      device.id,
    ]);
    expect(perBatch).toEqual(
      expect.arrayContaining([
        { batch_id: firstBatch, n: 1 },
        { batch_id: second.batch.id, n: 1 },
      ]),
    );
  });

  it("moves the batch's latest gravity on from a newer reading, and not from an older one", async () => {
    const { token, batchId } = await deviceInBatch();
    const recent = new Date(Date.now() - HOUR_MS).toISOString();
    expect((await post(token, { sg: 1.012, takenAt: recent })).status).toBe(201);
    const batch = await crew.as.guest.get(`${crew.batches}/${batchId}`);
    expect(batch.body.lastReading).toEqual({ sg: 1.012, at: recent });
    expect((await post(token, { sg: 1.03, takenAt: new Date(Date.now() - DAY_MS).toISOString() })).status).toBe(201);
    const list = await crew.as.guest.get(crew.batches).query({ pageSize: 100 });
    const item = (list.body.items as { id: string; lastReading: unknown }[]).find((b) => b.id === batchId);
    expect(item?.lastReading).toEqual({ sg: 1.012, at: recent });
  });

  it("keeps a later device reading as the batch's latest when an earlier hand reading is corrected", async () => {
    const { token, batchId } = await deviceInBatch();
    const handReading = await crew.as.hand
      .post(`${crew.batches}/${batchId}/readings`)
      .send({ sg: 1.03, at: new Date(Date.now() - 2 * DAY_MS).toISOString() });
    expect(handReading.status).toBe(201);
    const recent = new Date(Date.now() - HOUR_MS).toISOString();
    expect((await post(token, { sg: 1.014, takenAt: recent })).status).toBe(201);
    const amended = await crew.as.keeper
      .post(`${crew.batches}/${batchId}/journal/${handReading.body.entryId}/amendments`)
      .send({ reason: 'misread', changes: { sg: 1.029 } });
    expect(amended.status).toBe(201);
    expect(amended.body.batch.lastReading).toEqual({ sg: 1.014, at: recent });
  });

  it('shows a reading on the very next GET of the chart series (nothing cached in between)', async () => {
    const { token, batchId } = await deviceInBatch();
    const takenAt = new Date(Date.now() - 60_000).toISOString();
    expect((await post(token, { sg: 1.044, temperature: 19.5, takenAt })).status).toBe(201);
    const series = deviceSeriesSchema.parse((await crew.as.guest.get(seriesPath(batchId))).body);
    expect(series.points).toEqual([{ at: takenAt, sg: 1.044, temperatureC: 19.5, count: 1, resolution: 'reading' }]);
  });
});

describe('device readings on the Batch page', () => {
  /** Readings every 30 minutes from 20 days ago until now, straight into the table. */
  async function twentyDaysOfReadings(): Promise<{ batchId: string; total: number }> {
    const { device, batchId } = await deviceInBatch();
    const [{ n }] = await ds
      .query(
        `WITH s AS (SELECT generate_series(now() - interval '20 days', now() - interval '1 minute', interval '30 minutes') AS at)
       INSERT INTO device_readings (device_id, cellar_id, batch_id, taken_at, sg, temperature_c)
       SELECT $1, $2, $3, date_trunc('minute', at), 1.05, 18 FROM s RETURNING 1`,
        [device.id, crew.cellar.id, batchId],
      )
      .then((rows: unknown[]) => [{ n: rows.length }]);
    return { batchId, total: n };
  }

  it('thins the series: every reading for 48 h, hourly averages to 14 days, daily beyond', async () => {
    const { batchId, total } = await twentyDaysOfReadings();
    const { points } = deviceSeriesSchema.parse((await crew.as.guest.get(seriesPath(batchId))).body);
    const now = Date.now();
    const of = (resolution: string) => points.filter((p) => p.resolution === resolution);
    expect(points.reduce((sum, p) => sum + p.count, 0)).toBe(total);
    // Two readings an hour for 48 hours, each its own point.
    expect(of('reading').length).toBeGreaterThanOrEqual(95);
    expect(of('reading').length).toBeLessThanOrEqual(97);
    expect(of('reading').every((p) => p.count === 1 && now - new Date(p.at).getTime() <= 48 * HOUR_MS + 60_000)).toBe(true);
    // 12 days of hours, two readings in each full hour.
    expect(of('hour').length).toBeGreaterThanOrEqual(12 * 24);
    expect(of('hour').length).toBeLessThanOrEqual(12 * 24 + 2);
    expect(of('hour').every((p) => p.count <= 2)).toBe(true);
    // About 6 days of days (the oldest part-day too), 48 readings in a full one.
    expect(of('day').length).toBeGreaterThanOrEqual(6);
    expect(of('day').length).toBeLessThanOrEqual(8);
    expect(Math.max(...of('day').map((p) => p.count))).toBe(48);
    expect(points.length).toBeLessThan(total / 2);
    // Oldest first, for the chart.
    expect(points.map((p) => p.at)).toEqual([...points.map((p) => p.at)].sort());
  });

  it('sums each day up in one line for the journal, derived at read time', async () => {
    const { device, batchId } = await deviceInBatch();
    const day = new Date(Date.now() - 3 * DAY_MS).toISOString().slice(0, 10);
    for (const [time, sg, t] of [
      ['08:00', 1.02, 18.2],
      ['14:00', 1.016, 18.9],
      ['20:00', 1.012, 19.1],
    ] as const) {
      await ds.query(`INSERT INTO device_readings (device_id, cellar_id, batch_id, taken_at, sg, temperature_c) VALUES ($1, $2, $3, $4, $5, $6)`, [
        device.id,
        crew.cellar.id,
        batchId,
        `${day}T${time}:00Z`,
        sg,
        t,
      ]);
    }
    const { days } = deviceSeriesSchema.parse((await crew.as.guest.get(seriesPath(batchId))).body);
    expect(days).toEqual([
      {
        day,
        count: 3,
        firstSg: 1.02,
        lastSg: 1.012,
        minTemperatureC: 18.2,
        maxTemperatureC: 19.1,
        line: 'Hydrometer: 3 readings, 1.020 → 1.012, 18–19 °C',
      },
    ]);
    // Nothing was written to the journal for them.
    const [{ n }] = await ds.query(`SELECT count(*)::int AS n FROM journal_entries WHERE batch_id = $1 AND kind <> 'started'`, [batchId]);
    expect(n).toBe(0);
  });
});

describe('the demo hydrometer', () => {
  it('floats in the traditional in primary with four days of readings, and takes a curl-style post', async () => {
    const token = `demo-test-${crypto.randomBytes(8).toString('hex')}`;
    const demo = await crewWithAgents(app, ds);
    const keeper = memberActor(demo.cellar.id, demo.keeper.id, 'keeper');
    await ds.transaction(async (tx) => {
      await seedDemoRecords(tx, { keeper, hand: memberActor(demo.cellar.id, demo.hand.id, 'hand') });
      await seedDemoDevice(tx, keeper, new Date(), token);
    });
    const [batch] = await ds.query(
      `SELECT id, last_reading_sg::float8 AS sg FROM batches WHERE cellar_id = $1 AND name = 'Hawthorn Hollow Traditional'`,
      [demo.cellar.id],
    );
    const before = deviceSeriesSchema.parse((await demo.as.guest.get(`${demo.batches}/${batch.id}/device-readings`)).body);
    expect(before.points.reduce((sum, p) => sum + p.count, 0)).toBe(4 * 96);
    expect(before.days.length).toBeGreaterThanOrEqual(4);
    // The latest device reading is the batch's current gravity.
    expect(batch.sg).toBeCloseTo(1.037, 3);
    // As the README's curl example sends it.
    const res = await request(app)
      .post(INGEST)
      .set('Authorization', `Bearer ${token}`)
      .set('Content-Type', 'application/json')
      .send('{"sg": 1.036, "temperature": 19.5}');
    expect(res.status).toBe(201);
    expect(res.body.batchId).toBe(batch.id);
    const after = deviceSeriesSchema.parse((await demo.as.guest.get(`${demo.batches}/${batch.id}/device-readings`)).body);
    expect(after.points.at(-1)).toMatchObject({ at: res.body.takenAt, sg: 1.036, resolution: 'reading' });
  });
});

describe('the whole-cellar archive', () => {
  it('carries devices and their readings, but never a working token', async () => {
    const own = await crewWithAgents(app, ds);
    const { vessels } = await makeBatchInVessels(ds, own, { volumesL: [10], startedDaysAgo: 3 });
    const created = await own.as.keeper.post(`/api/cellars/${own.cellar.id}/devices`).send({ name: 'Archived float', vesselId: vessels[0].id });
    const { token } = deviceWithTokenSchema.parse(created.body);
    expect((await post(token, { sg: 1.041, temperature: 18 })).status).toBe(201);
    const archive = await own.as.keeper
      .get(`/api/cellars/${own.cellar.id}/archive`)
      .buffer(true)
      .parse((res, done) => {
        const parts: Buffer[] = [];
        res.on('data', (c: Buffer) => parts.push(c));
        res.on('end', () => done(null, Buffer.concat(parts)));
      });
    expect(archive.status).toBe(200);
    const restored = await own.as.keeper
      .post(`/api/cellars/${own.cellar.id}/archive/restorations`)
      .set('content-type', 'application/gzip')
      .send(archive.body as Buffer);
    expect(restored.status).toBe(201);
    const devices = deviceListSchema.parse((await own.as.keeper.get(`/api/cellars/${restored.body.cellarId}/devices`)).body);
    expect(devices.map((d) => [d.name, d.tokenEnd, d.lastReadingAt !== null])).toEqual([['Archived float', null, true]]);
    // The original keeps working; the restored copy has no token of its own.
    expect((await post(token, { sg: 1.04 })).body.batchId).not.toBe(devices[0]!.batch?.id);
  });
});
