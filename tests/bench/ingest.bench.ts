/**
 * Hydrometer ingest benchmark: 10,000 device readings posted into one batch over real HTTP by
 * several concurrent clients (one device, its rate limit raised for the run), in a throwaway
 * PostgreSQL cluster. Then, in the same run, the batch page and its chart endpoint (the thinned
 * device series) are timed against a raw-SQL floor: the same rows read straight from the
 * database without the app. Prints medians and the machine. Targets: the 10,000 readings in
 * under 10 s; the batch page and the chart each under 250 ms (the lists' target). A script,
 * not a test: `npm run bench:ingest`.
 */
import 'reflect-metadata';
import { Worker } from 'node:worker_threads';
import type net from 'node:net';
import os from 'node:os';
import { performance } from 'node:perf_hooks';
import request from 'supertest';
import { createApp } from '../../server/app';
import { hashPassword } from '../../server/accounts/passwords';
import { hashToken } from '../../server/devices/device-tokens';
import { deviceDays, thinnedPoints } from '../../server/devices/device-series-queries';
import { withBenchDatabase } from './bench-database';

const READINGS = Number(process.env.BENCH_READINGS ?? 10_000);
const CLIENTS = Number(process.env.BENCH_CLIENTS ?? 8);
const STEP_MS = 5 * 60_000;
const RUNS = 15;
const INGEST_TARGET_S = 10;
const PAGE_TARGET_MS = 250;
/** Hydrometers in the batch's vessel; 1 by default (every post counts against one device's limit). */
const DEVICES = Number(process.env.BENCH_DEVICES ?? 1);
const tokenOf = (device: number) => `bench-device-token-${String(device).padStart(4, '0')}-0123456789`;

const median = (times: number[]) => [...times].sort((a, b) => a - b)[Math.floor(times.length / 2)]!;

async function timed(work: () => Promise<unknown>): Promise<number> {
  const times: number[] = [];
  for (let i = 0; i < RUNS; i++) {
    const start = performance.now();
    await work();
    times.push(performance.now() - start);
  }
  return median(times);
}

await withBenchDatabase(async ({ ds }) => {
  const [{ id: userId }] = await ds.query(
    `INSERT INTO users (email, display_name, password_hash) VALUES ('bench@example.test', 'Bench Keeper', $1) RETURNING id`,
    [await hashPassword('bench-password')],
  );
  const [{ id: cellarId }] = await ds.query(`INSERT INTO cellars (name) VALUES ('Ingest bench cellar') RETURNING id`);
  await ds.query(`INSERT INTO memberships (cellar_id, user_id, role) VALUES ($1, $2, 'keeper')`, [cellarId, userId]);
  const first = Date.now() - (READINGS + 10) * STEP_MS;
  const [{ id: batchId }] = await ds.query(
    `INSERT INTO batches (cellar_id, name, kind, yeast_name, yeast_tolerance_abv, planned_volume_l, started_on, og)
     VALUES ($1, 'Bench traditional', 'traditional-mead', 'Bench yeast', 14, 20, $2::date, 1.100) RETURNING id`,
    [cellarId, new Date(first - 86_400_000).toISOString().slice(0, 10)],
  );
  const [{ id: vesselId }] = await ds.query(
    `INSERT INTO vessels (cellar_id, code, name, kind, material, capacity_l, batch_id, volume_l, filled_at)
     VALUES ($1, 'BENCH001', 'Bench fermenter', 'bucket', 'plastic', 25, $2, 20, now()) RETURNING id`,
    [cellarId, batchId],
  );
  // A journal like a real batch's: a start and a reading every few days by hand.
  await ds.query(
    `INSERT INTO journal_entries (cellar_id, batch_id, kind, payload, occurred_at, author_id)
     SELECT $1, $2, 'reading',
            jsonb_build_object('kind','reading','sg',1.1 - k * 0.004,'temperatureC',null,'calibrationC',20,'correctedSg',1.1 - k * 0.004,'ph',null,'vesselId',null),
            to_timestamp($4::float8 / 1000) + k * interval '3 days', $3
       FROM generate_series(1, 10) k`,
    [cellarId, batchId, userId, first],
  );
  for (let d = 0; d < DEVICES; d++) {
    await ds.query(`INSERT INTO devices (cellar_id, vessel_id, name, token_hash, token_end) VALUES ($1, $2, $3, $4, 'ench')`, [
      cellarId,
      vesselId,
      `Bench float ${d + 1}`,
      hashToken(tokenOf(d)),
    ]);
  }

  const app = createApp({
    dataSource: ds,
    sessionSecret: 'bench-secret-long-enough-0123456789abcdef',
    cookieSecure: false,
    // The bench is one device posting as fast as it can: lift its limit for the run.
    deviceReadingLimit: { burst: READINGS * 10, windowSeconds: 60 },
  });
  const server = app.listen(0, '127.0.0.1');
  await new Promise((r) => server.once('listening', r));
  const { port } = server.address() as net.AddressInfo;
  // The devices post from a worker thread: real hydrometers are other machines, so their HTTP
  // work must not share the app's one JavaScript thread (it would slow the app it measures).
  const tokens = Array.from({ length: DEVICES }, (_, d) => tokenOf(d));
  const start = performance.now();
  const statuses = await postFromWorker({ port, tokens, readings: READINGS, clients: CLIENTS, first, stepMs: STEP_MS });
  const seconds = (performance.now() - start) / 1000;
  const [{ n }] = await ds.query(`SELECT count(*)::int AS n FROM device_readings WHERE batch_id = $1`, [batchId]);
  console.log(
    `ingest  ${READINGS} readings from ${DEVICES} device(s) by ${CLIENTS} clients in ${seconds.toFixed(1)} s (${Math.round(READINGS / seconds)}/s), ` +
      `answers ${JSON.stringify(statuses)}, stored ${n}  ${n !== READINGS ? 'READINGS LOST' : seconds < INGEST_TARGET_S ? 'OK' : `OVER ${INGEST_TARGET_S} s`}`,
  );
  await ds.query('ANALYZE');

  const signedIn = request.agent(app);
  await signedIn.post('/api/auth/sign-in').send({ email: 'bench@example.test', password: 'bench-password' }).expect(200);
  const base = `/api/cellars/${cellarId}/batches/${batchId}`;
  const get = async (url: string) => {
    const res = await signedIn.get(url);
    if (res.status !== 200) throw new Error(`${url} answered ${res.status}: ${JSON.stringify(res.body)}`);
    return res.body as { points?: unknown[]; days?: unknown[] };
  };
  const chart = await get(`${base}/device-readings`);
  const now = new Date();
  const pageMs = await timed(() => get(base));
  const chartMs = await timed(() => get(`${base}/device-readings`));
  // The floor: what the two answers need from the database, asked directly.
  const pageFloorMs = await timed(() =>
    ds.transaction('REPEATABLE READ', async (tx) => {
      await tx.query(`SELECT * FROM batches WHERE id = $1`, [batchId]);
      await tx.query(`SELECT * FROM journal_entries WHERE batch_id = $1 ORDER BY occurred_at DESC`, [batchId]);
      await tx.query(`SELECT * FROM vessels WHERE batch_id = $1`, [batchId]);
    }),
  );
  const chartFloorMs = await timed(() =>
    ds.transaction('REPEATABLE READ', async (tx) => {
      await thinnedPoints(tx, cellarId, batchId, now, 'UTC');
      await deviceDays(tx, cellarId, batchId, 'UTC');
    }),
  );
  const verdict = (ms: number) => (ms < PAGE_TARGET_MS ? 'OK' : 'SLOW');
  console.log(`batch page        median ${pageMs.toFixed(1).padStart(6)} ms  (raw-SQL floor ${pageFloorMs.toFixed(1)} ms)  ${verdict(pageMs)}`);
  console.log(
    `chart (device)    median ${chartMs.toFixed(1).padStart(6)} ms  (raw-SQL floor ${chartFloorMs.toFixed(1)} ms)  ${verdict(chartMs)}; ` +
      `${chart.points?.length} points and ${chart.days?.length} day lines for ${n} readings`,
  );
  const cpus = os.cpus();
  console.log(
    `machine: ${cpus.length} cores (${cpus[0]?.model.trim() ?? 'unknown'}), ${(os.totalmem() / 1024 ** 3).toFixed(1)} GB memory, ` +
      `${(os.freemem() / 1024 ** 3).toFixed(1)} GB free, load ${os
        .loadavg()
        .map((l) => l.toFixed(2))
        .join(' ')}, Node ${process.version}`,
  );
  server.close();
});

interface PostJob {
  port: number;
  tokens: string[];
  readings: number;
  clients: number;
  first: number;
  stepMs: number;
}

/** Posts the readings from `clients` keep-alive connections in a worker thread; resolves to a count per HTTP status. */
function postFromWorker(job: PostJob): Promise<Record<string, number>> {
  const code = `
    const http = require('node:http');
    const { workerData, parentPort } = require('node:worker_threads');
    const { port, tokens, readings, clients, first, stepMs } = workerData;
    const agent = new http.Agent({ keepAlive: true, maxSockets: clients });
    const statuses = {};
    let next = 0;
    const post = (i, device) => new Promise((resolve, reject) => {
      const body = JSON.stringify({
        sg: Number((0.998 + 0.1 * Math.exp(-i / (readings / 4))).toFixed(4)),
        temperature: Number((19 + Math.sin(i / 288)).toFixed(2)),
        battery: 4.0,
        takenAt: new Date(first + i * stepMs).toISOString(),
      });
      const req = http.request({ host: '127.0.0.1', port, method: 'POST', path: '/api/ingest/readings', agent,
        headers: { authorization: 'Bearer ' + tokens[device], 'content-type': 'application/json', 'content-length': Buffer.byteLength(body) } },
        (res) => { res.resume(); res.on('end', () => resolve(res.statusCode || 0)); });
      req.on('error', reject);
      req.end(body);
    });
    const client = async (c) => {
      while (next < readings) {
        const status = await post(next++, c % tokens.length);
        statuses[status] = (statuses[status] || 0) + 1;
      }
    };
    Promise.all(Array.from({ length: clients }, (_, c) => client(c))).then(() => { agent.destroy(); parentPort.postMessage(statuses); });
  `;
  return new Promise((resolve, reject) => {
    const worker = new Worker(code, { eval: true, workerData: job });
    worker.once('message', resolve);
    worker.once('error', reject);
  });
}
