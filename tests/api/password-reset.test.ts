import type { Express } from 'express';
import request from 'supertest';
import type { DataSource } from 'typeorm';
import { beforeAll, describe, expect, it } from 'vitest';
import { createApp } from '../../server/app';
import { makeUser, TEST_PASSWORD } from '../helpers/crew';
import { linkIn, mailTo, privateDataSource, testMailbox, tokenOf, type TestMail } from '../helpers/mail';
import { signedInAgent } from '../helpers/test-app';

const PUBLIC_URL = 'http://cellar.example.test';
const ANSWER_FLOOR_MS = 150;
let ds: DataSource;
let app: Express;
let mail: TestMail;

beforeAll(async () => {
  ds = await privateDataSource('reset');
  mail = await testMailbox();
  app = createApp({
    dataSource: ds,
    sessionSecret: 'test-secret-that-is-long-enough-0123456789',
    cookieSecure: false,
    publicUrl: PUBLIC_URL,
    mail: { mailbox: mail.mailbox, resetAnswerMs: ANSWER_FLOOR_MS, limits: { perEmailPerHour: 3, perIpPerHour: 1000 } },
  });
});

const ask = (email: string) => request(app).post('/api/auth/password-reset').send({ email });

async function resetTokenFor(email: string): Promise<string> {
  await mail.deliver(ds);
  const received = await mailTo(mail.mailbox, email);
  expect(received.length).toBeGreaterThan(0);
  return tokenOf(linkIn(received[0]!.text, `${PUBLIC_URL}/reset-password?token=`));
}

describe('asking for a reset', () => {
  it('answers the same, in words and status, whether or not the address has an account', async () => {
    const user = await makeUser(ds, 'Forgetful Person');
    const started = Date.now();
    const known = await ask(user.email);
    const knownMs = Date.now() - started;
    const again = Date.now();
    const unknown = await ask('no.such.person@example.test');
    const unknownMs = Date.now() - again;
    expect(known.status).toBe(202);
    expect(unknown.status).toBe(202);
    expect(unknown.body).toEqual(known.body);
    // Both take at least the floor, which is far longer than the work the known path adds.
    expect(knownMs).toBeGreaterThanOrEqual(ANSWER_FLOOR_MS - 5);
    expect(unknownMs).toBeGreaterThanOrEqual(ANSWER_FLOOR_MS - 5);

    await mail.deliver(ds);
    expect(await mailTo(mail.mailbox, 'no.such.person@example.test')).toEqual([]);
    const [received] = await mailTo(mail.mailbox, user.email);
    expect(received!.subject).toBe('Reset your Cellarwright password');
    expect(received!.text).toContain('Hello Forgetful Person');
    expect(received!.html).toContain(`${PUBLIC_URL}/reset-password?token=`);
    const token = tokenOf(linkIn(received!.text, `${PUBLIC_URL}/reset-password?token=`));
    const stored = await ds.query(`SELECT token_hash, expires_at - created_at AS valid FROM password_resets WHERE user_id = $1`, [user.id]);
    expect(stored).toHaveLength(1);
    expect(stored[0].token_hash).not.toContain(token);
    expect(stored[0].valid).toMatchObject({ hours: 1 });
  });

  it('limits requests per address, for known and unknown addresses alike', async () => {
    const user = await makeUser(ds, 'Limited Person');
    const known = [];
    const unknown = [];
    for (let i = 0; i < 4; i++) {
      known.push((await ask(user.email)).status);
      unknown.push((await ask('limited.nobody@example.test')).status);
    }
    expect(known).toEqual([202, 202, 202, 429]);
    expect(unknown).toEqual([202, 202, 202, 429]);
  });

  it('counts the limit in the database, so a second app instance shares it', async () => {
    const second = createApp({
      dataSource: ds,
      sessionSecret: 'test-secret-that-is-long-enough-0123456789',
      cookieSecure: false,
      publicUrl: PUBLIC_URL,
      mail: { mailbox: mail.mailbox, resetAnswerMs: ANSWER_FLOOR_MS, limits: { perEmailPerHour: 3, perIpPerHour: 1000 } },
    });
    const email = 'shared.limit@example.test';
    const statuses = [];
    for (const instance of [app, second, app, second])
      statuses.push((await request(instance).post('/api/auth/password-reset').send({ email })).status);
    expect(statuses).toEqual([202, 202, 202, 429]);
  });

  it('counts attempts with a token in the database too, so a second app instance shares the count', async () => {
    const strict = () =>
      createApp({
        dataSource: ds,
        sessionSecret: 'test-secret-that-is-long-enough-0123456789',
        cookieSecure: false,
        publicUrl: PUBLIC_URL,
        mail: {
          mailbox: mail.mailbox,
          resetAnswerMs: ANSWER_FLOOR_MS,
          limits: { perEmailPerHour: 3, perIpPerHour: 1000, tokenAttemptsPerQuarterHour: 3 },
        },
      });
    const [one, two] = [strict(), strict()];
    // A well-formed token that was never issued (base64url of 32 bytes): refused as unknown until the limit is reached.
    const token = Buffer.alloc(32, 7).toString('base64url');
    const answers = [];
    for (const instance of [one, two, one, two]) {
      answers.push(await request(instance).post('/api/auth/password-reset/complete').send({ token, password: 'a-long-enough-password' }));
    }
    expect(answers.map((a) => a.status)).toEqual([400, 400, 400, 429]);
    expect(answers[3]!.body).toEqual({
      error: 'too_many_requests',
      message: expect.stringMatching(/^Too many attempts\. Wait 15 minutes and try again\.$/),
    });
    expect(Number(answers[3]!.headers['retry-after'])).toBeGreaterThan(14 * 60);
  });

  it('refuses something that is not an address', async () => {
    const res = await ask('not an address');
    expect(res.status).toBe(400);
    expect(res.body.issues[0].path).toBe('body.email');
  });
});

describe('choosing the new password', () => {
  it('sets it once, ends every other session, and the old password stops working', async () => {
    const user = await makeUser(ds, 'Resetting Person');
    const elsewhere = await signedInAgent(app, user.email, TEST_PASSWORD);
    expect((await elsewhere.get('/api/auth/me')).status).toBe(200);

    await ask(user.email);
    const token = await resetTokenFor(user.email);
    const weak = await request(app).post('/api/auth/password-reset/complete').send({ token, password: 'short' });
    expect([weak.status, weak.body.issues[0].path]).toEqual([400, 'body.password']);
    const done = await request(app).post('/api/auth/password-reset/complete').send({ token, password: 'my-brand-new-password' });
    expect(done.status).toBe(204);

    expect((await elsewhere.get('/api/auth/me')).status).toBe(401);
    expect((await request(app).post('/api/auth/sign-in').send({ email: user.email, password: TEST_PASSWORD })).status).toBe(401);
    await signedInAgent(app, user.email, 'my-brand-new-password');

    const reused = await request(app).post('/api/auth/password-reset/complete').send({ token, password: 'yet-another-password' });
    expect([reused.status, reused.body.message]).toEqual([400, expect.stringMatching(/expired or has already been used/)]);
  });

  it('refuses an expired link, and an older link once a newer one was sent', async () => {
    const user = await makeUser(ds, 'Slow Person');
    await ask(user.email);
    const first = await resetTokenFor(user.email);
    mail.mailbox.clear();
    await ask(user.email);
    const second = await resetTokenFor(user.email);
    const old = await request(app).post('/api/auth/password-reset/complete').send({ token: first, password: 'long-enough-password' });
    expect(old.status).toBe(400);
    await ds.query(`UPDATE password_resets SET expires_at = now() - interval '1 second' WHERE user_id = $1`, [user.id]);
    const late = await request(app).post('/api/auth/password-reset/complete').send({ token: second, password: 'long-enough-password' });
    expect([late.status, late.body.message]).toEqual([400, expect.stringMatching(/expired/)]);
    await signedInAgent(app, user.email, TEST_PASSWORD);
  });
});
