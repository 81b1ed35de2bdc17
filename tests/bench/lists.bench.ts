/**
 * List benchmark on a large cellar: 3,000 batches, 6,000 vessels, 90,000 journal entries and
 * 3,000 cases, made with SQL in a throwaway PostgreSQL cluster. Times the list endpoints the
 * screens call (first page, filters, a deep page) over HTTP against the real app and prints
 * each median. Target: every page under 250 ms on the development machine. A script, not a
 * test: `npm run bench:lists`.
 */
import 'reflect-metadata';
import { performance } from 'node:perf_hooks';
import request from 'supertest';
import { createApp } from '../../server/app';
import { hashPassword } from '../../server/accounts/passwords';
import { withBenchDatabase } from './bench-database';

const BATCHES = 3000;
const VESSELS = 6000;
const ENTRIES_PER_BATCH = 30;
const RUNS = 15;
const TARGET_MS = 250;

await withBenchDatabase(async ({ ds }) => {
  const seedStart = performance.now();
  const [{ id: userId }] = await ds.query(
    `INSERT INTO users (email, display_name, password_hash) VALUES ('bench@example.test', 'Bench Keeper', $1) RETURNING id`,
    [await hashPassword('bench-password')],
  );
  const [{ id: cellarId }] = await ds.query(`INSERT INTO cellars (name) VALUES ('Large test cellar') RETURNING id`);
  await ds.query(`INSERT INTO memberships (cellar_id, user_id, role) VALUES ($1, $2, 'keeper')`, [cellarId, userId]);
  await ds.query(
    `INSERT INTO batches (cellar_id, name, kind, yeast_name, yeast_tolerance_abv, planned_volume_l, started_on, og, stage, last_racked_at, last_reading_sg, last_reading_at)
     SELECT $1, 'Batch ' || i || CASE WHEN i % 3 = 0 THEN ' melomel' ELSE ' traditional' END,
            CASE WHEN i % 3 = 0 THEN 'melomel' ELSE 'traditional-mead' END, 'Bench yeast', 14, 20,
            (now() - (i % 900) * interval '1 day')::date, 1.100,
            (ARRAY['primary','secondary','bulk-ageing','bottled','finished'])[1 + i % 5],
            CASE WHEN i % 2 = 0 THEN now() - (i % 200) * interval '1 day' END, 1.010, now() - (i % 30) * interval '1 day'
       FROM generate_series(1, $2::int) i`,
    [cellarId, BATCHES],
  );
  await ds.query(
    `INSERT INTO vessels (cellar_id, code, name, kind, material, capacity_l, cleaning_state, sanitised_at)
     SELECT $1, upper(lpad(to_hex(i), 8, '0')), 'Vessel ' || i, 'carboy', 'glass', 4.5 + (i % 5) * 5,
            (ARRAY['dirty','clean','sanitised'])[1 + i % 3], CASE WHEN i % 3 = 2 THEN now() - (i % 14) * interval '1 day' END
       FROM generate_series(1, $2::int) i`,
    [cellarId, VESSELS],
  );
  // Two thirds of the batches sit in one vessel each.
  await ds.query(
    `WITH b AS (SELECT id, row_number() OVER (ORDER BY id) n FROM batches WHERE cellar_id = $1 AND stage IN ('primary','secondary','bulk-ageing')),
          v AS (SELECT id, row_number() OVER (ORDER BY id) n FROM vessels WHERE cellar_id = $1)
     UPDATE vessels SET batch_id = b.id, volume_l = 4, filled_at = now() FROM b JOIN v ON v.n = b.n WHERE vessels.id = v.id`,
    [cellarId],
  );
  await ds.query(
    `INSERT INTO journal_entries (cellar_id, batch_id, kind, payload, occurred_at, author_id)
     SELECT $1, b.id, 'reading',
            jsonb_build_object('kind','reading','sg',1.1 - k * 0.003,'temperatureC',null,'calibrationC',20,'correctedSg',1.1 - k * 0.003,'ph',null,'vesselId',null),
            now() - (30 - k) * interval '1 day', $2
       FROM batches b, generate_series(1, $3::int) k WHERE b.cellar_id = $1`,
    [cellarId, userId, ENTRIES_PER_BATCH],
  );
  await ds.query(
    `WITH lots AS (
       INSERT INTO bottle_lots (cellar_id, batch_id, code, bottled_on, bottle_ml, bottle_count, closure, carbonation, sulfite_added)
       SELECT $1, id, upper(substr(md5(id::text), 1, 8)), started_on + 200, 750, 24, 'cork', 'still', true FROM batches WHERE cellar_id = $1 AND stage = 'bottled'
       RETURNING id, code)
     INSERT INTO bottle_cases (cellar_id, lot_id, code, number, bottles_initial, bottles_left)
     SELECT $1, lots.id, upper(substr(md5(lots.id::text || n), 1, 8)), n, 12, 12 - n FROM lots, generate_series(1, 2) n`,
    [cellarId],
  );
  await ds.query('ANALYZE');
  console.log(
    `Seeded ${BATCHES} batches, ${VESSELS} vessels, ${BATCHES * ENTRIES_PER_BATCH} journal entries in ${((performance.now() - seedStart) / 1000).toFixed(1)} s`,
  );

  const app = createApp({ dataSource: ds, sessionSecret: 'bench-secret-long-enough-0123456789abcdef', cookieSecure: false });
  const agent = request.agent(app);
  await agent.post('/api/auth/sign-in').send({ email: 'bench@example.test', password: 'bench-password' }).expect(200);
  const base = `/api/cellars/${cellarId}`;
  const cases: [string, string][] = [
    ['batches, first page', `${base}/batches`],
    ['batches, needs racking', `${base}/batches?needsRacking=true`],
    ['batches, aged 6 months, melomel', `${base}/batches?agedMonths=6&kind=melomel`],
    ['batches, text search', `${base}/batches?q=melomel&sort=name`],
    ['batches, page 100', `${base}/batches?page=100`],
    ['vessels, first page', `${base}/vessels`],
    ['vessels, free and sanitised, 10 L+', `${base}/vessels?freeAndSanitised=true&minCapacityL=10`],
    ['vessels, page 100', `${base}/vessels?page=100`],
    ['bottle lots, in stock', `${base}/lots?inStock=true`],
    ['today', `${base}/today`],
  ];
  let slow = 0;
  for (const [name, url] of cases) {
    const times: number[] = [];
    for (let i = 0; i < RUNS; i++) {
      const start = performance.now();
      const res = await agent.get(url);
      times.push(performance.now() - start);
      if (res.status !== 200) throw new Error(`${url} answered ${res.status}: ${JSON.stringify(res.body)}`);
    }
    times.sort((a, b) => a - b);
    const median = times[Math.floor(times.length / 2)]!;
    if (median >= TARGET_MS) slow++;
    console.log(`${name.padEnd(36)} median ${median.toFixed(0).padStart(4)} ms  ${median < TARGET_MS ? 'OK' : 'SLOW'}`);
  }
  console.log(slow === 0 ? `All lists under ${TARGET_MS} ms: OK` : `${slow} list(s) at or over ${TARGET_MS} ms: SLOW`);
});
