/**
 * Tasks benchmark: 10,000 active batches with 300,000 journal entries (readings, rackings, an
 * oak addition each), made with SQL in a throwaway PostgreSQL cluster. Times the day's first
 * list (which writes every batch's task snapshot), then the Tasks list's first page and Today's
 * due tasks over HTTP, and recomputing every batch's tasks (the reminder job's `tasksDue`), and
 * prints the SQL statements each took (they must not grow with the number of batches, apart
 * from the snapshot writes, one INSERT per 5,000 tasks). Targets: each page under 150 ms,
 * recomputing under 5 s.
 * A script, not a test: `npm run bench:tasks`.
 */
import 'reflect-metadata';
import { performance } from 'node:perf_hooks';
import request from 'supertest';
import { createApp } from '../../server/app';
import { hashPassword } from '../../server/accounts/passwords';
import { systemActor } from '../../server/core/actor';
import { inTransaction } from '../../server/core/unit-of-work';
import { tasksDue } from '../../server/tasks/tasks.service';
import { withBenchDatabase } from './bench-database';

const BATCHES = Number(process.env.BENCH_BATCHES ?? 10_000);
const READINGS_PER_BATCH = 27;
const RUNS = 5;
const PAGE_TARGET_MS = 150;
const RECOMPUTE_TARGET_MS = 5000;

await withBenchDatabase(async ({ ds }) => {
  const seedStart = performance.now();
  const [{ id: userId }] = await ds.query(
    `INSERT INTO users (email, display_name, password_hash) VALUES ('bench@example.test', 'Bench Keeper', $1) RETURNING id`,
    [await hashPassword('bench-password')],
  );
  const [{ id: cellarId }] = await ds.query(`INSERT INTO cellars (name) VALUES ('Large test cellar') RETURNING id`);
  await ds.query(`INSERT INTO memberships (cellar_id, user_id, role) VALUES ($1, $2, 'keeper')`, [cellarId, userId]);
  await ds.query(
    `INSERT INTO batches (cellar_id, name, kind, yeast_name, yeast_tolerance_abv, planned_volume_l, started_on, og, stage)
     SELECT $1, 'Batch ' || i, (ARRAY['melomel','fruit-wine','cider'])[1 + i % 3], 'Bench yeast', 14, 20,
            (now() - (60 + i % 300) * interval '1 day')::date, 1.100, (ARRAY['primary','secondary','bulk-ageing'])[1 + i % 3]
       FROM generate_series(1, $2::int) i`,
    [cellarId, BATCHES],
  );
  await ds.query(
    `INSERT INTO journal_entries (cellar_id, batch_id, kind, payload, occurred_at, author_id)
     SELECT $1, b.id, 'reading',
            jsonb_build_object('kind','reading','sg',1.1 - k * 0.003,'temperatureC',null,'calibrationC',20,'correctedSg',1.1 - k * 0.003,'ph',null,'vesselId',null),
            b.started_on + k * 2 * interval '1 day' + interval '18 hours', $2
       FROM batches b, generate_series(1, $3::int) k WHERE b.cellar_id = $1`,
    [cellarId, userId, READINGS_PER_BATCH],
  );
  await ds.query(
    `INSERT INTO journal_entries (cellar_id, batch_id, kind, payload, occurred_at, author_id)
     SELECT $1, b.id, 'racked', jsonb_build_object('kind','racked','from','[]'::jsonb,'to','[]'::jsonb,'lossL',0.5,'override',null),
            b.started_on + k * 30 * interval '1 day', $2
       FROM batches b, generate_series(1, 2) k WHERE b.cellar_id = $1`,
    [cellarId, userId],
  );
  await ds.query(
    `INSERT INTO journal_entries (cellar_id, batch_id, kind, payload, occurred_at, author_id)
     SELECT $1, b.id, 'addition',
            jsonb_build_object('kind','addition','category','oak','name','Oak cubes','amount',20,'unit','g','vesselId',null,
                               'removeOn', to_char(now() + (b.started_on - current_date + 200) * interval '1 day', 'YYYY-MM-DD')),
            b.started_on + 40 * interval '1 day', $2
       FROM batches b WHERE b.cellar_id = $1`,
    [cellarId, userId],
  );
  await ds.query('ANALYZE');
  const [{ n: entries }] = await ds.query(`SELECT count(*)::int AS n FROM journal_entries`);
  console.log(`Seeded ${BATCHES} batches and ${entries} journal entries in ${((performance.now() - seedStart) / 1000).toFixed(1)} s`);

  let statements = 0;
  const logQuery = ds.logger.logQuery.bind(ds.logger);
  ds.logger.logQuery = (...args: Parameters<typeof logQuery>) => {
    statements += 1;
    return logQuery(...args);
  };

  const app = createApp({ dataSource: ds, sessionSecret: 'bench-secret-long-enough-0123456789abcdef', cookieSecure: false });
  const agent = request.agent(app);
  await agent.post('/api/auth/sign-in').send({ email: 'bench@example.test', password: 'bench-password' }).expect(200);
  const base = `/api/cellars/${cellarId}`;
  const time = async (name: string, target: number, run: () => Promise<void>) => {
    const times: number[] = [];
    let perRun = 0;
    for (let i = 0; i < RUNS; i++) {
      statements = 0;
      const start = performance.now();
      await run();
      times.push(performance.now() - start);
      perRun = statements;
    }
    times.sort((a, b) => a - b);
    const median = times[Math.floor(times.length / 2)]!;
    console.log(
      `${name.padEnd(36)} median ${median.toFixed(0).padStart(6)} ms  ${String(perRun).padStart(3)} SQL statements  ${median < target ? 'OK' : 'SLOW'}`,
    );
  };
  const get = (url: string) => async () => {
    const res = await agent.get(url);
    if (res.status !== 200) throw new Error(`${url} answered ${res.status}: ${JSON.stringify(res.body)}`);
  };
  // The day's first list writes every batch's task snapshot (server/tasks/task-snapshots.ts);
  // the lists after it read them. Both are printed: the first once, the others as medians.
  statements = 0;
  const coldStart = performance.now();
  await get(`${base}/tasks?limit=50`)();
  console.log(
    `${'first list of the day (writes snapshots)'.padEnd(36)} once   ${(performance.now() - coldStart).toFixed(0).padStart(6)} ms  ${String(statements).padStart(3)} SQL statements  (no target)`,
  );
  await time('tasks, first page (50)', PAGE_TARGET_MS, get(`${base}/tasks?limit=50`));
  await time("today's due tasks", PAGE_TARGET_MS, get(`${base}/tasks?buckets=overdue,today&withinDays=14&limit=50`));
  await time('today (records)', PAGE_TARGET_MS, get(`${base}/today`));
  const job = systemActor(cellarId, 'schedule', 'guest');
  const until = new Date(Date.now() + 7 * 86_400_000).toISOString().slice(0, 10);
  await time('recompute every batch (tasksDue)', RECOMPUTE_TARGET_MS, async () => {
    await inTransaction(ds, 'read', (tx) => tasksDue(job, tx, { until }));
  });
});
