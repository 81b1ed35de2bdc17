import { memberActor } from '../../server/core/actor';
import { beforeAll, describe, expect, it } from 'vitest';
import { seedDemoRecords } from '../../server/seed/demo-cellar';
import { todaySchema } from '../../shared/schemas/today';
import { makeCellarWithCrew, TEST_PASSWORD, type CellarCrew } from '../helpers/crew';
import { signedInAgent, testApp } from '../helpers/test-app';

describe('GET /today', () => {
  let crew: CellarCrew;
  let agent: Awaited<ReturnType<typeof signedInAgent>>;

  beforeAll(async () => {
    const { app, ds } = await testApp();
    crew = await makeCellarWithCrew(ds, 'Today under test');
    await ds.transaction((tx) =>
      seedDemoRecords(tx, {
        keeper: memberActor(crew.cellar.id, crew.keeper.id, 'keeper'),
        hand: memberActor(crew.cellar.id, crew.hand.id, 'hand'),
      }),
    );
    agent = await signedInAgent(app, crew.guest.email, TEST_PASSWORD);
  });

  it('shows ferments with their state, what needs racking, oak due out, free vessels and bottles', async () => {
    const res = await agent.get(`/api/cellars/${crew.cellar.id}/today`);
    expect(res.status).toBe(200);
    const today = todaySchema.parse(res.body);

    const byName = Object.fromEntries(today.ferments.map((f) => [f.name, f]));
    // The states are shared/calc's fermentationState over the demo's readings (see demo-seed.test.ts).
    expect(byName['Hawthorn Hollow Traditional']?.state).toBe('active');
    expect(byName['Stubborn Quince Cyser']?.state).toBe('stuck');
    expect(byName['Hawthorn Hollow Traditional']?.vesselNames).toEqual(['Fermenter 1']);
    // Bulk-ageing and bottled batches are not ferments any more.
    expect(byName['Linden Blossom Metheglin']).toBeUndefined();
    expect(byName['Orchard Gate Cider']).toBeUndefined();

    // The oak went in 14 days ago to come out in 7: due within the week, not overdue.
    expect(today.additionsDue).toEqual([expect.objectContaining({ batchName: 'Blackcurrant Melomel', overdue: false })]);

    // Demo 2 (4.5 L, yesterday), Jug 2 (3.8 L, today), Keg 1 (19 L, 2 days): Demo 3 has lapsed.
    expect(today.freeSanitised).toEqual([
      { capacityL: 3.8, count: 1 },
      { capacityL: 4.5, count: 1 },
      { capacityL: 19, count: 1 },
    ]);
    expect(today.bottles).toEqual({ lots: 1, bottlesLeft: 33 });
    expect(today.needsRacking.every((b) => b.needsRacking)).toBe(true);
  });

  it('is 404 for a cellar one is not in', async () => {
    const res = await agent.get('/api/cellars/00000000-0000-4000-8000-000000000000/today');
    expect(res.status).toBe(404);
  });
});
