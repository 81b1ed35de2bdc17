import { simpleParser } from 'mailparser';
import type { DataSource } from 'typeorm';
import { beforeAll, beforeEach, describe, expect, it } from 'vitest';
import { createApp } from '../../server/app';
import { createDataSource } from '../../server/db/data-source';
import { enqueueMail, type OutgoingMessage } from '../../server/mail/outbox';
import { claimDueMail, deliverDueMail } from '../../server/mail/outbox-worker';
import { loopbackTransport } from '../../server/mail/smtp-transport';
import { makeCellarWithCrew, TEST_PASSWORD, type CellarCrew } from '../helpers/crew';
import { privateDataSource, TEST_FROM, testMailbox, type TestMail } from '../helpers/mail';
import { agentsFor } from '../helpers/test-app';

const PUBLIC_URL = 'http://cellar.example.test';
let ds: DataSource;
let mail: TestMail;

beforeAll(async () => {
  ds = await privateDataSource('outbox');
  mail = await testMailbox();
});

beforeEach(async () => {
  await ds.query(`DELETE FROM mail_outbox`);
  mail.mailbox.clear();
  mail.mailbox.refuse(null);
});

const message = (to: string, extra: Partial<OutgoingMessage> = {}): OutgoingMessage => ({
  kind: 'invitation',
  cellarId: null,
  to,
  subject: `Hello ${to}`,
  text: `Plain words for ${to}`,
  html: `<p>HTML words for ${to}</p>`,
  ...extra,
});

const enqueue = (...messages: OutgoingMessage[]) =>
  ds.transaction(async (tx) => {
    for (const m of messages) await enqueueMail(tx, m, PUBLIC_URL);
  });

const statusOf = async (to: string) =>
  (await ds.query(`SELECT status, attempts, last_error, next_attempt_at FROM mail_outbox WHERE to_address = $1`, [to]))[0] as {
    status: string;
    attempts: number;
    last_error: string | null;
    next_attempt_at: Date;
  };

/** A clock that starts a second from now and moves only when told. */
function testClock() {
  let t = Date.now() + 1000;
  return { now: () => new Date(t), advance: (ms: number) => (t += ms) };
}

describe('enqueueing in the transaction of the change', () => {
  it('sends nothing when that transaction rolls back', async () => {
    await expect(
      ds.transaction(async (tx) => {
        await enqueueMail(tx, message('rolled.back@example.test'), PUBLIC_URL);
        throw new Error('the change failed');
      }),
    ).rejects.toThrow('the change failed');
    expect(await ds.query(`SELECT count(*)::int AS n FROM mail_outbox`)).toEqual([{ n: 0 }]);
    expect(await mail.deliver(ds)).toEqual({ sent: 0, deferred: 0, failed: 0 });
    expect(mail.mailbox.messages()).toEqual([]);
  });

  it('delivers a committed message once, with both bodies, its headers and a Message-ID', async () => {
    await enqueue(message('once@example.test', { cellarId: null, headers: { 'List-Unsubscribe': '<http://cellar.example.test/u/x>' } }));
    expect(await mail.deliver(ds)).toEqual({ sent: 1, deferred: 0, failed: 0 });
    expect(await mail.deliver(ds)).toEqual({ sent: 0, deferred: 0, failed: 0 });
    const received = mail.mailbox.messages();
    expect(received).toHaveLength(1);
    const parsed = await simpleParser(received[0]!.raw);
    expect(parsed.subject).toBe('Hello once@example.test');
    expect(parsed.from?.text).toBe(TEST_FROM.replace('Cellarwright tests', '"Cellarwright tests"'));
    expect((parsed.to as { text: string }).text).toBe('once@example.test');
    expect(parsed.text?.trim()).toBe('Plain words for once@example.test');
    expect(parsed.html).toContain('<p>HTML words for once@example.test</p>');
    expect(parsed.headerLines.find((h) => h.key === 'list-unsubscribe')?.line).toBe('List-Unsubscribe: <http://cellar.example.test/u/x>');
    expect(parsed.messageId).toMatch(/^<[0-9a-f]{40}@cellar\.example\.test>$/);
    expect((await statusOf('once@example.test')).status).toBe('sent');
  });

  it('keeps one row per dedupe key, with a Message-ID made from the key', async () => {
    const first = await ds.transaction((tx) => enqueueMail(tx, message('dedupe@example.test', { dedupeKey: 'k1' }), PUBLIC_URL));
    const second = await ds.transaction((tx) => enqueueMail(tx, message('dedupe@example.test', { dedupeKey: 'k1' }), PUBLIC_URL));
    expect([first, second]).toEqual([true, false]);
    const rows = await ds.query(`SELECT message_id FROM mail_outbox WHERE dedupe_key = 'k1'`);
    expect(rows).toHaveLength(1);
    await enqueue(message('dedupe@example.test', { dedupeKey: 'k2' }));
    const ids = await ds.query(`SELECT DISTINCT message_id FROM mail_outbox`);
    expect(ids).toHaveLength(2);
  });
});

describe('retries', () => {
  it('waits longer after each refusal and delivers once the server accepts again', async () => {
    const clock = testClock();
    await enqueue(message('refused@example.test'));
    mail.mailbox.refuse('try again later, the disk is full');
    expect(await mail.deliver(ds, { now: clock.now })).toEqual({ sent: 0, deferred: 1, failed: 0 });
    const first = await statusOf('refused@example.test');
    expect(first).toMatchObject({ status: 'pending', attempts: 1 });
    expect(first.last_error).toMatch(/451.*disk is full/);
    const firstWait = new Date(first.next_attempt_at).getTime() - clock.now().getTime();
    expect(firstWait).toBe(30_000);

    clock.advance(29_000);
    expect(await mail.deliver(ds, { now: clock.now })).toEqual({ sent: 0, deferred: 0, failed: 0 });
    clock.advance(1_000);
    expect(await mail.deliver(ds, { now: clock.now })).toEqual({ sent: 0, deferred: 1, failed: 0 });
    const second = await statusOf('refused@example.test');
    expect(new Date(second.next_attempt_at).getTime() - clock.now().getTime()).toBe(60_000);

    mail.mailbox.refuse(null);
    clock.advance(60_000);
    expect(await mail.deliver(ds, { now: clock.now })).toEqual({ sent: 1, deferred: 0, failed: 0 });
    expect(mail.mailbox.messages()).toHaveLength(1);
    expect(await statusOf('refused@example.test')).toMatchObject({ status: 'sent', attempts: 3, last_error: null });
  });

  it('loses and doubles nothing while the server is unreachable for a while', async () => {
    const clock = testClock();
    const addresses = Array.from({ length: 12 }, (_, i) => `away.${i}@example.test`);
    await enqueue(...addresses.map((a) => message(a)));
    // Nothing listens on port 1 of loopback: the connection is refused.
    const unreachable = loopbackTransport('127.0.0.1', 1);
    for (let round = 0; round < 3; round++) {
      const pass = await deliverDueMail(ds, { transport: unreachable, from: TEST_FROM, now: clock.now });
      expect(pass).toEqual({ sent: 0, deferred: 12, failed: 0 });
      clock.advance(10 * 60_000);
    }
    unreachable.close();
    expect((await statusOf('away.0@example.test')).last_error).toMatch(/ECONNREFUSED/);
    expect(await mail.deliver(ds, { now: clock.now })).toEqual({ sent: 12, deferred: 0, failed: 0 });
    expect(await mail.deliver(ds, { now: clock.now })).toEqual({ sent: 0, deferred: 0, failed: 0 });
    const to = mail.mailbox
      .messages()
      .flatMap((m) => m.envelopeTo)
      .sort();
    expect(to).toEqual([...addresses].sort());
  });

  it('marks a message failed after the last attempt, with the reason', async () => {
    const clock = testClock();
    await enqueue(message('doomed@example.test'));
    mail.mailbox.refuse('mailbox unavailable');
    for (let attempt = 1; attempt <= 3; attempt++) {
      await mail.deliver(ds, { now: clock.now, maxAttempts: 3 });
      clock.advance(24 * 60 * 60_000);
    }
    expect(await statusOf('doomed@example.test')).toMatchObject({ status: 'failed', attempts: 3 });
    expect((await statusOf('doomed@example.test')).last_error).toMatch(/mailbox unavailable/);
    // Failed stays failed: no further pass picks it up.
    mail.mailbox.refuse(null);
    expect(await mail.deliver(ds, { now: clock.now })).toEqual({ sent: 0, deferred: 0, failed: 0 });
  });
});

describe('a worker that stops between claiming and sending', () => {
  it('leaves the message to another worker once its lease runs out, and it arrives once', async () => {
    const clock = testClock();
    await enqueue(message('orphan@example.test'));
    const claimed = await claimDueMail(ds, clock.now(), 10, 5 * 60_000);
    expect(claimed.map((c) => c.to_address)).toEqual(['orphan@example.test']);
    // The claiming worker is gone. While its lease holds, nobody else sends the message.
    expect(await mail.deliver(ds, { now: clock.now })).toEqual({ sent: 0, deferred: 0, failed: 0 });
    clock.advance(5 * 60_000);
    expect(await mail.deliver(ds, { now: clock.now })).toEqual({ sent: 1, deferred: 0, failed: 0 });
    expect(await mail.deliver(ds, { now: clock.now })).toEqual({ sent: 0, deferred: 0, failed: 0 });
    expect(mail.mailbox.messages()).toHaveLength(1);
  });
});

describe('two app instances on one database', () => {
  it('deliver each of 100 messages exactly once', async () => {
    const addresses = Array.from({ length: 100 }, (_, i) => `member.${String(i).padStart(3, '0')}@example.test`);
    await enqueue(...addresses.map((a) => message(a)));
    // The second instance: its own connection pool and its own transport, the same database.
    const other = createDataSource((ds.options as { url: string }).url);
    await other.initialize();
    const otherTransport = loopbackTransport(mail.mailbox.host, mail.mailbox.port);
    const drain = async (instance: DataSource, transport: typeof otherTransport) => {
      let sent = 0;
      for (;;) {
        const pass = await deliverDueMail(instance, { transport, from: TEST_FROM, batchSize: 5 });
        sent += pass.sent;
        if (pass.sent + pass.deferred + pass.failed === 0) return sent;
      }
    };
    try {
      const [a, b] = await Promise.all([drain(ds, mail.transport), drain(other, otherTransport)]);
      expect(a + b).toBe(100);
    } finally {
      otherTransport.close();
      await other.destroy();
    }
    const received = mail.mailbox.messages();
    expect(received).toHaveLength(100);
    expect(new Set(received.map((m) => m.messageId)).size).toBe(100);
    expect(received.flatMap((m) => m.envelopeTo).sort()).toEqual(addresses);
    expect(await ds.query(`SELECT status, count(*)::int AS n FROM mail_outbox GROUP BY status`)).toEqual([{ status: 'sent', n: 100 }]);
  });
});

describe('what Keepers see', () => {
  let crew: CellarCrew;
  let other: CellarCrew;
  let as: Awaited<ReturnType<typeof agentsFor>>;

  beforeAll(async () => {
    crew = await makeCellarWithCrew(ds);
    other = await makeCellarWithCrew(ds);
  });

  const appWith = (showAccountMail: boolean) =>
    createApp({
      dataSource: ds,
      sessionSecret: 'test-secret-that-is-long-enough-0123456789',
      cookieSecure: false,
      mail: { mailbox: mail.mailbox, showAccountMail },
    });

  it('lists failed mail with its reason to Keepers only, and retries it', async () => {
    const app = appWith(false);
    as = await agentsFor(app, crew, TEST_PASSWORD);
    const clock = testClock();
    await enqueue(message('bounced@example.test', { cellarId: crew.cellar.id }), message('theirs@example.test', { cellarId: other.cellar.id }));
    mail.mailbox.refuse('no such mailbox here');
    await mail.deliver(ds, { now: clock.now, maxAttempts: 1 });
    mail.mailbox.refuse(null);

    const seen = await as.keeper.get(`/api/cellars/${crew.cellar.id}/mail`);
    expect(seen.status).toBe(200);
    expect(seen.body.localMailbox).toBe(true);
    expect(seen.body.undelivered).toEqual([
      expect.objectContaining({ to: 'bounced@example.test', status: 'failed', attempts: 1, lastError: expect.stringMatching(/no such mailbox/) }),
    ]);
    expect((await as.hand.get(`/api/cellars/${crew.cellar.id}/mail`)).status).toBe(403);
    expect((await as.guest.get(`/api/cellars/${crew.cellar.id}/mail`)).status).toBe(403);

    const theirs = (await ds.query(`SELECT id FROM mail_outbox WHERE to_address = 'theirs@example.test'`))[0].id;
    expect((await as.keeper.post(`/api/cellars/${crew.cellar.id}/mail/${theirs}/retry`)).status).toBe(404);
    const id = seen.body.undelivered[0].id;
    expect((await as.hand.post(`/api/cellars/${crew.cellar.id}/mail/${id}/retry`)).status).toBe(403);
    expect((await as.keeper.post(`/api/cellars/${crew.cellar.id}/mail/${id}/retry`)).status).toBe(204);
    expect(await mail.deliver(ds)).toEqual({ sent: 1, deferred: 0, failed: 0 });
    expect((await as.keeper.get(`/api/cellars/${crew.cellar.id}/mail`)).body.undelivered).toEqual([]);
    expect(mail.mailbox.messages().flatMap((m) => m.envelopeTo)).toEqual(['bounced@example.test']);
  });

  it("shows the local mailbox to a cellar's Keepers: their cellar's mail, never another cellar's", async () => {
    await enqueue(
      message('ours@example.test', { cellarId: crew.cellar.id }),
      message('not.ours@example.test', { cellarId: other.cellar.id }),
      message('account@example.test', { kind: 'password-reset', cellarId: null }),
    );
    await mail.deliver(ds);
    const outgoing = (app: ReturnType<typeof appWith>) =>
      agentsFor(app, crew, TEST_PASSWORD).then(({ keeper }) => keeper.get(`/api/cellars/${crew.cellar.id}/mail/outgoing`));

    const strict = await outgoing(appWith(false));
    expect(strict.status).toBe(200);
    expect(strict.body.map((m: { to: string[] }) => m.to[0])).toEqual(['ours@example.test']);
    expect(strict.body[0]).toMatchObject({ subject: 'Hello ours@example.test', scope: 'cellar', text: expect.stringContaining('Plain words') });
    expect(strict.body[0].html).toContain('HTML words');

    const withAccountMail = await outgoing(appWith(true));
    expect(withAccountMail.body.map((m: { to: string[] }) => m.to[0]).sort()).toEqual(['account@example.test', 'ours@example.test']);

    const hand = await (await agentsFor(appWith(true), crew, TEST_PASSWORD)).hand.get(`/api/cellars/${crew.cellar.id}/mail/outgoing`);
    expect(hand.status).toBe(403);
  });

  it('has no Outgoing mail page when a real SMTP server is configured', async () => {
    const app = createApp({ dataSource: ds, sessionSecret: 'test-secret-that-is-long-enough-0123456789', cookieSecure: false });
    const { keeper } = await agentsFor(app, crew, TEST_PASSWORD);
    const res = await keeper.get(`/api/cellars/${crew.cellar.id}/mail/outgoing`);
    expect(res.status).toBe(404);
    expect(res.body.message).toMatch(/real mail server/);
    expect((await keeper.get(`/api/cellars/${crew.cellar.id}/mail`)).body.localMailbox).toBe(false);
  });
});
