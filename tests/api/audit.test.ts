import { beforeAll, describe, expect, it } from 'vitest';
import { auditPageSchema, type AuditPage } from '../../shared/schemas/exchange';
import { makeBatchInVessels } from '../helpers/batches';
import { crewWithAgents, type Crew } from '../helpers/crew';
import { makeRack } from '../helpers/places';
import { sanitisedVessel } from '../helpers/vessels';
import { testApp } from '../helpers/test-app';

let app: Awaited<ReturnType<typeof testApp>>['app'];
let ds: Awaited<ReturnType<typeof testApp>>['ds'];
let crew: Crew;
let rackedVesselId: string;
let movedVesselId: string;

beforeAll(async () => {
  ({ app, ds } = await testApp());
  crew = await crewWithAgents(app, ds);
  const { batch, vessels } = await makeBatchInVessels(ds, crew, { name: 'Audited melomel', volumesL: [10] });
  const target = await sanitisedVessel(ds, crew.cellar.id, { name: 'Audit target', capacityL: 11 });
  rackedVesselId = target.id;
  const racked = await crew.as.hand
    .post(`${crew.batches}/${batch.id}/rackings`)
    .send({ from: [{ vesselId: vessels[0].id }], to: [{ vesselId: target.id, volumeL: 9.5 }] });
  expect(racked.status).toBe(201);

  const spare = await sanitisedVessel(ds, crew.cellar.id, { name: 'Spare jug', capacityL: 4.5 });
  movedVesselId = spare.id;
  const rack = await makeRack(ds, crew.cellar.id, 'Audit rack', [4]);
  const vesselPath = `/api/cellars/${crew.cellar.id}/vessels/${spare.id}`;
  expect((await crew.as.hand.post(`${vesselPath}/cleaning`).send({ state: 'dirty' })).status).toBe(200);
  expect((await crew.as.keeper.put(`${vesselPath}/place`).send({ to: { shelfId: rack.shelfIds[0], slot: 2 } })).status).toBe(200);
});

const auditPath = (query = '') => `/api/cellars/${crew.cellar.id}/audit${query ? `?${query}` : ''}`;

async function audit(query = ''): Promise<AuditPage> {
  const res = await crew.as.keeper.get(auditPath(query));
  expect(res.status).toBe(200);
  return auditPageSchema.parse(res.body);
}

describe('the audit trail', () => {
  it('shows a racking done by the Hand, read from the journal, with who and what', async () => {
    const page = await audit('kind=journal');
    const racking = page.items.find((r) => r.action === 'racked');
    expect(racking).toMatchObject({ kind: 'journal', person: { id: crew.hand.id, name: 'Hal Hand' }, batch: { name: 'Audited melomel' } });
    expect(racking!.summary).toBe('Racked from Test carboy 1 to Audit target, 0.5 L lost');
  });

  it('records vessel cleaning and moves with the member who did them, newest first', async () => {
    const page = await audit(`kind=vessel&vesselId=${movedVesselId}`);
    expect(page.items.map((r) => [r.action, r.person?.name, r.summary])).toEqual([
      ['moved', 'Kay Keeper', 'Moved Spare jug to Audit rack, shelf 1, slot 2'],
      ['marked dirty', 'Hal Hand', 'Marked Spare jug dirty'],
    ]);
    expect(page.people.map((p) => p.name).sort()).toEqual(['Gil Guest', 'Hal Hand', 'Kay Keeper']);
  });

  it('filters by person, by vessel (journal entries naming it included) and by date range', async () => {
    const byKeeper = await audit(`personId=${crew.keeper.id}`);
    expect(byKeeper.items.map((r) => r.action)).toEqual(['moved']);
    const byVessel = await audit(`vesselId=${rackedVesselId}`);
    expect(byVessel.items.map((r) => r.action)).toEqual(['racked']);
    const tomorrow = new Date(Date.now() + 86_400_000).toISOString().slice(0, 10);
    expect((await audit(`from=${tomorrow}`)).total).toBe(0);
    const yesterday = new Date(Date.now() - 86_400_000).toISOString().slice(0, 10);
    const recent = await audit(`from=${yesterday}&to=${tomorrow}`);
    expect(recent.items.map((r) => r.action)).toEqual(expect.arrayContaining(['racked', 'moved', 'marked dirty']));
    // The batch's start is dated 60 days back but was recorded today: the audit goes by when it was recorded.
    expect(recent.items.map((r) => r.action)).toContain('started');
  });

  it('is for Keepers only', async () => {
    expect((await crew.as.hand.get(auditPath())).status).toBe(403);
    expect((await crew.as.guest.get(auditPath())).status).toBe(403);
  });

  it('refuses to rewrite an audit record', async () => {
    await expect(ds.query(`UPDATE audit_events SET summary = 'rewritten' WHERE cellar_id = $1`, [crew.cellar.id])).rejects.toThrow(/append-only/);
  });
});
