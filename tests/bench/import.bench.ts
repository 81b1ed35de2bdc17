/**
 * CSV import benchmark: a hydrometer log of 100,000 readings (one every 5 minutes for about
 * a year, ~4 MB) streamed from disk over real HTTP into one batch of a throwaway PostgreSQL
 * cluster, every row through the journal writer in one transaction. Prints the time, rows per
 * second and the server's peak heap growth (the file is never held whole), then imports the
 * same file again (every row already imported: nothing added). A script, not a test:
 * `npm run bench:import`.
 */
import 'reflect-metadata';
import fs from 'node:fs';
import http from 'node:http';
import net from 'node:net';
import path from 'node:path';
import { performance } from 'node:perf_hooks';
import request from 'supertest';
import { createApp } from '../../server/app';
import { hashPassword } from '../../server/accounts/passwords';
import { withBenchDatabase } from './bench-database';

const ROWS = Number(process.env.BENCH_ROWS ?? 100_000);
const STEP_MS = 5 * 60_000;

await withBenchDatabase(async ({ ds, dir }) => {
  const [{ id: userId }] = await ds.query(
    `INSERT INTO users (email, display_name, password_hash) VALUES ('bench@example.test', 'Bench Keeper', $1) RETURNING id`,
    [await hashPassword('bench-password')],
  );
  const [{ id: cellarId }] = await ds.query(`INSERT INTO cellars (name) VALUES ('Import bench cellar') RETURNING id`);
  await ds.query(`INSERT INTO memberships (cellar_id, user_id, role) VALUES ($1, $2, 'keeper')`, [cellarId, userId]);
  const first = Date.now() - (ROWS + 10) * STEP_MS;
  const [{ id: batchId }] = await ds.query(
    `INSERT INTO batches (cellar_id, name, kind, yeast_name, yeast_tolerance_abv, planned_volume_l, started_on, og)
     VALUES ($1, 'Bench melomel', 'melomel', 'Bench yeast', 14, 20, $2::date, 1.100) RETURNING id`,
    [cellarId, new Date(first - 86_400_000).toISOString().slice(0, 10)],
  );

  // The file: gravity falling from 1.100 towards 0.995, temperature wandering around 18 °C.
  const file = path.join(dir, 'readings.csv');
  const out = fs.createWriteStream(file);
  out.write('time,gravity,temperature\n');
  for (let i = 0; i < ROWS; i++) {
    const sg = (0.995 + 0.105 * Math.exp(-i / (ROWS / 5))).toFixed(4);
    const temperature = (18 + Math.sin(i / 288) * 2).toFixed(1);
    if (!out.write(`${new Date(first + i * STEP_MS).toISOString()},${sg},${temperature}\n`))
      await new Promise<void>((r) => out.once('drain', () => r()));
  }
  await new Promise<void>((r) => out.end(() => r()));
  const bytes = fs.statSync(file).size;

  const app = createApp({ dataSource: ds, sessionSecret: 'bench-secret-long-enough-0123456789abcdef', cookieSecure: false });
  const signIn = await request(app).post('/api/auth/sign-in').send({ email: 'bench@example.test', password: 'bench-password' }).expect(200);
  const cookie = signIn.headers['set-cookie']![0].split(';')[0];
  const server = app.listen(0, '127.0.0.1');
  // Node answers 408 to a request still arriving after 5 minutes; a slow machine may need longer.
  server.requestTimeout = 0;
  await new Promise((r) => server.once('listening', r));
  const { port } = server.address() as net.AddressInfo;
  const query = new URLSearchParams({ batchId, columns: JSON.stringify({ at: 'time', sg: 'gravity', temperature: 'temperature' }) });

  /** Streams the file from disk as the request body; the answer's status and JSON. */
  const upload = () =>
    new Promise<{ status: number; body: string }>((resolve, reject) => {
      const req = http.request(
        {
          host: '127.0.0.1',
          port,
          method: 'POST',
          path: `/api/cellars/${cellarId}/imports/readings?${query}`,
          headers: { cookie, 'content-type': 'text/csv', 'content-length': bytes },
        },
        (res) => {
          let body = '';
          res.on('data', (c) => (body += c));
          res.on('end', () => resolve({ status: res.statusCode ?? 0, body }));
        },
      );
      req.on('error', reject);
      fs.createReadStream(file).pipe(req);
    });

  for (const run of ['first import', 'same file again']) {
    global.gc?.();
    const heapBefore = process.memoryUsage().heapUsed;
    let peak = heapBefore;
    const sampler = setInterval(() => (peak = Math.max(peak, process.memoryUsage().heapUsed)), 50);
    const start = performance.now();
    const res = await upload();
    const seconds = (performance.now() - start) / 1000;
    clearInterval(sampler);
    if (res.status !== 200) throw new Error(`import answered ${res.status}: ${res.body}`);
    console.log(
      `${run.padEnd(16)} ${ROWS} rows (${(bytes / 1024 / 1024).toFixed(1)} MB) in ${seconds.toFixed(1)} s, ${Math.round(ROWS / seconds)} rows/s, ` +
        `heap +${((peak - heapBefore) / 1024 / 1024).toFixed(0)} MB; answer ${res.body}`,
    );
  }
  const [{ n }] = await ds.query(`SELECT count(*)::int AS n FROM journal_entries WHERE batch_id = $1 AND kind = 'reading'`, [batchId]);
  console.log(`readings in the journal: ${n}`);
  server.close();
});
