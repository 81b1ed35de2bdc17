import type { Express } from 'express';
import request from 'supertest';
import type { DataSource } from 'typeorm';
import { beforeAll, describe, expect, it } from 'vitest';
import { createApp } from '../../server/app';
import { crewWithAgents, makeUser, TEST_PASSWORD, type Crew } from '../helpers/crew';
import { linkIn, mailTo, privateDataSource, testMailbox, tokenOf, type TestMail } from '../helpers/mail';
import { signedInAgent } from '../helpers/test-app';

const PUBLIC_URL = 'http://cellar.example.test';
let ds: DataSource;
let app: Express;
let mail: TestMail;
let crew: Crew;

beforeAll(async () => {
  ds = await privateDataSource('invitations');
  mail = await testMailbox();
  app = createApp({
    dataSource: ds,
    sessionSecret: 'test-secret-that-is-long-enough-0123456789',
    cookieSecure: false,
    publicUrl: PUBLIC_URL,
    mail: { mailbox: mail.mailbox, limits: { perEmailPerHour: 4, perIpPerHour: 1000 } },
  });
  crew = await crewWithAgents(app, ds);
});

const invitations = () => `/api/cellars/${crew.cellar.id}/invitations`;
const membersOf = async (cellarId: string): Promise<string[]> =>
  (await ds.query(`SELECT u.email FROM memberships m JOIN users u ON u.id = m.user_id WHERE m.cellar_id = $1`, [cellarId])).map(
    (r: { email: string }) => r.email,
  );

/** Invites, delivers, and returns the token from the link in the mail that arrived. */
async function inviteAndReadMail(email: string, role = 'hand') {
  const res = await crew.as.keeper.post(invitations()).send({ email, role });
  expect(res.status).toBe(201);
  await mail.deliver(ds);
  const [received] = await mailTo(mail.mailbox, email);
  expect(received).toBeDefined();
  return { invitation: res.body, mail: received!, token: tokenOf(linkIn(received!.text, `${PUBLIC_URL}/invitation?token=`)) };
}

describe('inviting', () => {
  it('answers the same for an address with an account and one without, and adds nobody', async () => {
    const existing = await makeUser(ds, 'Has Account');
    const withAccount = await crew.as.keeper.post(invitations()).send({ email: existing.email, role: 'guest' });
    const withoutAccount = await crew.as.keeper.post(invitations()).send({ email: 'nobody.yet@example.test', role: 'guest' });
    expect([withAccount.status, withoutAccount.status]).toEqual([201, 201]);
    const shape = (b: Record<string, unknown>) => Object.keys(b).sort();
    expect(shape(withAccount.body)).toEqual(shape(withoutAccount.body));
    expect(withAccount.body).toMatchObject({ email: existing.email, role: 'guest', expired: false });
    expect(Object.keys(withAccount.body).filter((k) => /account|user|name/i.test(k))).toEqual([]);
    expect(await membersOf(crew.cellar.id)).not.toContain(existing.email);
    const listed = await crew.as.keeper.get(invitations());
    expect(listed.body.map((i: { email: string }) => i.email)).toEqual(expect.arrayContaining([existing.email, 'nobody.yet@example.test']));
  });

  it('mails a link that works for seven days, with the cellar and the role in plain words', async () => {
    const { mail: received, invitation } = await inviteAndReadMail('plain.words@example.test', 'guest');
    expect(received.subject).toContain(crew.cellar.name);
    expect(received.text).toContain('as Guest');
    expect(received.html).toContain('Accept the invitation');
    expect(received.headerLines.find((h) => h.key === 'x-cellarwright-cellar')?.line).toContain(crew.cellar.id);
    const days = (Date.parse(invitation.expiresAt) - Date.parse(invitation.invitedAt)) / 86_400_000;
    expect(days).toBeCloseTo(7, 5);
    const stored = await ds.query(`SELECT token_hash FROM invitations WHERE id = $1`, [invitation.id]);
    const token = tokenOf(linkIn(received.text, `${PUBLIC_URL}/invitation?token=`));
    expect(stored[0].token_hash).not.toContain(token);
    expect(stored[0].token_hash).toMatch(/^[0-9a-f]{64}$/);
  });

  it('refuses bad input plainly and makes nothing', async () => {
    const before = await ds.query(`SELECT count(*)::int AS n FROM invitations`);
    const bad = await crew.as.keeper.post(invitations()).send({ email: 'not-an-address', role: 'hand' });
    expect(bad.status).toBe(400);
    expect(bad.body.issues[0].path).toBe('body.email');
    const badRole = await crew.as.keeper.post(invitations()).send({ email: 'role@example.test', role: 'owner' });
    expect(badRole.status).toBe(400);
    const member = await crew.as.keeper.post(invitations()).send({ email: crew.hand.email, role: 'guest' });
    expect(member.status).toBe(409);
    expect(member.body.message).toMatch(/already a member/);
    await crew.as.keeper.post(invitations()).send({ email: 'twice@example.test', role: 'hand' });
    const twice = await crew.as.keeper.post(invitations()).send({ email: 'TWICE@example.test', role: 'guest' });
    expect(twice.status).toBe(409);
    expect(twice.body.message).toMatch(/already waiting/);
    expect(await ds.query(`SELECT count(*)::int AS n FROM invitations`)).toEqual([{ n: before[0].n + 1 }]);
  });

  it('limits invitations per address', async () => {
    const email = 'limited@example.test';
    const statuses: number[] = [];
    for (let i = 0; i < 5; i++) {
      const res = await crew.as.keeper.post(invitations()).send({ email, role: 'hand' });
      statuses.push(res.status);
      if (res.status === 201) await crew.as.keeper.delete(`${invitations()}/${res.body.id}`);
    }
    expect(statuses).toEqual([201, 201, 201, 201, 429]);
    const waiting = await crew.as.keeper.post(invitations()).send({ email: 'resend.limited@example.test', role: 'hand' });
    const resends: number[] = [];
    for (let i = 0; i < 5; i++) resends.push((await crew.as.keeper.post(`${invitations()}/${waiting.body.id}/resend`)).status);
    expect(resends).toEqual([200, 200, 200, 200, 429]);
  });
});

describe('accepting', () => {
  it('creates the account and the membership for a new person, once', async () => {
    const { token } = await inviteAndReadMail('new.person@example.test', 'hand');
    const visitor = request.agent(app);
    const preview = await visitor.post('/api/auth/invitation/preview').send({ token });
    expect(preview.status).toBe(200);
    expect(preview.body).toMatchObject({ cellarName: crew.cellar.name, email: 'new.person@example.test', role: 'hand', accountExists: false });

    const short = await visitor.post('/api/auth/invitation/sign-up').send({ token, displayName: 'New Person', password: 'short' });
    expect(short.status).toBe(400);
    const signUp = await visitor.post('/api/auth/invitation/sign-up').send({ token, displayName: 'New Person', password: 'a-long-new-password' });
    expect(signUp.status).toBe(201);
    expect(signUp.body.cellars).toEqual([expect.objectContaining({ cellarId: crew.cellar.id, role: 'hand' })]);
    // Signed in at once, and the password works for a later sign-in.
    expect((await visitor.get(`/api/cellars/${crew.cellar.id}/settings`)).status).toBe(200);
    await signedInAgent(app, 'new.person@example.test', 'a-long-new-password');
    expect(await membersOf(crew.cellar.id)).toContain('new.person@example.test');

    const reused = await request(app).post('/api/auth/invitation/sign-up').send({ token, displayName: 'Again', password: 'a-long-new-password' });
    expect(reused.status).toBe(400);
    expect(reused.body.message).toMatch(/already been used/);
    expect((await crew.as.keeper.get(invitations())).body.map((i: { email: string }) => i.email)).not.toContain('new.person@example.test');
  });

  it('adds an existing account only after that person signs in and accepts', async () => {
    const person = await makeUser(ds, 'Existing Person');
    const { token } = await inviteAndReadMail(person.email, 'guest');
    const preview = await request(app).post('/api/auth/invitation/preview').send({ token });
    expect(preview.body.accountExists).toBe(true);
    expect((await request(app).post('/api/auth/invitation/accept').send({ token })).status).toBe(401);
    const signUp = await request(app)
      .post('/api/auth/invitation/sign-up')
      .send({ token, displayName: 'Impostor', password: 'another-long-password' });
    expect(signUp.status).toBe(409);
    expect(signUp.body.message).toMatch(/sign in/i);
    expect(await membersOf(crew.cellar.id)).not.toContain(person.email);

    const someoneElse = await signedInAgent(app, crew.guest.email, TEST_PASSWORD);
    const wrongPerson = await someoneElse.post('/api/auth/invitation/accept').send({ token });
    expect(wrongPerson.status).toBe(409);
    expect(wrongPerson.body.message).toContain(person.email);

    const agent = await signedInAgent(app, person.email, TEST_PASSWORD);
    const accepted = await agent.post('/api/auth/invitation/accept').send({ token });
    expect(accepted.status).toBe(200);
    expect(accepted.body.cellars).toEqual([expect.objectContaining({ cellarId: crew.cellar.id, role: 'guest' })]);
    expect((await agent.post('/api/auth/invitation/accept').send({ token })).status).toBe(400);
  });

  it('gives a clear answer for an expired, withdrawn, replaced or tampered link', async () => {
    const expired = await inviteAndReadMail('expired@example.test');
    await ds.query(`UPDATE invitations SET expires_at = now() - interval '1 second' WHERE id = $1`, [expired.invitation.id]);
    const late = await request(app).post('/api/auth/invitation/preview').send({ token: expired.token });
    expect([late.status, late.body.message]).toEqual([400, expect.stringMatching(/expired/)]);
    // An expired invitation no longer blocks a new one.
    expect((await crew.as.keeper.post(invitations()).send({ email: 'expired@example.test', role: 'hand' })).status).toBe(201);

    const withdrawn = await inviteAndReadMail('withdrawn@example.test');
    expect((await crew.as.keeper.delete(`${invitations()}/${withdrawn.invitation.id}`)).status).toBe(204);
    const gone = await request(app)
      .post('/api/auth/invitation/sign-up')
      .send({ token: withdrawn.token, displayName: 'X', password: 'long-enough-password' });
    expect([gone.status, gone.body.message]).toEqual([400, expect.stringMatching(/withdrawn/)]);
    expect(await ds.query(`SELECT 1 FROM users WHERE email = 'withdrawn@example.test'`)).toEqual([]);

    const resent = await inviteAndReadMail('resent@example.test');
    expect((await crew.as.keeper.post(`${invitations()}/${resent.invitation.id}/resend`)).status).toBe(200);
    const old = await request(app).post('/api/auth/invitation/preview').send({ token: resent.token });
    expect([old.status, old.body.message]).toEqual([400, expect.stringMatching(/not valid/)]);

    const tampered = `${resent.token.slice(0, -1)}${resent.token.endsWith('A') ? 'B' : 'A'}`;
    expect((await request(app).post('/api/auth/invitation/preview').send({ token: tampered })).status).toBe(400);
    const cut = await request(app)
      .post('/api/auth/invitation/preview')
      .send({ token: resent.token.slice(0, 20) });
    expect([cut.status, cut.body.issues[0].path]).toEqual([400, 'body.token']);
  });
});
