import { beforeAll, describe, expect, it } from 'vitest';
import { CAUTION_GLASS, gravityPoints, headspace } from '../../shared/calc';
import { batchDetailSchema, operationResultSchema } from '../../shared/schemas/batch-detail';
import { batchInVessels } from '../helpers/batches';
import { crewWithAgents, type Crew } from '../helpers/crew';
import { makeVessel, sanitisedVessel, vesselRow } from '../helpers/vessels';
import { testApp } from '../helpers/test-app';

let app: Awaited<ReturnType<typeof testApp>>['app'];
let ds: Awaited<ReturnType<typeof testApp>>['ds'];
let crew: Crew;
let other: Crew;

beforeAll(async () => {
  ({ app, ds } = await testApp());
  crew = await crewWithAgents(app, ds);
  other = await crewWithAgents(app, ds);
});

const detailOf = async (batchId: string) => batchDetailSchema.parse((await crew.as.guest.get(`${crew.batches}/${batchId}`)).body);
const plastic = { material: 'plastic', capacityL: 10 } as const;

describe('POST /batches/:batchId/splits', () => {
  it('turns some vessels into a child batch that copies the recipe and remembers its parent', async () => {
    const { result, vessels } = await batchInVessels(
      ds,
      crew,
      [9.5, 9.5, 9],
      { name: 'Cherry melomel', startedOn: '2025-11-02', og: 1.118, targetSweetness: 'sweet' },
      plastic,
    );
    const parentId = result.batch.id;
    const versionBefore = (await vesselRow(ds, vessels[2].id)).version;
    const res = await crew.as.hand
      .post(`${crew.batches}/${parentId}/splits`)
      .send({ vessels: [{ vesselId: vessels[2].id }], name: 'Cherry melomel on oak', kind: 'melomel' });
    expect(res.status).toBe(201);
    const { batch: child, entryId } = operationResultSchema.parse(res.body);
    expect(child).toMatchObject({
      name: 'Cherry melomel on oak',
      kind: 'melomel',
      og: 1.118,
      startedOn: '2025-11-02',
      targetSweetness: 'sweet',
      yeastName: result.batch.yeastName,
      yeastToleranceAbv: result.batch.yeastToleranceAbv,
      ingredients: result.batch.ingredients,
      volumeL: 9,
      vesselCount: 1,
      parents: [{ id: parentId, name: 'Cherry melomel', volumeL: 9 }],
    });
    expect(child.journal).toHaveLength(1);
    expect(child.journal[0]).toMatchObject({
      id: entryId,
      payload: { kind: 'started', volumeL: 9, og: 1.118, parents: [{ batchId: parentId, name: 'Cherry melomel', volumeL: 9 }] },
    });
    const after = await vesselRow(ds, vessels[2].id);
    expect(after).toMatchObject({ batch_id: child.id, volume_l: 9 });
    expect(after.version).toBe(versionBefore + 1);

    const parent = await detailOf(parentId);
    expect(parent).toMatchObject({ volumeL: 19, vesselCount: 2, children: [{ id: child.id, name: 'Cherry melomel on oak' }] });
    expect(parent.journal[0].payload).toEqual({
      kind: 'split',
      childBatchId: child.id,
      childName: 'Cherry melomel on oak',
      vessels: [{ vesselId: vessels[2].id, vesselName: vessels[2].name, volumeL: 9 }],
    });
  });

  it('carries the parent’s stage and last racking on to the child', async () => {
    const {
      result,
      vessels: [source],
    } = await batchInVessels(ds, crew, [20], { startedOn: '2025-06-01' });
    const a = await sanitisedVessel(ds, crew.cellar.id, plastic);
    const b = await sanitisedVessel(ds, crew.cellar.id, plastic);
    const racked = await crew.as.hand.post(`${crew.batches}/${result.batch.id}/rackings`).send({
      from: [{ vesselId: source.id }],
      to: [
        { vesselId: a.id, volumeL: 9.8 },
        { vesselId: b.id, volumeL: 9.8 },
      ],
      at: '2025-07-01T10:00:00Z',
    });
    expect(racked.status).toBe(201);
    expect(racked.body.batch.stage).toBe('secondary');
    const res = await crew.as.hand
      .post(`${crew.batches}/${result.batch.id}/splits`)
      .send({ vessels: [{ vesselId: b.id }], name: 'Spiced half', kind: 'metheglin' });
    expect(res.status).toBe(201);
    expect(res.body.batch).toMatchObject({ stage: 'secondary', lastRackedAt: '2025-07-01T10:00:00.000Z' });
    // Racking the child once more takes it to bulk ageing: it counts the parent's racking.
    const c = await sanitisedVessel(ds, crew.cellar.id, plastic);
    const again = await crew.as.hand
      .post(`${crew.batches}/${res.body.batch.id}/rackings`)
      .send({ from: [{ vesselId: b.id }], to: [{ vesselId: c.id, volumeL: 9.5 }] });
    expect(again.status).toBe(201);
    expect(again.body.batch.stage).toBe('bulk-ageing');
    expect((await detailOf(result.batch.id)).stage).toBe('secondary');
  });

  it('refuses to split off every vessel, a vessel of another batch, and a kind it does not know', async () => {
    const { result, vessels } = await batchInVessels(ds, crew, [9, 9], {}, plastic);
    const all = await crew.as.hand
      .post(`${crew.batches}/${result.batch.id}/splits`)
      .send({ vessels: vessels.map((v) => ({ vesselId: v.id })), name: 'Everything', kind: 'melomel' });
    expect(all.status).toBe(409);
    expect(all.body.message).toMatch(/A split must leave at least one vessel with/);
    const {
      vessels: [foreign],
    } = await batchInVessels(ds, crew, [9], {}, plastic);
    const wrong = await crew.as.hand
      .post(`${crew.batches}/${result.batch.id}/splits`)
      .send({ vessels: [{ vesselId: foreign.id }], name: 'Stolen', kind: 'melomel' });
    expect(wrong.status).toBe(409);
    const kind = await crew.as.hand
      .post(`${crew.batches}/${result.batch.id}/splits`)
      .send({ vessels: [{ vesselId: vessels[0].id }], name: 'Odd', kind: 'lager' });
    expect(kind.status).toBe(400);
    expect(kind.body.issues.map((i: { path: string }) => i.path)).toEqual(['body.kind']);
    const guest = await crew.as.guest
      .post(`${crew.batches}/${result.batch.id}/splits`)
      .send({ vessels: [{ vesselId: vessels[0].id }], name: 'Guest split', kind: 'melomel' });
    expect(guest.status).toBe(403);
    expect((await detailOf(result.batch.id)).children).toEqual([]);
  });
});

describe('POST /batches/blends', () => {
  it('blends two batches into new vessels: parentage, volume-weighted OG, highest tolerance', async () => {
    const {
      result: heather,
      vessels: [h],
    } = await batchInVessels(ds, crew, [10], { name: 'Heather mead', og: 1.1, yeast: { name: 'Yeast H', toleranceAbv: 14 } }, plastic);
    const {
      result: quince,
      vessels: [q1, q2],
    } = await batchInVessels(
      ds,
      crew,
      [3, 2],
      { name: 'Quince cyser', og: 1.06, yeast: { name: 'Yeast Q', toleranceAbv: 16 } },
      { material: 'glass', capacityL: 4.5 },
    );
    const big = await sanitisedVessel(ds, crew.cellar.id, { name: 'Blend carboy', material: 'plastic', capacityL: 15 });
    const res = await crew.as.hand.post(`${crew.batches}/blends`).send({
      from: [{ vesselId: h.id }, { vesselId: q1.id }, { vesselId: q2.id }],
      to: [{ vesselId: big.id, volumeL: 14.5 }],
      name: 'Orchard heather blend',
      kind: 'cyser',
    });
    expect(res.status).toBe(201);
    const { batch: child, warnings } = operationResultSchema.parse(res.body);
    // Volume-weighted mean in gravity points: (100 × 10 + 60 × 5) / 15 = 86.67 points.
    const points = (gravityPoints(1.1) * 10 + gravityPoints(1.06) * 5) / 15;
    expect(child.og).toBeCloseTo(1 + points / 1000, 3);
    expect(child).toMatchObject({
      name: 'Orchard heather blend',
      kind: 'cyser',
      yeastName: 'Blend of Heather mead and Quince cyser',
      yeastToleranceAbv: 16,
      startedOn: new Date().toISOString().slice(0, 10),
      volumeL: 14.5,
      stage: 'secondary',
    });
    expect(child.parents).toEqual([
      { id: heather.batch.id, name: 'Heather mead', volumeL: 10 },
      { id: quince.batch.id, name: 'Quince cyser', volumeL: 5 },
    ]);
    expect(child.journal[0].payload).toMatchObject({
      kind: 'started',
      volumeL: 14.5,
      parents: [
        { batchId: heather.batch.id, volumeL: 10 },
        { batchId: quince.batch.id, volumeL: 5 },
      ],
    });
    expect(warnings).toContain(CAUTION_GLASS);
    expect(warnings.some((w) => w.startsWith('Blend carboy has'))).toBe(false);

    for (const source of [h, q1, q2]) expect(await vesselRow(ds, source.id)).toMatchObject({ batch_id: null, cleaning_state: 'dirty' });
    const parent = await detailOf(quince.batch.id);
    expect(parent).toMatchObject({ stage: 'finished', volumeL: 0, children: [{ id: child.id, name: 'Orchard heather blend' }] });
    expect(parent.journal[0].payload).toEqual({ kind: 'blended', childBatchId: child.id, childName: 'Orchard heather blend', volumeL: 5 });
  });

  it('leaves the OG unknown when a parent’s is unknown, and warns about headspace', async () => {
    const {
      vessels: [a],
    } = await batchInVessels(ds, crew, [8], { og: null }, plastic);
    const {
      vessels: [b],
    } = await batchInVessels(ds, crew, [8], { og: 1.09 }, plastic);
    const target = await sanitisedVessel(ds, crew.cellar.id, { name: 'Roomy tank', material: 'stainless', capacityL: 25 });
    const res = await crew.as.hand
      .post(`${crew.batches}/blends`)
      .send({ from: [{ vesselId: a.id }, { vesselId: b.id }], to: [{ vesselId: target.id, volumeL: 15.5 }], name: 'Mystery blend', kind: 'other' });
    expect(res.status).toBe(201);
    expect(res.body.batch.og).toBeNull();
    const percent = Math.round(headspace({ capacityL: 25, volumeL: 15.5 }).percent);
    expect(res.body.warnings).toEqual([`Roomy tank has ${percent} % headspace — top up or use a smaller vessel to limit oxidation.`]);
  });

  it('refuses a blend of one batch, more than the sources hold, a dirty target without a reason, and a Guest', async () => {
    const {
      vessels: [a1, a2],
    } = await batchInVessels(ds, crew, [5, 5], {}, plastic);
    const {
      vessels: [b],
    } = await batchInVessels(ds, crew, [5], {}, plastic);
    const target = await sanitisedVessel(ds, crew.cellar.id, { material: 'plastic', capacityL: 20 });
    const send = (body: Record<string, unknown>, agent = crew.as.hand) =>
      agent.post(`${crew.batches}/blends`).send({ name: 'Test blend', kind: 'melomel', ...body });

    const one = await send({ from: [{ vesselId: a1.id }, { vesselId: a2.id }], to: [{ vesselId: target.id, volumeL: 9 }] });
    expect(one.status).toBe(409);
    expect(one.body.message).toMatch(/at least two batches/);
    const tooMuch = await send({ from: [{ vesselId: a1.id }, { vesselId: b.id }], to: [{ vesselId: target.id, volumeL: 11 }] });
    expect(tooMuch.status).toBe(400);
    expect(tooMuch.body.message).toBe('You cannot blend more than the source holds: the sources hold 10 L, the targets would get 11 L.');
    const dirty = await makeVessel(ds, crew.cellar.id, { name: 'Grubby bucket', cleaningState: 'dirty', capacityL: 20 });
    const refused = await send({ from: [{ vesselId: a1.id }, { vesselId: b.id }], to: [{ vesselId: dirty.id, volumeL: 9 }] });
    expect(refused.status).toBe(409);
    expect(refused.body.message).toMatch(/^Grubby bucket is dirty/);
    const guest = await send({ from: [{ vesselId: a1.id }, { vesselId: b.id }], to: [{ vesselId: target.id, volumeL: 9 }] }, crew.as.guest);
    expect(guest.status).toBe(403);
    const {
      vessels: [theirs],
    } = await batchInVessels(ds, other, [5], {}, plastic);
    const foreign = await send({ from: [{ vesselId: a1.id }, { vesselId: theirs.id }], to: [{ vesselId: target.id, volumeL: 9 }] });
    expect(foreign.status).toBe(404);
    for (const v of [a1, a2, b]) expect((await vesselRow(ds, v.id)).batch_id).not.toBeNull();
    expect((await vesselRow(ds, target.id)).batch_id).toBeNull();

    const allowed = await send({
      from: [{ vesselId: a1.id }, { vesselId: b.id }],
      to: [{ vesselId: dirty.id, volumeL: 9.6 }],
      override: { reason: 'Scrubbed and rinsed hot' },
    });
    expect(allowed.status).toBe(201);
    expect(allowed.body.batch.journal[0].payload.override).toBe('Scrubbed and rinsed hot');
  });
});
