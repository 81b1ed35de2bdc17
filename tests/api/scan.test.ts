import request from 'supertest';
import { beforeAll, describe, expect, it } from 'vitest';
import type { Vessel } from '../../server/entities/vessel.entity';
import type { BottleCaseRow } from '../../server/entities/bottle-case.entity';
import type { BottleLotRow } from '../../server/entities/bottle-lot.entity';
import { codeFromScan } from '../../shared/schemas/scan';
import { makeBatch } from '../helpers/batches';
import { makeLotWithCases } from '../helpers/bottles';
import { makeCellarWithCrew, setPublicCards, TEST_PASSWORD, type CellarCrew } from '../helpers/crew';
import { makeRack, placeDirectly } from '../helpers/places';
import { makeVessel } from '../helpers/vessels';
import { signedInAgent, testApp } from '../helpers/test-app';

type Agent = Awaited<ReturnType<typeof signedInAgent>>;
let app: Awaited<ReturnType<typeof testApp>>['app'];
let ds: Awaited<ReturnType<typeof testApp>>['ds'];
let crew: CellarCrew;
let other: CellarCrew;
let member: Agent;
let outsider: Agent;
let vessel: Vessel;
let lot: BottleLotRow;
let box: BottleCaseRow;

const UNKNOWN = '23456789';

beforeAll(async () => {
  ({ app, ds } = await testApp({ scanLookupsPerMinute: 1000 }));
  crew = await makeCellarWithCrew(ds);
  other = await makeCellarWithCrew(ds);
  member = await signedInAgent(app, crew.guest.email, TEST_PASSWORD);
  outsider = await signedInAgent(app, other.keeper.email, TEST_PASSWORD);
  const batch = await makeBatch(ds, crew.cellar.id, { name: 'Quince Cyser', kind: 'cyser', og: 1.11 });
  vessel = await makeVessel(ds, crew.cellar.id, { name: 'Demijohn 4', batch });
  ({
    lot,
    cases: [box],
  } = (await makeLotWithCases(ds, crew.cellar.id, batch, { cases: 1, sulfiteAdded: true, abvEstimate: 11.2, note: 'Best after a year.' })) as {
    lot: BottleLotRow;
    cases: [BottleCaseRow];
  });
});

describe('GET /s/:code', () => {
  it('sends a member to the record: a vessel page, or the Bottles page on the case or the lot', async () => {
    const v = await member.get(`/s/${vessel.code}`);
    expect(v.status).toBe(302);
    expect(v.headers.location).toBe(`/c/${crew.cellar.id}/vessels/${vessel.id}`);
    const c = await member.get(`/s/${box.code.toLowerCase()}`);
    expect(c.headers.location).toBe(`/c/${crew.cellar.id}/bottles?case=${box.id}`);
    const l = await member.get(`/s/${lot.code}`);
    expect(l.headers.location).toBe(`/c/${crew.cellar.id}/bottles?lot=${lot.id}`);
  });

  it('answers a non-member exactly as for a code that does not exist', async () => {
    const foreign = await outsider.get(`/s/${vessel.code}`);
    const unknown = await outsider.get(`/s/${UNKNOWN}`);
    const malformed = await outsider.get('/s/not-a-code');
    for (const res of [foreign, unknown, malformed]) {
      expect(res.status).toBe(302);
      expect(res.headers.location).toBe('/no-such-label');
    }
    expect(foreign.text).toBe(unknown.text);
  });

  it('sends a signed-out visitor to sign in first, then back to the label', async () => {
    for (const code of [vessel.code, box.code, UNKNOWN]) {
      const res = await request(app).get(`/s/${code}`);
      expect(res.status).toBe(302);
      expect(res.headers.location).toBe(`/sign-in?next=/s/${code}`);
    }
  });
});

describe('public bottle cards', () => {
  it('opens the card for case and lot codes only while the cellar shows cards', async () => {
    await setPublicCards(ds, crew.cellar.id, false);
    expect((await outsider.get(`/s/${box.code}`)).headers.location).toBe('/no-such-label');
    expect((await request(app).get(`/api/cards/${box.code}`)).status).toBe(404);

    await setPublicCards(ds, crew.cellar.id, true);
    expect((await outsider.get(`/s/${box.code}`)).headers.location).toBe(`/card/${box.code}`);
    expect((await request(app).get(`/s/${lot.code}`)).headers.location).toBe(`/card/${lot.code}`);
    // Vessels never have a public card; members still go to the record.
    expect((await outsider.get(`/s/${vessel.code}`)).headers.location).toBe('/no-such-label');
    expect((await member.get(`/s/${box.code}`)).headers.location).toBe(`/c/${crew.cellar.id}/bottles?case=${box.id}`);
    await setPublicCards(ds, crew.cellar.id, false);
  });

  it('gives exactly the card fields and nothing else, and 404 for vessels or when off', async () => {
    await setPublicCards(ds, crew.cellar.id, true);
    const res = await request(app).get(`/api/cards/${box.code}`);
    expect(res.status).toBe(200);
    expect(res.body).toEqual({
      batchName: 'Quince Cyser',
      kind: 'cyser',
      bottledOn: '2026-02-02',
      abvEstimate: 11.2,
      sulfiteAdded: true,
      note: 'Best after a year.',
    });
    expect((await request(app).get(`/api/cards/${vessel.code}`)).status).toBe(404);
    expect((await request(app).get(`/api/cards/${UNKNOWN}`)).status).toBe(404);
    await setPublicCards(ds, crew.cellar.id, false);
    expect((await request(app).get(`/api/cards/${lot.code}`)).status).toBe(404);
  });

  it('is switched by a Keeper in the cellar settings, not by a Hand', async () => {
    const keeper = await signedInAgent(app, crew.keeper.email, TEST_PASSWORD);
    const hand = await signedInAgent(app, crew.hand.email, TEST_PASSWORD);
    const settings = `/api/cellars/${crew.cellar.id}/settings`;
    expect((await keeper.get(settings)).body.publicBottleCards).toBe(false);
    expect((await hand.patch(settings).send({ publicBottleCards: true })).status).toBe(403);
    const on = await keeper.patch(settings).send({ publicBottleCards: true });
    expect(on.status).toBe(200);
    expect(on.body.publicBottleCards).toBe(true);
    expect((await keeper.patch(settings).send({ publicBottleCards: 'yes' })).status).toBe(400);
    await keeper.patch(settings).send({ publicBottleCards: false });
  });
});

describe('codeFromScan (what the Scan page sends)', () => {
  it('finds the code in a label URL of any host or case, or in a typed code with spaces or dashes', () => {
    expect(codeFromScan('https://cellar.example.test/s/7K3M9QXA')).toBe('7K3M9QXA');
    expect(codeFromScan('HTTP://192.168.1.20:8460/S/7k3m9qxa')).toBe('7K3M9QXA');
    expect(codeFromScan(' 7k3m 9qxa ')).toBe('7K3M9QXA');
    expect(codeFromScan('7K3M-9QXA')).toBe('7K3M9QXA');
    // Look-alikes (0, O, 1, I) are not in the alphabet; other QR codes are not labels.
    expect(codeFromScan('7K3M9QX0')).toBeNull();
    expect(codeFromScan('https://example.test/menu')).toBeNull();
  });
});

describe('GET /api/scan/:code', () => {
  it("resolves a member's code to the record", async () => {
    const res = await member.get(`/api/scan/${vessel.code.toLowerCase()}`);
    expect(res.status).toBe(200);
    expect(res.body).toEqual({ kind: 'vessel', id: vessel.id, cellarId: crew.cellar.id, url: `/c/${crew.cellar.id}/vessels/${vessel.id}` });
    const c = await member.get(`/api/scan/${box.code}`);
    expect(c.body).toMatchObject({ kind: 'case', id: box.id, url: `/c/${crew.cellar.id}/bottles?case=${box.id}` });
  });

  it('answers 404 alike for other cellars and unknown codes, 400 for a malformed one, 401 signed out', async () => {
    const foreign = await outsider.get(`/api/scan/${vessel.code}`);
    const unknown = await outsider.get(`/api/scan/${UNKNOWN}`);
    expect(foreign.status).toBe(404);
    expect(foreign.body).toEqual(unknown.body);
    const bad = await member.get('/api/scan/ABC');
    expect(bad.status).toBe(400);
    expect(bad.body.message).toMatch(/8 letters and digits/);
    expect((await request(app).get(`/api/scan/${vessel.code}`)).status).toBe(401);
  });
});

describe('rate limit', () => {
  it('answers 429 after too many look-ups: JSON under /api, a plain page for /s', async () => {
    const { app: strict } = await testApp({ scanLookupsPerMinute: 3 });
    const agent = request.agent(strict);
    for (let i = 0; i < 3; i++) expect((await agent.get(`/s/${UNKNOWN}`)).status).toBe(302);
    const page = await agent.get(`/s/${UNKNOWN}`);
    expect(page.status).toBe(429);
    expect(page.headers['content-type']).toMatch(/text\/html/);
    expect(page.text).toContain('Wait a minute');
    const api = await agent.get(`/api/cards/${UNKNOWN}`);
    expect(api.status).toBe(429);
    expect(api.body).toEqual({ error: 'too_many_requests', message: expect.stringMatching(/Wait a minute/) });
  });
});

describe('shelf check', () => {
  it('lists present, missing, misplaced and unknown codes and the free slots', async () => {
    const cellarId = crew.cellar.id;
    const { shelves } = await makeRack(ds, cellarId, 'Check rack', [5, 5]);
    const [top, bottom] = shelves as [(typeof shelves)[0], (typeof shelves)[0]];
    const here = await makeVessel(ds, cellarId, { name: 'Here jug' });
    const gone = await makeVessel(ds, cellarId, { name: 'Gone jug' });
    const strayed = await makeVessel(ds, cellarId, { name: 'Strayed jug' });
    await placeDirectly(ds, cellarId, top.id, 1, { vesselId: here.id });
    await placeDirectly(ds, cellarId, top.id, 3, { vesselId: gone.id });
    await placeDirectly(ds, cellarId, bottom.id, 2, { vesselId: strayed.id });
    const foreign = await makeVessel(ds, other.cellar.id, { name: 'Foreign jug' });

    const contents = await member.get(`/api/cellars/${cellarId}/labels/shelf/${top.id}/contents`);
    expect(contents.body.items.map((i: { slot: number; code: string }) => [i.slot, i.code])).toEqual([
      [1, here.code],
      [3, gone.code],
    ]);

    const codes = [here.code, strayed.code.toLowerCase(), foreign.code, UNKNOWN].join(',');
    const res = await member.get(`/api/cellars/${cellarId}/labels/shelf/${top.id}/check?codes=${codes}`);
    expect(res.status).toBe(200);
    expect(res.body.present.map((p: { id: string }) => p.id)).toEqual([here.id]);
    expect(res.body.missing.map((p: { id: string }) => p.id)).toEqual([gone.id]);
    expect(res.body.misplaced).toEqual([
      {
        kind: 'vessel',
        id: strayed.id,
        code: strayed.code,
        label: 'Strayed jug',
        version: strayed.version,
        recordedAt: { rackName: 'Check rack', shelfNumber: 2, slot: 2 },
      },
    ]);
    expect(res.body.unknown).toEqual([foreign.code, UNKNOWN]);
    expect(res.body.freeSlots).toEqual([2, 4, 5]);

    expect((await outsider.get(`/api/cellars/${other.cellar.id}/labels/shelf/${top.id}/contents`)).status).toBe(404);
    expect((await member.get(`/api/cellars/${cellarId}/labels/shelf/${top.id}/check?codes=nope`)).status).toBe(400);
    const directory = await member.get(`/api/cellars/${cellarId}/labels/shelves`);
    expect(directory.body.find((r: { name: string }) => r.name === 'Check rack').shelves).toEqual([
      { id: top.id, number: 1, slotCount: 5, used: 2 },
      { id: bottom.id, number: 2, slotCount: 5, used: 1 },
    ]);
  });

  it('words a case as its batch and number, with a no-break space before the dot', async () => {
    const { shelves } = await makeRack(ds, crew.cellar.id, 'Case rack', [3]);
    await placeDirectly(ds, crew.cellar.id, shelves[0]!.id, 2, { caseId: box.id });
    const res = await member.get(`/api/cellars/${crew.cellar.id}/labels/shelf/${shelves[0]!.id}/contents`);
    expect(res.body.items.map((i: { slot: number; label: string }) => [i.slot, i.label])).toEqual([[2, 'Quince Cyser\u00a0· case 1']]);
  });
});
