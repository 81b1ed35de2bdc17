import request from 'supertest';
import sharp from 'sharp';
import zlib from 'node:zlib';
import { QueryFailedError } from 'typeorm';
import { beforeAll, describe, expect, it } from 'vitest';
import { errorHandler } from '../../server/http/error-handler';
import { recordedGravity } from '../../shared/calc';
import { makeBatchInVessels } from '../helpers/batches';
import { crewWithAgents, makeUser, TEST_PASSWORD, type Crew } from '../helpers/crew';
import { addJournalEntry } from '../helpers/journal';
import { sanitisedVessel } from '../helpers/vessels';
import { testApp } from '../helpers/test-app';

let app: Awaited<ReturnType<typeof testApp>>['app'];
let ds: Awaited<ReturnType<typeof testApp>>['ds'];
let crew: Crew;

beforeAll(async () => {
  ({ app, ds } = await testApp());
  crew = await crewWithAgents(app, ds);
});

const vessels = () => `/api/cellars/${crew.cellar.id}/vessels`;
const newVessel = (overrides: Record<string, unknown> = {}) => ({ name: 'Edge jug', kind: 'jug', material: 'glass', capacityL: 4, ...overrides });
const vesselCount = async () => Number((await ds.query(`SELECT COUNT(*) AS n FROM vessels WHERE cellar_id = $1`, [crew.cellar.id]))[0].n);

describe('control characters', () => {
  it('refuses a NUL in stored text with 400 naming the field, and stores nothing', async () => {
    const before = await vesselCount();
    const res = await crew.as.hand.post(vessels()).send(newVessel({ name: 'Jug\u0000one' }));
    expect(res.status).toBe(400);
    expect(res.body.issues[0].path).toBe('body.name');
    expect(await vesselCount()).toBe(before);
  });

  it('refuses a NUL in a search', async () => {
    const res = await crew.as.guest.get(`${vessels()}?q=a%00b`);
    expect(res.status).toBe(400);
    expect(res.body.issues[0].path).toBe('query.q');
  });

  it('refuses a tab in a name but keeps tabs and line breaks in notes', async () => {
    expect((await crew.as.hand.post(vessels()).send(newVessel({ name: 'Jug\tone' }))).status).toBe(400);
    const noted = await crew.as.hand.post(vessels()).send(newVessel({ name: 'Noted jug', notes: 'line one\nline\ttwo' }));
    expect(noted.status).toBe(201);
    expect((await crew.as.hand.post(vessels()).send(newVessel({ name: 'Bell jug', notes: 'ding\u0007' }))).status).toBe(400);
  });

  it('refuses keys that reach an object prototype', async () => {
    const res = await crew.as.hand
      .post(vessels())
      .set('Content-Type', 'application/json')
      .send('{"name":"Proto jug","kind":"jug","material":"glass","capacityL":4,"__proto__":{"admin":true}}');
    expect(res.status).toBe(400);
  });
});

describe('request bodies the parser cannot read', () => {
  it('answers 415 for a charset other than UTF-8', async () => {
    const res = await crew.as.hand.post(vessels()).set('Content-Type', 'application/json; charset=latin1').send(JSON.stringify(newVessel()));
    expect(res.status).toBe(415);
    expect(res.body.message).toMatch(/UTF-8/);
  });

  it('answers 415 for an unknown content encoding and 400 for gzip that is not gzip', async () => {
    const foo = await crew.as.hand
      .post(vessels())
      .set('Content-Type', 'application/json')
      .set('Content-Encoding', 'foo')
      .send(JSON.stringify(newVessel()));
    expect(foo.status).toBe(415);
    const notGzip = await crew.as.hand
      .post(vessels())
      .set('Content-Type', 'application/json')
      .set('Content-Encoding', 'gzip')
      .send('not gzip at all');
    expect(notGzip.status).toBe(400);
    // Real gzip is still read.
    const gzipped = await crew.as.hand
      .post(vessels())
      .set('Content-Type', 'application/json')
      .set('Content-Encoding', 'gzip')
      // Send the gzip bytes as they are (the default would write them as JSON).
      .serialize(((body: Buffer) => body) as unknown as (body: unknown) => string)
      .send(zlib.gzipSync(JSON.stringify(newVessel({ name: 'Gzip jug' }))));
    expect(gzipped.status, JSON.stringify(gzipped.body)).toBe(201);
  });
});

describe('numbers and dates at the edge', () => {
  it('refuses a capacity below what the column keeps (0.001 L) with 400, not 500', async () => {
    const tiny = await crew.as.hand.post(vessels()).send(newVessel({ name: 'Thimble', capacityL: 0.0001 }));
    expect(tiny.status).toBe(400);
    expect(tiny.body.issues[0]).toEqual({ path: 'body.capacityL', message: 'at least 0.001 L' });
    expect((await crew.as.hand.post(vessels()).send(newVessel({ name: 'Thimble', capacityL: 0.001 }))).status).toBe(201);
  });

  it('refuses the year 0000 and dates outside 1900–2200 in a batch start', async () => {
    const vessel = await sanitisedVessel(ds, crew.cellar.id);
    const start = (startedOn: string) =>
      crew.as.hand.post(crew.batches).send({
        name: 'Year zero mead',
        kind: 'traditional-mead',
        yeast: { name: 'Test yeast', toleranceAbv: 14 },
        plannedVolumeL: 4,
        startedOn,
        vessels: [{ vesselId: vessel.id, volumeL: 4 }],
      });
    for (const date of ['0000-01-01', '1899-12-31', '2201-01-01']) {
      const res = await start(date);
      expect(res.status, date).toBe(400);
      expect(res.body.issues[0].path).toBe('body.startedOn');
    }
  });
});

describe('a stored take-out date that cannot be read (regression: the poisoned Today)', () => {
  it('refuses an oak take-out date of 0000-01-01', async () => {
    const { batch } = await makeBatchInVessels(ds, crew, { volumesL: [4] });
    const res = await crew.as.hand
      .post(`${crew.batches}/${batch.id}/additions`)
      .send({ category: 'oak', name: 'Oak cubes', amount: 20, unit: 'g', removeOn: '0000-01-01' });
    expect(res.status).toBe(400);
    expect(res.body.issues[0].path).toBe('body.removeOn');
  });

  it('keeps Today, the lists and the batch page answering, and an amendment repairs it', async () => {
    const { batch } = await makeBatchInVessels(ds, crew, { volumesL: [4], name: 'Poisoned oak batch' });
    // Written past the schema, as an older version of the app let it in.
    const entryId = await addJournalEntry(ds, crew.cellar.id, batch.id, {
      kind: 'addition',
      category: 'oak',
      name: 'Year-zero oak',
      amount: 20,
      unit: 'g',
      vesselId: null,
      removeOn: '0000-01-01',
    });
    const cellar = `/api/cellars/${crew.cellar.id}`;
    for (const path of ['/today', '/batches', '/vessels', `/batches/${batch.id}`]) {
      const res = await crew.as.guest.get(`${cellar}${path}`);
      expect(res.status, path).toBe(200);
    }
    const today = await crew.as.guest.get(`${cellar}/today`);
    expect(today.body.additionsDue.map((a: { entryId: string }) => a.entryId)).not.toContain(entryId);

    const amended = await crew.as.hand
      .post(`${crew.batches}/${batch.id}/journal/${entryId}/amendments`)
      .send({ reason: 'the date was garbled', changes: { removeOn: '2026-01-02' } });
    expect(amended.status).toBe(201);
    const after = await crew.as.guest.get(`${cellar}/today`);
    expect(after.status).toBe(200);
    expect(after.body.additionsDue).toContainEqual(expect.objectContaining({ entryId, removeOn: '2026-01-02', overdue: true }));
  });
});

describe('database refusals', () => {
  /** Runs the error handler on an error and returns what it answered. */
  function answerTo(err: unknown): { status: number; body: Record<string, unknown> } {
    let status = 0;
    let body: Record<string, unknown> = {};
    const res = {
      headersSent: false,
      status(code: number) {
        status = code;
        return this;
      },
      json(value: Record<string, unknown>) {
        body = value;
        return this;
      },
    };
    errorHandler(err, { method: 'POST', originalUrl: '/x' } as never, res as never, () => undefined);
    return { status, body };
  }
  const pgError = (code: string, constraint?: string) =>
    new QueryFailedError('INSERT …', [], Object.assign(new Error('refused'), { code, constraint }));

  it('answers a unique clash with 409 in plain words, never naming the constraint', () => {
    const { status, body } = answerTo(pgError('23505', 'uq_memberships_cellar_user'));
    expect(status).toBe(409);
    expect(body.message).toBe('That person is already a member of this cellar.');
    expect(JSON.stringify(body)).not.toMatch(/uq_|constraint/);
  });

  it('answers a calculation that refuses its input with 400 naming the field, not 500', () => {
    // Services call shared/calc directly; a 45 °C sample is past the correction's table.
    const refusal = (() => {
      try {
        recordedGravity(1.05, 45, 20);
      } catch (error) {
        return error;
      }
    })();
    const { status, body } = answerTo(refusal);
    expect(status).toBe(400);
    expect(body).toMatchObject({ error: 'bad_request', field: 'sampleC' });
    expect(String(body.message)).toMatch(/45/);
  });

  it('answers check, NUL, date and range refusals with 400', () => {
    for (const code of ['23514', '22021', '22008', '22007', '22003', '22P02']) {
      const { status, body } = answerTo(pgError(code, 'ck_vessels_volume'));
      expect(status, code).toBe(400);
      expect(JSON.stringify(body)).not.toMatch(/ck_|constraint/);
    }
  });
});

describe('sign-in limit (regression: the padded e-mail)', () => {
  it('counts padded, upper-case and full-width spellings of one address as that address', async () => {
    const { app: strict, ds: strictDs } = await testApp({ signInAttempts: 3 });
    const user = await makeUser(strictDs, 'Padded Limit');
    const signIn = (email: string, password: string) => request(strict).post('/api/auth/sign-in').send({ email, password });
    expect((await signIn(user.email, 'guess-1')).status).toBe(401);
    expect((await signIn(` ${user.email}  `, 'guess-2')).status).toBe(401);
    // A tab is refused before any password is tried: it can neither sign in nor start a count.
    expect((await signIn(`${user.email}\t`, TEST_PASSWORD)).status).toBe(400);
    expect((await signIn(`  ${user.email.toUpperCase()}`, 'guess-3')).status).toBe(401);
    for (const spelling of [`${user.email} `, `   ${user.email}`, user.email.toUpperCase(), user.email.replace('@', '\uff20')]) {
      const res = await signIn(spelling, TEST_PASSWORD);
      expect(res.status, JSON.stringify(spelling)).toBe(429);
      expect(res.headers['retry-after']).toMatch(/^\d+$/);
    }
  });

  it('caps failed sign-ins per client address across many e-mails', async () => {
    const { app: capped, ds: cappedDs } = await testApp({ signInAttempts: 10, signInAttemptsPerClient: 4 });
    for (let i = 0; i < 4; i++) {
      const res = await request(capped)
        .post('/api/auth/sign-in')
        .send({ email: `nobody.${i}.${Date.now()}@example.test`, password: 'guess' });
      expect(res.status).toBe(401);
    }
    const user = await makeUser(cappedDs, 'Capped Client');
    const blocked = await request(capped).post('/api/auth/sign-in').send({ email: user.email, password: TEST_PASSWORD });
    expect(blocked.status).toBe(429);
  });

  it('keeps the counters in PostgreSQL, so a second app instance sees them', async () => {
    const first = await testApp({ signInAttempts: 2, signInAttemptsPerClient: 1000 });
    const second = await testApp({ signInAttempts: 2, signInAttemptsPerClient: 1000 });
    const user = await makeUser(ds, 'Shared Limit');
    for (let i = 0; i < 2; i++)
      expect((await request(first.app).post('/api/auth/sign-in').send({ email: user.email, password: 'no' })).status).toBe(401);
    const res = await request(second.app).post('/api/auth/sign-in').send({ email: user.email, password: TEST_PASSWORD });
    expect(res.status).toBe(429);
  });
});

describe('cross-site writes (regression: the cross-site upload)', () => {
  it('refuses a multipart photo upload from another site, storing nothing', async () => {
    const { batch } = await makeBatchInVessels(ds, crew, { volumesL: [4] });
    const png = await sharp({ create: { width: 40, height: 30, channels: 3, background: '#556b2f' } })
      .png()
      .toBuffer();
    const url = `/api/cellars/${crew.cellar.id}/batches/${batch.id}/photos`;
    const photos = async () => Number((await ds.query(`SELECT COUNT(*) AS n FROM photos WHERE batch_id = $1`, [batch.id]))[0].n);

    const both = await crew.as.hand
      .post(url)
      .set('Origin', 'http://elsewhere.example')
      .set('Sec-Fetch-Site', 'cross-site')
      .attach('photo', png, 'p.png');
    expect(both.status).toBe(403);
    const originOnly = await crew.as.hand.post(url).set('Origin', 'http://elsewhere.example').attach('photo', png, 'p.png');
    expect(originOnly.status).toBe(403);
    const nullOrigin = await crew.as.hand.post(url).set('Origin', 'null').attach('photo', png, 'p.png');
    expect(nullOrigin.status).toBe(403);
    expect(await photos()).toBe(0);

    const sameOrigin = await crew.as.hand.post(url).set('Sec-Fetch-Site', 'same-origin').attach('photo', png, 'p.png');
    expect(sameOrigin.status).toBe(201);
    expect(await photos()).toBe(1);
  });

  it('refuses a cross-site sign-in and JSON write but lets reads through', async () => {
    const write = await crew.as.hand
      .post(vessels())
      .set('Sec-Fetch-Site', 'cross-site')
      .send(newVessel({ name: 'Cross jug' }));
    expect(write.status).toBe(403);
    const read = await crew.as.guest.get(vessels()).set('Sec-Fetch-Site', 'cross-site');
    expect(read.status).toBe(200);
    const signIn = await request(app)
      .post('/api/auth/sign-in')
      .set('Origin', 'http://elsewhere.example')
      .send({ email: crew.hand.email, password: TEST_PASSWORD });
    expect(signIn.status).toBe(403);
  });

  it('accepts an Origin naming the app itself', async () => {
    const agent = crew.as.hand;
    const res = await agent
      .post(vessels())
      .set('Origin', 'http://127.0.0.1')
      .set('Host', '127.0.0.1')
      .send(newVessel({ name: 'Home jug' }));
    expect(res.status).toBe(201);
  });
});
