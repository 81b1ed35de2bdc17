import request from 'supertest';
import { beforeAll, describe, expect, it } from 'vitest';
import { makeCellarWithCrew, makeUser, TEST_PASSWORD, type CellarCrew } from '../helpers/crew';
import { signedInAgent, testApp } from '../helpers/test-app';

let app: Awaited<ReturnType<typeof testApp>>['app'];
let crew: CellarCrew;

beforeAll(async () => {
  const built = await testApp();
  app = built.app;
  crew = await makeCellarWithCrew(built.ds);
});

function sessionCookie(res: request.Response): string | undefined {
  const cookies = ([] as string[]).concat(res.headers['set-cookie'] ?? []);
  return cookies.find((c) => c.startsWith('cellarwright.sid='));
}

describe('sign-in', () => {
  it('signs in with the right password and returns the user with their cellars, never a hash', async () => {
    const res = await request(app).post('/api/auth/sign-in').send({ email: crew.keeper.email.toUpperCase(), password: TEST_PASSWORD });
    expect(res.status).toBe(200);
    expect(res.body).toMatchObject({ id: crew.keeper.id, email: crew.keeper.email });
    expect(res.body.cellars).toEqual([{ cellarId: crew.cellar.id, cellarName: crew.cellar.name, role: 'keeper' }]);
    expect(JSON.stringify(res.body)).not.toMatch(/argon2|password/i);
    const cookie = sessionCookie(res);
    expect(cookie).toBeDefined();
    expect(cookie).toMatch(/HttpOnly/i);
    expect(cookie).toMatch(/SameSite=Lax/i);
    expect(cookie).not.toMatch(/Secure/);
  });

  it('refuses a wrong password and an unknown e-mail with the same message', async () => {
    const wrong = await request(app).post('/api/auth/sign-in').send({ email: crew.hand.email, password: 'not-it' });
    const unknown = await request(app).post('/api/auth/sign-in').send({ email: 'nobody@example.test', password: 'not-it' });
    expect(wrong.status).toBe(401);
    expect(unknown.status).toBe(401);
    expect(wrong.body).toEqual({ error: 'unauthorized', message: 'Wrong e-mail or password.' });
    expect(unknown.body).toEqual(wrong.body);
    expect(sessionCookie(wrong)).toBeUndefined();
  });

  it('names the field of a malformed sign-in body', async () => {
    const res = await request(app).post('/api/auth/sign-in').send({ email: 'not-an-address', password: '' });
    expect(res.status).toBe(400);
    expect(res.body.error).toBe('invalid_input');
    const paths = res.body.issues.map((i: { path: string }) => i.path);
    expect(paths).toEqual(expect.arrayContaining(['body.email', 'body.password']));
  });

  it('answers 400 to a body that is not JSON', async () => {
    const res = await request(app).post('/api/auth/sign-in').set('content-type', 'application/json').send('{"email": ');
    expect(res.status).toBe(400);
    expect(res.body).toEqual({ error: 'invalid_json', message: 'The request body is not valid JSON.' });
  });

  it('gives a new session id on every sign-in', async () => {
    const agent = request.agent(app);
    const first = sessionCookie(await agent.post('/api/auth/sign-in').send({ email: crew.guest.email, password: TEST_PASSWORD }));
    const second = sessionCookie(await agent.post('/api/auth/sign-in').send({ email: crew.guest.email, password: TEST_PASSWORD }));
    expect(first).toBeDefined();
    expect(second).toBeDefined();
    expect(first!.split(';')[0]).not.toBe(second!.split(';')[0]);
  });

  it('limits failed attempts per address and e-mail', async () => {
    const { app: strictApp, ds } = await testApp({ signInAttempts: 3 });
    const user = await makeUser(ds, 'Rate Limited');
    for (let i = 0; i < 3; i++) {
      const res = await request(strictApp).post('/api/auth/sign-in').send({ email: user.email, password: 'guess' });
      expect(res.status).toBe(401);
    }
    const blocked = await request(strictApp).post('/api/auth/sign-in').send({ email: user.email, password: TEST_PASSWORD });
    expect(blocked.status).toBe(429);
    expect(blocked.body.error).toBe('too_many_attempts');
    // Another e-mail from the same address is not blocked.
    const other = await request(strictApp).post('/api/auth/sign-in').send({ email: crew.hand.email, password: TEST_PASSWORD });
    expect(other.status).toBe(200);
  });
});

describe('session', () => {
  it('tells who is signed in, and nobody after sign-out', async () => {
    const agent = await signedInAgent(app, crew.hand.email, TEST_PASSWORD);
    const me = await agent.get('/api/auth/me');
    expect(me.status).toBe(200);
    expect(me.body.email).toBe(crew.hand.email);

    const out = await agent.post('/api/auth/sign-out');
    expect(out.status).toBe(204);
    const after = await agent.get('/api/auth/me');
    expect(after.status).toBe(401);
    expect(after.body.error).toBe('unauthorized');
  });

  it('refuses cellar routes without a session', async () => {
    const res = await request(app).get(`/api/cellars/${crew.cellar.id}/settings`);
    expect(res.status).toBe(401);
  });
});
