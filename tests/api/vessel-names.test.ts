import { beforeAll, describe, expect, it } from 'vitest';
import { crewWithAgents, type Crew } from '../helpers/crew';
import { testApp } from '../helpers/test-app';

let crew: Crew;
let other: Crew;

beforeAll(async () => {
  const { app, ds } = await testApp();
  crew = await crewWithAgents(app, ds);
  other = await crewWithAgents(app, ds);
});

const vessels = (c: Crew) => `/api/cellars/${c.cellar.id}/vessels`;
const jug = (name: string, capacityL = 4) => ({ name, kind: 'jug', material: 'glass', capacityL });

describe('vessel names in a cellar', () => {
  it('refuses a second vessel of the same name (letter case aside) with a plain 409', async () => {
    expect((await crew.as.hand.post(vessels(crew)).send(jug('Jug 1'))).status).toBe(201);
    const twin = await crew.as.hand.post(vessels(crew)).send(jug('jug 1', 5000));
    expect(twin.status).toBe(409);
    expect(twin.body.message).toBe('This cellar already has a vessel called "Jug 1". Choose another name.');
    // Another cellar may use the name.
    expect((await other.as.hand.post(vessels(other)).send(jug('Jug 1'))).status).toBe(201);
  });

  it('refuses a rename onto another vessel’s name but lets a vessel keep its own', async () => {
    const a = (await crew.as.hand.post(vessels(crew)).send(jug('Carboy north'))).body;
    const b = (await crew.as.hand.post(vessels(crew)).send(jug('Carboy south'))).body;
    expect((await crew.as.hand.patch(`${vessels(crew)}/${b.id}`).send({ name: 'Carboy North' })).status).toBe(409);
    expect((await crew.as.hand.patch(`${vessels(crew)}/${a.id}`).send({ name: 'Carboy north', notes: 'by the door' })).status).toBe(200);
  });

  it('lets only one of two simultaneous creations of one name win', async () => {
    const answers = await Promise.all([
      crew.as.hand.post(vessels(crew)).send(jug('Race jug')),
      crew.as.keeper.post(vessels(crew)).send(jug('Race jug')),
    ]);
    expect(answers.map((a) => a.status).sort()).toEqual([201, 409]);
  });
});
