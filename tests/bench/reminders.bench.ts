/**
 * Reminder pass benchmark: one cellar with 10,000 active batches and 2,000 one-off tasks due
 * today, a member who wants a mail per task and one who wants the daily digest, in a throwaway
 * PostgreSQL cluster. Times the pass (finding what is due and enqueueing 2,001 messages) and
 * counts its SQL statements, which must not grow with the number of tasks. Target: under 5 s.
 * A script, not a test: `npm run bench:reminders`.
 */
import 'reflect-metadata';
import { performance } from 'node:perf_hooks';
import { runReminderPass } from '../../server/mail/reminder-pass';
import { systemActor } from '../../server/core/actor';
import { localDate } from '../../server/core/local-date';
import { inTransaction } from '../../server/core/unit-of-work';
import { tasksDue } from '../../server/tasks/tasks.service';
import { withBenchDatabase } from './bench-database';

const BATCHES = 10_000;
const DUE_TASKS = 2_000;
const TARGET_MS = 5_000;

await withBenchDatabase(async ({ ds }) => {
  const [{ id: cellarId }] = await ds.query(`INSERT INTO cellars (name, time_zone) VALUES ('Large test cellar', 'Europe/Berlin') RETURNING id`);
  const users: { id: string }[] = await ds.query(
    `INSERT INTO users (email, display_name, password_hash) VALUES ('instant@example.test', 'Instant', 'x'), ('digest@example.test', 'Digest', 'x') RETURNING id`,
  );
  await ds.query(`INSERT INTO memberships (cellar_id, user_id, role) VALUES ($1, $2, 'hand'), ($1, $3, 'keeper')`, [
    cellarId,
    users[0]!.id,
    users[1]!.id,
  ]);
  await ds.query(
    `INSERT INTO member_mail_settings (cellar_id, user_id, delivery, digest_hour, kinds) VALUES ($1, $2, 'instant', 0, '{custom}'), ($1, $3, 'digest', 0, '{custom}')`,
    [cellarId, users[0]!.id, users[1]!.id],
  );
  await ds.query(
    `INSERT INTO batches (cellar_id, name, kind, yeast_name, yeast_tolerance_abv, planned_volume_l, started_on, stage)
     SELECT $1, 'Batch ' || i, 'melomel', 'Bench yeast', 14, 20, (now() - (i % 400) * interval '1 day')::date,
            (ARRAY['primary','secondary','bulk-ageing'])[1 + i % 3]
       FROM generate_series(1, $2::int) i`,
    [cellarId, BATCHES],
  );
  await ds.query(
    `INSERT INTO one_off_tasks (cellar_id, batch_id, title, due_on, show_days_ahead, created_by)
     SELECT $1, b.id, 'Check ' || b.name, (now() AT TIME ZONE 'Europe/Berlin')::date, 0, $3
       FROM (SELECT id, name FROM batches WHERE cellar_id = $1 ORDER BY name LIMIT $2) b`,
    [cellarId, DUE_TASKS, users[1]!.id],
  );

  let statements = 0;
  const logQuery = ds.logger.logQuery.bind(ds.logger);
  ds.logger.logQuery = (...args) => {
    statements++;
    return logQuery(...args);
  };
  const start = performance.now();
  const result = await runReminderPass(ds, { now: new Date(), publicUrl: 'http://127.0.0.1:8460', secret: 'bench-secret' });
  const ms = performance.now() - start;
  const [{ n }] = await ds.query(`SELECT count(*)::int AS n FROM mail_outbox`);
  console.log(`reminder pass: ${result.enqueued} messages enqueued (${n} in the outbox) in ${ms.toFixed(0)} ms with ${statements} SQL statements`);
  console.log(ms < TARGET_MS ? `within the ${TARGET_MS} ms target` : `SLOWER than the ${TARGET_MS} ms target`);
  // Where the time goes: finding what is due (the tasks service) against the rest.
  const dueStart = performance.now();
  const due = await inTransaction(ds, 'read', (tx) =>
    tasksDue(systemActor(cellarId, 'schedule', 'guest'), tx, { until: localDate(new Date(), 'Europe/Berlin') }),
  );
  console.log(`of which finding the ${due.length} due tasks alone takes ${(performance.now() - dueStart).toFixed(0)} ms`);
  if (ms >= TARGET_MS) process.exitCode = 1;
});
