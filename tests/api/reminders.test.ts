import dayjs from 'dayjs';
import type { Express } from 'express';
import request from 'supertest';
import type { DataSource } from 'typeorm';
import { beforeAll, beforeEach, describe, expect, it } from 'vitest';
import { createApp } from '../../server/app';
import { localDate } from '../../server/core/local-date';
import { createDataSource } from '../../server/db/data-source';
import { messageIdFor } from '../../server/mail/outbox';
import { REMINDER_PASS_LOCK, runReminderPass } from '../../server/mail/reminder-pass';
import { makeBatch } from '../helpers/batches';
import { countQueries } from '../helpers/query-count';
import { agentsFor } from '../helpers/test-app';
import { makeCellarWithCrew, TEST_PASSWORD, type CellarCrew } from '../helpers/crew';
import { mailTo, privateDataSource, testMailbox, type TestMail } from '../helpers/mail';

const PUBLIC_URL = 'http://cellar.example.test';
const SECRET = 'test-secret-that-is-long-enough-0123456789';
// Far from the test machine's zone (UTC here): 07:00 there is the evening before in UTC.
const ZONE = 'Pacific/Auckland';
let ds: DataSource;
let app: Express;
let mail: TestMail;

beforeAll(async () => {
  ds = await privateDataSource('reminders');
  mail = await testMailbox();
  app = createApp({ dataSource: ds, sessionSecret: SECRET, cookieSecure: false, publicUrl: PUBLIC_URL, mail: { mailbox: mail.mailbox } });
});

beforeEach(() => mail.mailbox.clear());

/** The moment it is `hh:mm` on the cellar's current local date, in its time zone. */
function atLocal(hh: number, mm: number, zone = ZONE): Date {
  const day = localDate(new Date(), zone);
  const guess = new Date(`${day}T${String(hh).padStart(2, '0')}:${String(mm).padStart(2, '0')}:00Z`);
  const parts = new Intl.DateTimeFormat('en-GB', {
    timeZone: zone,
    hourCycle: 'h23',
    year: 'numeric',
    month: '2-digit',
    day: '2-digit',
    hour: '2-digit',
    minute: '2-digit',
  })
    .formatToParts(guess)
    .reduce<Record<string, string>>((acc, p) => ({ ...acc, [p.type]: p.value }), {});
  const shownAsUtc = Date.UTC(+parts.year!, +parts.month! - 1, +parts.day!, +parts.hour!, +parts.minute!);
  return new Date(guess.getTime() - (shownAsUtc - guess.getTime()));
}

const pass = (now: Date, on: DataSource = ds) => runReminderPass(on, { now, publicUrl: PUBLIC_URL, secret: SECRET });
const outboxFor = (email: string) =>
  ds.query(`SELECT kind, dedupe_key, message_id FROM mail_outbox WHERE to_address = $1 ORDER BY dedupe_key`, [email]);

/** A cellar in ZONE with a batch and one-off tasks due on its local today (and the day before). */
async function cellarWithDueTasks(titles: string[]): Promise<CellarCrew & { batchId: string }> {
  const crew = await makeCellarWithCrew(ds);
  await ds.query(`UPDATE cellars SET time_zone = $2 WHERE id = $1`, [crew.cellar.id, ZONE]);
  const batch = await makeBatch(ds, crew.cellar.id, { name: 'Heather melomel' });
  const today = localDate(new Date(), ZONE);
  for (const [i, title] of titles.entries()) {
    await ds.query(
      `INSERT INTO one_off_tasks (cellar_id, batch_id, title, due_on, show_days_ahead, created_by) VALUES ($1, $2, $3, $4::date - $5::int, 0, $6)`,
      [crew.cellar.id, batch.id, title, today, i % 2, crew.keeper.id],
    );
  }
  return { ...crew, batchId: batch.id };
}

describe('the reminder pass', () => {
  it('reminds an "at once" member per task, and a digest member once a day at their hour in the cellar’s zone', async () => {
    const crew = await cellarWithDueTasks(['Rack off the lees', 'Check the headspace']);
    const { hand } = await agentsFor(app, crew, TEST_PASSWORD);
    const settings = `/api/cellars/${crew.cellar.id}/mail-settings`;
    expect((await hand.get(settings)).body).toMatchObject({ delivery: 'digest', digestHour: 7 });
    expect((await hand.put(settings).send({ delivery: 'instant', digestHour: 7, kinds: ['custom'] })).status).toBe(200);

    // 06:30 in Auckland: the Hand's reminders go; the Keeper's 07:00 digest does not yet; the Guest gets nothing.
    expect(await pass(atLocal(6, 30))).toEqual({ ran: true, enqueued: 2 });
    expect((await outboxFor(crew.hand.email)).map((r: { kind: string }) => r.kind)).toEqual(['task-reminder', 'task-reminder']);
    expect(await outboxFor(crew.keeper.email)).toEqual([]);
    expect(await pass(atLocal(6, 55))).toEqual({ ran: true, enqueued: 0 });

    expect(await pass(atLocal(7, 0))).toEqual({ ran: true, enqueued: 1 });
    expect(await pass(atLocal(9, 0))).toEqual({ ran: true, enqueued: 0 });
    expect(await outboxFor(crew.guest.email)).toEqual([]);
    const [digestRow] = await outboxFor(crew.keeper.email);
    expect(digestRow.message_id).toBe(messageIdFor(digestRow.dedupe_key, PUBLIC_URL));

    await mail.deliverAll(ds);
    const [digest] = await mailTo(mail.mailbox, crew.keeper.email);
    // The digest lists every kind by default: the two tasks above, and what the cellar's plan makes due.
    // One of the two was due yesterday: the subject counts it overdue, its line says since when (dayjs writes the day).
    const yesterday = dayjs(localDate(new Date(), ZONE)).subtract(1, 'day').format('D MMM YYYY');
    expect(digest!.subject!.startsWith(`${crew.cellar.name}: `)).toBe(true);
    expect(digest!.subject!.slice(crew.cellar.name.length)).toMatch(/^: \d+ tasks? overdue, \d+ due today$/);
    expect(digest!.text).toContain('Rack off the lees: Heather melomel\nDue today\n');
    expect(digest!.text).toContain(`Check the headspace: Heather melomel\nDue ${yesterday}, 1 day overdue\n`);
    expect(digest!.text).toContain(`${PUBLIC_URL}/c/${crew.cellar.id}/batches/${crew.batchId}`);
    expect(digest!.html).toContain(`${PUBLIC_URL}/c/${crew.cellar.id}/batches/${crew.batchId}`);
    const header = (key: string) => digest!.headerLines.find((h) => h.key === key)?.line.replace(/\r\n\s+/g, ' ');
    expect(header('list-unsubscribe')).toMatch(/^List-Unsubscribe: <http:\/\/cellar\.example\.test\/api\/mail\/unsubscribe\?c=.+&u=.+&s=.+>$/);
    expect(header('list-unsubscribe-post')).toBe('List-Unsubscribe-Post: List-Unsubscribe=One-Click');
    const reminders = await mailTo(mail.mailbox, crew.hand.email);
    expect(reminders.map((m) => m.subject).sort()).toEqual([
      'Due: Rack off the lees (Heather melomel)',
      'Overdue: Check the headspace (Heather melomel)',
    ]);
  });

  it('gives a Guest only what they opt into', async () => {
    const crew = await cellarWithDueTasks(['Taste it']);
    await pass(atLocal(8, 0));
    expect(await outboxFor(crew.guest.email)).toEqual([]);
    const { guest } = await agentsFor(app, crew, TEST_PASSWORD);
    const put = await guest.put(`/api/cellars/${crew.cellar.id}/mail-settings`).send({ delivery: 'instant', digestHour: 7, kinds: ['custom'] });
    expect(put.status).toBe(200);
    expect(await pass(atLocal(8, 5))).toMatchObject({ enqueued: 1 });
    expect(await outboxFor(crew.guest.email)).toHaveLength(1);
    const bad = await guest.put(`/api/cellars/${crew.cellar.id}/mail-settings`).send({ delivery: 'hourly', digestHour: 25, kinds: ['nap'] });
    expect(bad.status).toBe(400);
  });

  it('skips while another instance holds the pass’s lock', async () => {
    await cellarWithDueTasks(['Locked out']);
    const runner = ds.createQueryRunner();
    await runner.connect();
    try {
      await runner.query(`SELECT pg_advisory_lock($1)`, [REMINDER_PASS_LOCK]);
      expect(await pass(atLocal(12, 0))).toEqual({ ran: false, enqueued: 0 });
    } finally {
      await runner.query(`SELECT pg_advisory_unlock($1)`, [REMINDER_PASS_LOCK]);
      await runner.release();
    }
    expect((await pass(atLocal(12, 0))).ran).toBe(true);
  });

  it('sends each of 100 reminders exactly once with two app instances running the pass and delivering', async () => {
    const crew = await cellarWithDueTasks(Array.from({ length: 100 }, (_, i) => `Task ${String(i).padStart(3, '0')}`));
    await ds.query(`INSERT INTO member_mail_settings (cellar_id, user_id, delivery, digest_hour, kinds) VALUES ($1, $2, 'instant', 7, '{custom}')`, [
      crew.cellar.id,
      crew.hand.id,
    ]);
    const other = createDataSource((ds.options as { url: string }).url);
    await other.initialize();
    try {
      const now = atLocal(10, 0);
      const results = await Promise.all([pass(now), pass(now, other), pass(now), pass(now, other)]);
      // The 100 reminders of the Hand (the Keeper's digest also goes, once).
      expect(results.filter((r) => r.ran).length).toBeGreaterThanOrEqual(1);
      expect(await outboxFor(crew.hand.email)).toHaveLength(100);
      await Promise.all([mail.deliverAll(ds, { batchSize: 7 }), mail.deliverAll(other, { batchSize: 7 })]);
    } finally {
      await other.destroy();
    }
    const received = await mailTo(mail.mailbox, crew.hand.email);
    expect(received).toHaveLength(100);
    expect(new Set(received.map((m) => m.subject)).size).toBe(100);
    expect(new Set(received.map((m) => m.messageId)).size).toBe(100);
  });
});

describe('the cost of the pass', () => {
  it('sends the same number of SQL statements for 3 due tasks as for 60', async () => {
    const crew = await cellarWithDueTasks(['One', 'Two', 'Three']);
    await ds.query(`INSERT INTO member_mail_settings (cellar_id, user_id, delivery, digest_hour, kinds) VALUES ($1, $2, 'instant', 7, '{custom}')`, [
      crew.cellar.id,
      crew.hand.id,
    ]);
    const now = atLocal(11, 0);
    const few = await countQueries(ds, () => pass(now));
    expect(await outboxFor(crew.hand.email)).toHaveLength(3);
    const today = localDate(new Date(), ZONE);
    await ds.query(
      `INSERT INTO one_off_tasks (cellar_id, batch_id, title, due_on, show_days_ahead, created_by)
       SELECT $1, $2, 'More ' || i, $3::date, 0, $4 FROM generate_series(1, 57) i`,
      [crew.cellar.id, crew.batchId, today, crew.keeper.id],
    );
    const many = await countQueries(ds, () => pass(now));
    expect(await outboxFor(crew.hand.email)).toHaveLength(60);
    expect(many).toBe(few);
  });
});

describe('unsubscribing', () => {
  it('shows a button first, turns reminders off on POST, and refuses a tampered link', async () => {
    const crew = await cellarWithDueTasks(['Stir the lees']);
    await pass(atLocal(8, 0));
    await mail.deliverAll(ds);
    const [digest] = await mailTo(mail.mailbox, crew.keeper.email);
    const link = digest!.headerLines
      .find((h) => h.key === 'list-unsubscribe')!
      .line.replace(/\r\n\s+/g, ' ')
      .match(/<(.+)>/)![1]!;
    const path = link.replace(PUBLIC_URL, '');

    const look = await request(app).get(path);
    expect(look.status).toBe(200);
    expect(look.text).toContain('Stop these mails');
    expect(look.text).toContain(crew.cellar.name);
    expect(await ds.query(`SELECT delivery FROM member_mail_settings WHERE user_id = $1`, [crew.keeper.id])).toEqual([]);

    const tampered = path.replace(/s=[^&]+/, 's=AAAA');
    expect((await request(app).post(tampered)).status).toBe(400);
    const otherMember = path.replace(crew.keeper.id, crew.hand.id);
    expect((await request(app).post(otherMember)).status).toBe(400);

    // A mail client's one-click request (RFC 8058): a form POST with List-Unsubscribe=One-Click.
    const done = await request(app).post(path).type('form').send('List-Unsubscribe=One-Click');
    expect(done.status).toBe(200);
    expect(await ds.query(`SELECT delivery FROM member_mail_settings WHERE user_id = $1`, [crew.keeper.id])).toEqual([{ delivery: 'off' }]);
    await ds.query(`DELETE FROM mail_outbox WHERE to_address = $1`, [crew.keeper.email]);
    await pass(atLocal(8, 30));
    expect(await outboxFor(crew.keeper.email)).toEqual([]);
  });
});
