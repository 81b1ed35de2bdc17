import { beforeAll, describe, expect, it } from 'vitest';
import { CAUTION_GLASS, headspace } from '../../shared/calc';
import { RACKINGS_FOR_BULK_AGEING } from '../../shared/domain/stage';
import { operationResultSchema } from '../../shared/schemas/batch-detail';
import { batchInVessels, makeBatch } from '../helpers/batches';
import { crewWithAgents, type Crew } from '../helpers/crew';
import { momentDaysAgo } from '../helpers/dates';
import { fillVessel, makeVessel, sanitisedDaysAgo, sanitisedVessel, vesselRow } from '../helpers/vessels';
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

const rackings = (batchId: string, c: Crew = crew) => `${c.batches}/${batchId}/rackings`;
const rack = (from: { id: string }[], to: [{ id: string }, number][], extra: Record<string, unknown> = {}) => ({
  from: from.map((v) => ({ vesselId: v.id })),
  to: to.map(([v, volumeL]) => ({ vesselId: v.id, volumeL })),
  ...extra,
});

describe('POST /batches/:batchId/rackings', () => {
  it('empties the source (left dirty), fills the target, journals the loss and warns about headspace and glass', async () => {
    const {
      result,
      vessels: [source],
    } = await batchInVessels(ds, crew, [22], { startedOn: '2026-01-02' });
    const target = await sanitisedVessel(ds, crew.cellar.id, { name: 'Fermenter 2', capacityL: 23, material: 'glass' });
    const sourceBefore = await vesselRow(ds, source.id);
    const targetBefore = await vesselRow(ds, target.id);

    const res = await crew.as.hand.post(rackings(result.batch.id)).send(rack([source], [[target, 20.2]]));
    expect(res.status).toBe(201);
    const { batch, entryId, warnings } = operationResultSchema.parse(res.body);
    expect(batch).toMatchObject({ stage: 'secondary', volumeL: 20.2, vesselCount: 1 });
    expect(batch.vessels.map((v) => [v.id, v.volumeL])).toEqual([[target.id, 20.2]]);
    expect(batch.lastRackedAt).not.toBeNull();
    expect(batch.journal[0]).toMatchObject({
      id: entryId,
      payload: {
        kind: 'racked',
        from: [{ vesselId: source.id, vesselName: source.name, volumeL: 22 }],
        to: [{ vesselId: target.id, vesselName: 'Fermenter 2', volumeL: 20.2 }],
        lossL: 1.8,
        override: null,
      },
    });
    const percent = Math.round(headspace({ capacityL: 23, volumeL: 20.2 }).percent);
    expect(warnings).toEqual([`Fermenter 2 has ${percent} % headspace — top up or use a smaller vessel to limit oxidation.`, CAUTION_GLASS]);

    const sourceAfter = await vesselRow(ds, source.id);
    expect(sourceAfter).toMatchObject({ batch_id: null, volume_l: null, filled_at: null, cleaning_state: 'dirty', sanitised_at: null });
    expect(sourceAfter.version).toBe(sourceBefore.version + 1);
    const targetAfter = await vesselRow(ds, target.id);
    expect(targetAfter).toMatchObject({ batch_id: batch.id, volume_l: 20.2 });
    expect(targetAfter.version).toBe(targetBefore.version + 1);
  });

  it('moves primary → secondary after the first racking → bulk ageing after the second', async () => {
    const {
      result,
      vessels: [first],
    } = await batchInVessels(ds, crew, [20], {}, { material: 'plastic', kind: 'bucket' });
    expect(result.batch.stage).toBe('primary');
    const second = await sanitisedVessel(ds, crew.cellar.id, { material: 'plastic', capacityL: 19.5 });
    const third = await sanitisedVessel(ds, crew.cellar.id, { material: 'plastic', capacityL: 19 });
    const one = operationResultSchema.parse((await crew.as.hand.post(rackings(result.batch.id)).send(rack([first], [[second, 19.5]]))).body);
    expect(one.batch.stage).toBe('secondary');
    // Full vessels, no glass: nothing to warn about.
    expect(one.warnings).toEqual([]);
    const two = operationResultSchema.parse((await crew.as.hand.post(rackings(result.batch.id)).send(rack([second], [[third, 19]]))).body);
    expect(RACKINGS_FOR_BULK_AGEING).toBe(2);
    expect(two.batch.stage).toBe('bulk-ageing');
    expect(two.batch.journal.filter((e) => e.payload.kind === 'racked')).toHaveLength(2);
  });

  it('racks two vessels into one and one into two', async () => {
    const { result, vessels } = await batchInVessels(ds, crew, [4, 4.5], {}, { capacityL: 4.5, material: 'plastic' });
    const big = await sanitisedVessel(ds, crew.cellar.id, { capacityL: 9, material: 'plastic' });
    const merged = await crew.as.hand.post(rackings(result.batch.id)).send(rack(vessels, [[big, 8.2]]));
    expect(merged.status).toBe(201);
    expect(merged.body.batch).toMatchObject({ volumeL: 8.2, vesselCount: 1 });
    expect(merged.body.batch.journal[0].payload.lossL).toBe(0.3);
    const a = await sanitisedVessel(ds, crew.cellar.id, { capacityL: 4.5, material: 'plastic' });
    const b = await sanitisedVessel(ds, crew.cellar.id, { capacityL: 4.5, material: 'plastic' });
    const split = await crew.as.hand.post(rackings(result.batch.id)).send(
      rack(
        [big],
        [
          [a, 4.1],
          [b, 4],
        ],
      ),
    );
    expect(split.status).toBe(201);
    expect(split.body.batch).toMatchObject({ volumeL: 8.1, vesselCount: 2 });
  });

  it('refuses to rack more than the source holds (400) and changes nothing', async () => {
    const {
      result,
      vessels: [source],
    } = await batchInVessels(ds, crew, [18]);
    const target = await sanitisedVessel(ds, crew.cellar.id);
    const res = await crew.as.hand.post(rackings(result.batch.id)).send(rack([source], [[target, 18.5]]));
    expect(res.status).toBe(400);
    expect(res.body.message).toBe('You cannot rack more than the source holds: the sources hold 18 L, the targets would get 18.5 L.');
    // Worded in US units when the request asks (1 US gal = 3.785411784 L, NIST Handbook 44): 18 L = 4.755 gal, 18.5 L = 4.887 gal.
    const inUs = await crew.as.hand
      .post(rackings(result.batch.id))
      .set('Units-Shown', 'us')
      .send(rack([source], [[target, 18.5]]));
    expect(inUs.body.message).toBe('You cannot rack more than the source holds: the sources hold 4.76 US gal, the targets would get 4.89 US gal.');
    expect((await vesselRow(ds, source.id)).batch_id).toBe(result.batch.id);
    expect((await vesselRow(ds, target.id)).batch_id).toBeNull();
  });

  it('refuses a target that holds something, is retired, too small, or also a source', async () => {
    const {
      result,
      vessels: [source],
    } = await batchInVessels(ds, crew, [18]);
    const {
      result: neighbour,
      vessels: [taken],
    } = await batchInVessels(ds, crew, [10]);
    const holding = await crew.as.hand.post(rackings(result.batch.id)).send(rack([source], [[taken, 10]]));
    expect(holding.status).toBe(409);
    expect(holding.body.message).toBe(`${taken.name} already holds ${neighbour.batch.name} (10 L); choose an empty vessel.`);

    const retired = await makeVessel(ds, crew.cellar.id, { name: 'Retired keg', cleaningState: 'sanitised', retiredAt: new Date() });
    const retiredRes = await crew.as.hand.post(rackings(result.batch.id)).send(rack([source], [[retired, 10]]));
    expect(retiredRes.status).toBe(409);
    expect(retiredRes.body.message).toBe('Retired keg is retired; choose a vessel in use.');

    const small = await sanitisedVessel(ds, crew.cellar.id, { name: 'Small jug', capacityL: 4 });
    const tooSmall = await crew.as.hand.post(rackings(result.batch.id)).send(rack([source], [[small, 5]]));
    expect(tooSmall.status).toBe(400);
    expect(tooSmall.body.message).toBe('Small jug holds 4 L; 5 L will not fit.');
    // 4 L = 1.057 US gal, 5 L = 1.321 US gal, 10 L = 2.642 US gal (1 US gal = 3.785411784 L, NIST Handbook 44).
    const tooSmallInUs = await crew.as.hand
      .post(rackings(result.batch.id))
      .set('Units-Shown', 'us')
      .send(rack([source], [[small, 5]]));
    expect(tooSmallInUs.body.message).toBe('Small jug holds 1.06 US gal; 1.32 US gal will not fit.');
    const holdingInUs = await crew.as.hand
      .post(rackings(result.batch.id))
      .set('Units-Shown', 'us')
      .send(rack([source], [[taken, 10]]));
    expect(holdingInUs.body.message).toBe(`${taken.name} already holds ${neighbour.batch.name} (2.64 US gal); choose an empty vessel.`);

    const self = await crew.as.hand.post(rackings(result.batch.id)).send(rack([source], [[source, 10]]));
    expect(self.status).toBe(400);
    expect(self.body.message).toMatch(/both a source and a target/);
    expect((await vesselRow(ds, source.id)).batch_id).toBe(result.batch.id);
  });

  it('refuses a dirty or lapsed target without a reason; with one it racks and journals the reason', async () => {
    const {
      result,
      vessels: [source],
    } = await batchInVessels(ds, crew, [18]);
    const dirty = await makeVessel(ds, crew.cellar.id, { name: 'Dirty demijohn', cleaningState: 'dirty' });
    const lapsed = await sanitisedVessel(ds, crew.cellar.id, { name: 'Lapsed demijohn' });
    await sanitisedDaysAgo(ds, lapsed.id, 8);
    const refused = await crew.as.hand.post(rackings(result.batch.id)).send(rack([source], [[dirty, 17]]));
    expect(refused.status).toBe(409);
    expect(refused.body).toMatchObject({ vesselId: dirty.id, overrideAllowed: true });
    expect(refused.body.message).toMatch(/^Dirty demijohn is dirty, not sanitised/);
    const lapsedRes = await crew.as.hand.post(rackings(result.batch.id)).send(rack([source], [[lapsed, 17]]));
    expect(lapsedRes.status).toBe(409);
    expect(lapsedRes.body.message).toMatch(/^Lapsed demijohn was sanitised on \d{4}-\d\d-\d\d, more than 7 days ago/);

    const allowed = await crew.as.hand
      .post(rackings(result.batch.id))
      .send(rack([source], [[dirty, 17]], { override: { reason: 'Steamed it, no sanitiser left' } }));
    expect(allowed.status).toBe(201);
    expect(allowed.body.batch.journal[0].payload).toMatchObject({ kind: 'racked', override: 'Steamed it, no sanitiser left' });
  });

  it('refuses a source that does not hold this batch, a stale version, and a batch in no vessel', async () => {
    const {
      result,
      vessels: [source],
    } = await batchInVessels(ds, crew, [18]);
    const {
      vessels: [elsewhere],
    } = await batchInVessels(ds, crew, [10]);
    const target = await sanitisedVessel(ds, crew.cellar.id);
    const wrong = await crew.as.hand.post(rackings(result.batch.id)).send(rack([elsewhere], [[target, 9]]));
    expect(wrong.status).toBe(409);
    expect(wrong.body.message).toMatch(new RegExp(`^${elsewhere.name} changed while you were working: it now holds`));

    const stale = await crew.as.hand
      .post(rackings(result.batch.id))
      .send({ from: [{ vesselId: source.id, expectedVersion: 1 }], to: [{ vesselId: target.id, volumeL: 17 }] });
    expect(stale.status).toBe(409);
    expect(stale.body).toMatchObject({ vesselId: source.id, currentVersion: (await vesselRow(ds, source.id)).version });

    const gone = await makeBatch(ds, crew.cellar.id, { name: 'Long gone perry' });
    const none = await crew.as.hand.post(rackings(gone.id)).send(rack([source], [[target, 17]]));
    expect(none.status).toBe(409);
    expect(none.body.message).toMatch(/^Long gone perry is not in any vessel any more/);
  });

  it('answers 403 to a Guest, 404 for another cellar’s batch and 400 for a racking with no target', async () => {
    const {
      result,
      vessels: [source],
    } = await batchInVessels(ds, crew, [18]);
    const target = await sanitisedVessel(ds, crew.cellar.id);
    const guest = await crew.as.guest.post(rackings(result.batch.id)).send(rack([source], [[target, 17]]));
    expect(guest.status).toBe(403);
    const {
      result: theirs,
      vessels: [theirSource],
    } = await batchInVessels(ds, other, [18]);
    const foreign = await crew.as.hand.post(rackings(theirs.batch.id)).send(rack([theirSource], [[target, 17]]));
    expect(foreign.status).toBe(404);
    const noTarget = await crew.as.hand.post(rackings(result.batch.id)).send({ from: [{ vesselId: source.id }], to: [] });
    expect(noTarget.status).toBe(400);
    expect(noTarget.body.issues.map((i: { path: string }) => i.path)).toContain('body.to');
    expect((await vesselRow(ds, source.id)).batch_id).toBe(result.batch.id);
  });

  it('dates a racking when told, and refuses one before the batch started or in the future', async () => {
    const {
      result,
      vessels: [source],
    } = await batchInVessels(ds, crew, [18], { startedOn: '2026-01-05' });
    const target = await sanitisedVessel(ds, crew.cellar.id);
    const early = await crew.as.hand.post(rackings(result.batch.id)).send(rack([source], [[target, 17]], { at: '2026-01-04T10:00:00Z' }));
    expect(early.status).toBe(400);
    expect(early.body.message).toMatch(/before .* was started \(2026-01-05\)/);
    const future = await crew.as.hand.post(rackings(result.batch.id)).send(rack([source], [[target, 17]], { at: momentDaysAgo(-2) }));
    expect(future.status).toBe(400);
    const dated = await crew.as.hand.post(rackings(result.batch.id)).send(rack([source], [[target, 17]], { at: '2026-02-01T09:30:00+01:00' }));
    expect(dated.status).toBe(201);
    expect(dated.body.batch.lastRackedAt).toBe('2026-02-01T08:30:00.000Z');
  });
});

describe('two people racking the same vessel at once', () => {
  it('lets exactly one win; the other gets 409 naming the vessel and what it is now', async () => {
    const {
      result,
      vessels: [source],
    } = await batchInVessels(ds, crew, [20], {}, { name: 'Fermenter A' });
    const left = await sanitisedVessel(ds, crew.cellar.id, { name: 'Carboy left' });
    const right = await sanitisedVessel(ds, crew.cellar.id, { name: 'Carboy right' });
    const [first, second] = await Promise.all([
      crew.as.hand.post(rackings(result.batch.id)).send(rack([source], [[left, 19]])),
      crew.as.keeper.post(rackings(result.batch.id)).send(rack([source], [[right, 19]])),
    ]);
    expect([first.status, second.status].sort()).toEqual([201, 409]);
    const loser = first.status === 409 ? first : second;
    expect(loser.body.message).toMatch(
      /^Fermenter A changed while you were working: it is now empty and dirty \(changed .* UTC\)\. Reload and try again\.$/,
    );

    const [{ count }] = await ds.query(`SELECT COUNT(*)::int AS count FROM journal_entries WHERE batch_id = $1 AND kind = 'racked'`, [
      result.batch.id,
    ]);
    expect(count).toBe(1);
    expect(await vesselRow(ds, source.id)).toMatchObject({ batch_id: null, volume_l: null, cleaning_state: 'dirty' });
    const winnerTarget = first.status === 201 ? left : right;
    const loserTarget = first.status === 201 ? right : left;
    expect((await vesselRow(ds, winnerTarget.id)).batch_id).toBe(result.batch.id);
    expect((await vesselRow(ds, loserTarget.id)).batch_id).toBeNull();
  });

  it('keeps a target two rackings race for to the first one', async () => {
    const {
      result: a,
      vessels: [sourceA],
    } = await batchInVessels(ds, crew, [15], { name: 'Race batch A' });
    const {
      result: b,
      vessels: [sourceB],
    } = await batchInVessels(ds, crew, [15], { name: 'Race batch B' });
    const shared = await sanitisedVessel(ds, crew.cellar.id, { name: 'Only free carboy' });
    const [first, second] = await Promise.all([
      crew.as.hand.post(rackings(a.batch.id)).send(rack([sourceA], [[shared, 14]])),
      crew.as.keeper.post(rackings(b.batch.id)).send(rack([sourceB], [[shared, 14]])),
    ]);
    expect([first.status, second.status].sort()).toEqual([201, 409]);
    const loser = first.status === 409 ? first : second;
    expect(loser.body.message).toMatch(/^Only free carboy already holds Race batch [AB] \(14 L\)/);
    const [{ count }] = await ds.query(`SELECT COUNT(*)::int AS count FROM vessels WHERE id = ANY($1) AND batch_id IS NOT NULL`, [
      [sourceA.id, sourceB.id, shared.id],
    ]);
    expect(count).toBe(2);
  });
});

// fillVessel is used to set up a vessel that holds a batch without the API, as another writer would.
describe('a vessel filled behind the API’s back', () => {
  it('is refused as a target by what it holds now', async () => {
    const {
      result,
      vessels: [source],
    } = await batchInVessels(ds, crew, [12]);
    const target = await sanitisedVessel(ds, crew.cellar.id, { name: 'Sneaky carboy' });
    const intruder = await makeBatch(ds, crew.cellar.id, { name: 'Intruder cider' });
    await fillVessel(ds, target.id, intruder.id, 5);
    const res = await crew.as.hand.post(rackings(result.batch.id)).send(rack([source], [[target, 11]]));
    expect(res.status).toBe(409);
    expect(res.body.message).toBe('Sneaky carboy already holds Intruder cider (5 L); choose an empty vessel.');
  });
});
