import { beforeAll, describe, expect, it } from 'vitest';
import { makeCellarWithCrew, makeUser, TEST_PASSWORD, type CellarCrew } from '../helpers/crew';
import { agentsFor, signedInAgent, testApp } from '../helpers/test-app';

type Agent = Awaited<ReturnType<typeof signedInAgent>>;
let crew: CellarCrew;
let other: CellarCrew;
let as: { keeper: Agent; hand: Agent; guest: Agent };
let app: Awaited<ReturnType<typeof testApp>>['app'];
let ds: Awaited<ReturnType<typeof testApp>>['ds'];

beforeAll(async () => {
  // Mail limits of its own: the shared per-client count (in the database) is not this file's subject (see invitations.test.ts).
  ({ app, ds } = await testApp({ mail: { limits: { perEmailPerHour: 100, perIpPerHour: 10_000 } } }));
  crew = await makeCellarWithCrew(ds);
  other = await makeCellarWithCrew(ds);
  as = await agentsFor(app, crew, TEST_PASSWORD);
});

const settings = (cellarId: string) => `/api/cellars/${cellarId}/settings`;
const members = (cellarId: string) => `/api/cellars/${cellarId}/members`;
const invitations = (cellarId: string) => `/api/cellars/${cellarId}/invitations`;

describe('reading', () => {
  it('lets every role read the cellar and its members', async () => {
    for (const agent of Object.values(as)) {
      const res = await agent.get(settings(crew.cellar.id));
      expect(res.status).toBe(200);
      expect(res.body.name).toBe(crew.cellar.name);
      const list = await agent.get(members(crew.cellar.id));
      expect(list.status).toBe(200);
      expect(list.body).toHaveLength(3);
    }
  });

  it('lists only the cellars one belongs to', async () => {
    const res = await as.guest.get('/api/cellars');
    expect(res.body.map((c: { cellarId: string }) => c.cellarId)).toEqual([crew.cellar.id]);
  });
});

describe('writing', () => {
  it('lets only a Keeper change settings', async () => {
    const guest = await as.guest.patch(settings(crew.cellar.id)).send({ name: 'Guest was here' });
    expect(guest.status).toBe(403);
    expect(guest.body.error).toBe('forbidden');
    const hand = await as.hand.patch(settings(crew.cellar.id)).send({ name: 'Hand was here' });
    expect(hand.status).toBe(403);
    const keeper = await as.keeper.patch(settings(crew.cellar.id)).send({ name: 'Renamed cellar', unitSystem: 'us' });
    expect(keeper.status).toBe(200);
    expect(keeper.body).toMatchObject({ name: 'Renamed cellar', unitSystem: 'us' });
  });

  it('names the bad field of a settings change', async () => {
    const res = await as.keeper.patch(settings(crew.cellar.id)).send({ timeZone: 'Mars/Olympus', sanitisedValidDays: 0 });
    expect(res.status).toBe(400);
    const paths = res.body.issues.map((i: { path: string }) => i.path);
    expect(paths).toEqual(expect.arrayContaining(['body.timeZone', 'body.sanitisedValidDays']));
  });

  // People join by invitation only (issue 10): a Keeper invites, the person accepts, and only
  // then is a member. The invitation flow itself is tested in invitations.test.ts.
  it('lets only a Keeper invite and manage members', async () => {
    const newcomer = await makeUser(ds, 'New Comer');
    const byHand = await as.hand.post(invitations(crew.cellar.id)).send({ email: newcomer.email, role: 'guest' });
    expect(byHand.status).toBe(403);
    const byGuest = await as.guest.post(invitations(crew.cellar.id)).send({ email: newcomer.email, role: 'guest' });
    expect(byGuest.status).toBe(403);
    const byKeeper = await as.keeper.post(invitations(crew.cellar.id)).send({ email: newcomer.email, role: 'guest' });
    expect(byKeeper.status).toBe(201);
    const again = await as.keeper.post(invitations(crew.cellar.id)).send({ email: newcomer.email, role: 'hand' });
    expect(again.status).toBe(409);
    // Invited is not a member: the list is unchanged until they accept.
    expect((await as.keeper.get(members(crew.cellar.id))).body).toHaveLength(3);
    expect((await as.hand.get(invitations(crew.cellar.id))).status).toBe(403);
    const withdrawByHand = await as.hand.delete(`${invitations(crew.cellar.id)}/${byKeeper.body.id}`);
    expect(withdrawByHand.status).toBe(403);
    const withdraw = await as.keeper.delete(`${invitations(crew.cellar.id)}/${byKeeper.body.id}`);
    expect(withdraw.status).toBe(204);
    // The old way in, adding an account directly, is gone.
    expect((await as.keeper.post(members(crew.cellar.id)).send({ email: newcomer.email, role: 'guest' })).status).toBe(404);

    const list = await as.keeper.get(members(crew.cellar.id));
    const handRow = list.body.find((m: { role: string }) => m.role === 'hand');
    const removeByHand = await as.hand.delete(`${members(crew.cellar.id)}/${handRow.id}`);
    expect(removeByHand.status).toBe(403);
    const remove = await as.keeper.delete(`${members(crew.cellar.id)}/${handRow.id}`);
    expect(remove.status).toBe(204);
    expect((await as.keeper.get(members(crew.cellar.id))).body).toHaveLength(2);
  });

  it('never leaves a cellar without a Keeper', async () => {
    const list = await as.keeper.get(members(crew.cellar.id));
    const keeperRow = list.body.find((m: { role: string }) => m.role === 'keeper');
    const demote = await as.keeper.patch(`${members(crew.cellar.id)}/${keeperRow.id}`).send({ role: 'hand' });
    expect(demote.status).toBe(409);
    expect(demote.body.message).toMatch(/at least one Keeper/);
  });
});

describe('other cellars', () => {
  it('answers 404 for a cellar one is not in, the same as for one that does not exist', async () => {
    const foreign = await as.keeper.get(settings(other.cellar.id));
    const missing = await as.keeper.get(settings('00000000-0000-4000-8000-000000000000'));
    expect(foreign.status).toBe(404);
    expect(missing.status).toBe(404);
    expect(foreign.body).toEqual(missing.body);
    const write = await as.keeper.patch(settings(other.cellar.id)).send({ name: 'Taken over' });
    expect(write.status).toBe(404);
    const theirMembers = await as.keeper.get(members(other.cellar.id));
    expect(theirMembers.status).toBe(404);
  });

  it('answers 400 for a cellar id that is not an id', async () => {
    const res = await as.keeper.get(settings('not-a-uuid'));
    expect(res.status).toBe(400);
    expect(res.body.message).toMatch(/cellarId/);
  });
});
