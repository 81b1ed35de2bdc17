/**
 * API benchmark against the physical floor. Builds a large cellar with SQL in a throwaway
 * cluster (2,000 vessels in 2,000 shelf slots, 1,000 batches, 50,000 journal entries), then for
 * each hot endpoint measures the real app (in-process, on a loopback port, signed in with a real
 * session cookie) against a bare Express handler on another port that sends the same SQL
 * statements' rows straight from `pg` (8 connections, no session, no gate, no transaction, no
 * validation). Load comes from autocannon in a child process (8 connections), app and floor
 * alternating. Targets: app req/s ≥ 0.5 × the floor's and app p50 ≤ 2 × the floor's.
 * A script, not a test: `npm run bench:api`.
 */
import 'reflect-metadata';
import { execFile } from 'node:child_process';
import type { Server } from 'node:http';
import type { AddressInfo } from 'node:net';
import os from 'node:os';
import path from 'node:path';
import { performance } from 'node:perf_hooks';
import { promisify } from 'node:util';
import express from 'express';
import pg from 'pg';
import { createApp } from '../../server/app';
import { CONNECTION_OPTIONS } from '../../server/db/data-source';
import { vesselLabel, type VesselLabelRow } from '../../server/labels/content';
import { renderLabelsPdf } from '../../server/labels/render';
import { labelTemplates } from '../../server/labels/templates';
import { withBenchDatabase } from './bench-database';
import { BENCH_EMAIL, BENCH_PASSWORD, seedLargeCellar } from './large-cellar';
import type { LoadRunOptions, LoadRunResult } from './load-run';

const CONNECTIONS = 8;
const WARM_SECONDS = 1;
const RUN_SECONDS = 2.5;
/** Endpoints that take about a second each are measured over a number of requests instead. */
const SLOW_RUN_REQUESTS = 16;
const ROUNDS = 2;
const TEMPLATE = 'a4-3x8-70x37';

const execFileAsync = promisify(execFile);
const loadRunScript = path.resolve(import.meta.dirname, 'load-run.ts');

/** One statement as the pg driver received it. */
interface Statement {
  text: string;
  values: unknown[];
}

// Every statement of the process passes pg's Client.query: the app's TypeORM pool, its session
// store and rate limits alike. Recording is switched on only around one request at a time.
let recording: Statement[] | null = null;
const clientQuery = pg.Client.prototype.query;
pg.Client.prototype.query = function recordedQuery(this: pg.Client, ...args: unknown[]) {
  const [first, second] = args;
  if (recording) {
    const text = typeof first === 'string' ? first : (first as { text: string }).text;
    const values = Array.isArray(second) ? second : ((first as { values?: unknown[] }).values ?? []);
    // A copy: callers may reuse and grow their parameter array for the next statement.
    recording.push({ text, values: [...values] });
  }
  return (clientQuery as (...a: unknown[]) => unknown).apply(this, args);
} as typeof clientQuery;

/** Statements that are the request's plumbing (session, user, membership, transaction, rate limit), not its data. */
const PLUMBING = [
  /^\s*(START TRANSACTION|BEGIN|SET TRANSACTION|COMMIT|ROLLBACK)\b/i,
  /\bsession\b/i,
  /FROM "users" "User"/,
  /FROM "memberships" "Membership"/,
  /\brate_limits\b/,
];
const isPlumbing = (s: Statement) => PLUMBING.some((re) => re.test(s.text));

interface Endpoint {
  name: string;
  url: string;
  /** Takes about a second a request: measured over SLOW_RUN_REQUESTS. */
  slow?: boolean;
  /** What the floor sends instead of the rows as JSON (the label PDF is rendered there too). */
  floor?: (pool: pg.Pool) => Promise<{ type: string; body: Buffer | string }>;
}

interface Run {
  rps: number;
  p50: number;
  bad: number;
}

/**
 * One load run (tests/bench/load-run.ts, a process of its own): for `seconds`, or until `amount`
 * requests have finished (for endpoints that take about a second each, which a short run would
 * cut off with every request still in flight). Its p50 keeps fractions of a millisecond.
 */
async function load(url: string, headers: Record<string, string>, length: { seconds: number } | { amount: number }): Promise<Run> {
  const options: LoadRunOptions = { url, connections: CONNECTIONS, headers, ...length };
  const { stdout } = await execFileAsync(process.execPath, ['--import', 'tsx', loadRunScript, JSON.stringify(options)], { maxBuffer: 1 << 24 });
  const r = JSON.parse(stdout) as LoadRunResult;
  // Total over the run's real length: a slow endpoint finishes few requests per one-second sample.
  return { rps: r.requests / r.durationS, p50: r.p50Ms, bad: r.bad };
}

const listen = (app: express.Express) =>
  new Promise<Server>((resolve) => {
    const s = app.listen(0, '127.0.0.1', () => resolve(s));
  });
const portOf = (s: Server) => (s.address() as AddressInfo).port;
const mean = (xs: number[]) => xs.reduce((a, b) => a + b, 0) / xs.length;

await withBenchDatabase(async ({ ds }) => {
  const { cellarId, vesselId, code, batchId, shelfId } = await seedLargeCellar(ds);

  const app = createApp({
    dataSource: ds,
    sessionSecret: 'bench-secret-long-enough-0123456789abcdef',
    cookieSecure: false,
    // One loopback address stands for every phone here; the limit itself still runs.
    scanLookupsPerMinute: 1_000_000_000,
  });
  const appServer = await listen(app);
  const appBase = `http://127.0.0.1:${portOf(appServer)}`;
  const signIn = await fetch(`${appBase}/api/auth/sign-in`, {
    method: 'POST',
    headers: { 'content-type': 'application/json' },
    body: JSON.stringify({ email: BENCH_EMAIL, password: BENCH_PASSWORD }),
  });
  if (signIn.status !== 200) throw new Error(`sign-in answered ${signIn.status}`);
  const cookie = signIn.headers
    .getSetCookie()
    .map((c) => c.split(';')[0])
    .join('; ');

  const base = `/api/cellars/${cellarId}`;
  // A shelf check as a phone sends it: every label on the shelf but the first, and one vessel from elsewhere.
  const shelfCodes: { code: string }[] = await ds.query(
    `SELECT v.code FROM placements p JOIN vessels v ON v.id = p.vessel_id WHERE p.shelf_id = $1 ORDER BY p.slot`,
    [shelfId],
  );
  const checkedCodes = [...shelfCodes.slice(1).map((r) => r.code), code].filter((c, i, all) => all.indexOf(c) === i);
  const template = labelTemplates().get(TEMPLATE);
  if (!template) throw new Error(`No template ${TEMPLATE}`);
  const endpoints: Endpoint[] = [
    { name: 'cellar map', url: `${base}/racks` },
    { name: 'vessels, first page', url: `${base}/vessels` },
    { name: 'batches, first page', url: `${base}/batches` },
    { name: 'batches, needs racking, melomel', url: `${base}/batches?needsRacking=true&kind=melomel` },
    { name: 'batch page', url: `${base}/batches/${batchId}` },
    { name: 'vessel page', url: `${base}/vessels/${vesselId}` },
    { name: 'today', url: `${base}/today` },
    { name: 'tasks', url: `${base}/tasks`, slow: true },
    { name: 'label look-up', url: `/api/scan/${code}` },
    { name: 'shelf check', url: `${base}/labels/shelf/${shelfId}/check?codes=${checkedCodes.join(',')}` },
    {
      name: 'shelf label PDF',
      url: `${base}/labels/pdf?shelf=${shelfId}&template=${TEMPLATE}`,
      // The floor renders the same labels with the same renderer from rows read by raw pg.
      floor: async (pool) => {
        const { rows } = await pool.query<VesselLabelRow>(
          `SELECT v.id, v.code, v.name, v.kind AS "vesselKind", v.capacity_l::float8 AS "capacityL",
                  b.name AS "batchName", b.kind AS "batchKind", b.started_on::text AS "startedOn",
                  b.og::float8 AS og, b.last_reading_sg::float8 AS "lastSg", c.unit_system AS "unitSystem"
             FROM placements p JOIN vessels v ON v.id = p.vessel_id JOIN cellars c ON c.id = v.cellar_id
             LEFT JOIN batches b ON b.id = v.batch_id
            WHERE p.shelf_id = $1 AND v.cellar_id = $2 ORDER BY p.slot`,
          [shelfId, cellarId],
        );
        const pdf = await renderLabelsPdf(template, rows.map(vesselLabel), { publicUrl: 'http://127.0.0.1:8460', skip: 0, title: 'labels' });
        return { type: 'application/pdf', body: pdf };
      },
    },
  ];

  // BENCH_API_ONLY=text measures only the endpoints whose name contains it (for working on one).
  const only = process.env.BENCH_API_ONLY;
  if (only) endpoints.splice(0, endpoints.length, ...endpoints.filter((e) => e.name.includes(only)));

  // One request each with the recorder on: the app's statement count, and its data statements for the floor.
  const recorded: { all: Statement[]; data: Statement[]; bytes: number }[] = [];
  for (const e of endpoints) {
    recording = [];
    const start = performance.now();
    const res = await fetch(appBase + e.url, { headers: { cookie } });
    const body = Buffer.from(await res.arrayBuffer());
    // The session store may finish its write after the answer: let it land in the count.
    await new Promise((r) => setTimeout(r, 50));
    const all = recording;
    recording = null;
    if (res.status !== 200) throw new Error(`${e.url} answered ${res.status}: ${body.toString().slice(0, 300)}`);
    recorded.push({ all, data: all.filter((s) => !isPlumbing(s)), bytes: body.length });
    // BENCH_API_SLOW=1 names each endpoint's slowest data statements (where to look with EXPLAIN).
    if (process.env.BENCH_API_SLOW) {
      const timed = [];
      for (const s of recorded.at(-1)!.data) {
        const start = performance.now();
        await ds.query(s.text, s.values);
        timed.push({ ms: performance.now() - start, text: s.text.replace(/\s+/g, ' ').slice(0, 400) });
      }
      timed.sort((a, b) => b.ms - a.ms);
      console.log(`${e.name}: one request ${(performance.now() - start).toFixed(0)} ms; slowest data statements:`);
      for (const t of timed.slice(0, 3)) console.log(`  ${t.ms.toFixed(1)} ms: ${t.text}`);
    }
  }

  // The same server settings as the app's connections, so both sides run the same plans.
  const floorPool = new pg.Pool({ connectionString: (ds.options as { url: string }).url, max: CONNECTIONS, options: CONNECTION_OPTIONS });
  // An idle connection that breaks is dropped by the pool; say so instead of stopping the run.
  floorPool.on('error', (err) => console.error(`floor pool: ${err.message}`));
  const floorApp = express();
  endpoints.forEach((e, i) => {
    floorApp.get(`/floor/${i}`, async (_req, res) => {
      if (e.floor) {
        const { type, body } = await e.floor(floorPool);
        res.type(type).send(body);
        return;
      }
      const results = [];
      for (const s of recorded[i]!.data) results.push((await floorPool.query(s.text, s.values)).rows);
      res.json(results.length === 1 ? results[0] : results);
    });
  });
  const floorServer = await listen(floorApp);
  const floorBase = `http://127.0.0.1:${portOf(floorServer)}`;

  const cpu = os.cpus();
  console.log(
    `Machine: ${cpu.length} cores (${cpu[0]?.model.trim()}), ${(os.totalmem() / 2 ** 30).toFixed(1)} GiB memory, Node ${process.version}; ` +
      `autocannon ${CONNECTIONS} connections, ${ROUNDS} × ${RUN_SECONDS} s per side (slow endpoints: ${ROUNDS} × ${SLOW_RUN_REQUESTS} requests) after a warm-up, alternating`,
  );
  const header = ['endpoint', 'app req/s', 'floor req/s', 'ratio', 'app p50', 'floor p50', 'p50 ratio', 'SQL/req', 'data SQL', 'answer', 'verdict'];
  const rows: string[][] = [];
  let misses = 0;
  for (const [i, e] of endpoints.entries()) {
    const appUrl = appBase + e.url;
    const floorUrl = `${floorBase}/floor/${i}`;
    const warm = e.slow ? { amount: CONNECTIONS } : { seconds: WARM_SECONDS };
    await load(appUrl, { cookie }, warm);
    await load(floorUrl, {}, warm);
    const app: Run[] = [];
    const floor: Run[] = [];
    const length = e.slow ? { amount: SLOW_RUN_REQUESTS } : { seconds: RUN_SECONDS };
    for (let round = 0; round < ROUNDS; round++) {
      app.push(await load(appUrl, { cookie }, length));
      floor.push(await load(floorUrl, {}, length));
    }
    if ([...app, ...floor].some((r) => r.bad > 0)) throw new Error(`${e.name}: some requests failed`);
    const appRps = mean(app.map((r) => r.rps));
    const floorRps = mean(floor.map((r) => r.rps));
    const appP50 = mean(app.map((r) => r.p50));
    const floorP50 = mean(floor.map((r) => r.p50));
    const ratio = appRps / floorRps;
    const p50Ratio = appP50 / Math.max(floorP50, 0.5);
    const ok = ratio >= 0.5 && appP50 <= 2 * Math.max(floorP50, 0.5);
    if (!ok) misses++;
    const r = recorded[i]!;
    rows.push([
      e.name,
      appRps.toFixed(0),
      floorRps.toFixed(0),
      ratio.toFixed(2),
      `${appP50.toFixed(1)} ms`,
      `${floorP50.toFixed(1)} ms`,
      p50Ratio.toFixed(2),
      String(r.all.length),
      String(r.data.length),
      `${(r.bytes / 1024).toFixed(1)} kB`,
      ok ? 'OK' : 'MISS',
    ]);
    console.log(`  measured ${e.name}`);
  }
  const widths = header.map((h, c) => Math.max(h.length, ...rows.map((row) => row[c]!.length)));
  const line = (cells: string[]) => `| ${cells.map((cell, c) => (c === 0 ? cell.padEnd(widths[c]!) : cell.padStart(widths[c]!))).join(' | ')} |`;
  console.log(line(header));
  console.log(`|${widths.map((w, c) => (c === 0 ? '-'.repeat(w + 2) : `${'-'.repeat(w + 1)}:`)).join('|')}|`);
  for (const row of rows) console.log(line(row));
  console.log(
    '(p50 ratio uses a floor of at least 0.5 ms; SQL/req counts every statement of one request, session and transaction included; data SQL is what the floor replays)',
  );
  console.log(misses === 0 ? 'Every endpoint within reach of the floor: OK' : `${misses} endpoint(s) short of the targets: MISS`);

  // Requests still in flight when the load stopped finish before the pools close.
  for (const server of [appServer, floorServer]) {
    await new Promise((r) => {
      server.close(r);
      server.closeIdleConnections();
    });
  }
  await floorPool.end();
});
