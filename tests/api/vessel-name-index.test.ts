import { QueryFailedError } from 'typeorm';
import { beforeAll, describe, expect, it } from 'vitest';
import { crewWithAgents, type Crew } from '../helpers/crew';
import { testApp } from '../helpers/test-app';
import { makeVessel } from '../helpers/vessels';
import { UniqueVesselNames1796170700000 } from '../../server/db/migrations/1796170700000-UniqueVesselNames';

let ds: Awaited<ReturnType<typeof testApp>>['ds'];
let crew: Crew;
let other: Crew;

beforeAll(async () => {
  const made = await testApp();
  ds = made.ds;
  crew = await crewWithAgents(made.app, ds);
  other = await crewWithAgents(made.app, ds);
});

const insertVessel = (cellarId: string, name: string) =>
  ds.query(
    `INSERT INTO vessels (cellar_id, code, name, kind, material, capacity_l) VALUES ($1, upper(substr(md5(random()::text), 1, 8)), $2, 'jug', 'glass', 4)`,
    [cellarId, name],
  );

describe('vessel names are unique in a cellar in the database itself', () => {
  it('refuses a second vessel of one name, letter case aside, even written past the service', async () => {
    await insertVessel(crew.cellar.id, 'Cellar door jug');
    const clash = await insertVessel(crew.cellar.id, 'CELLAR DOOR JUG').catch((err: unknown) => err);
    expect(clash).toBeInstanceOf(QueryFailedError);
    expect((clash as QueryFailedError & { driverError: { code: string } }).driverError.code).toBe('23505');
    // Another cellar keeps its own names.
    await expect(insertVessel(other.cellar.id, 'Cellar door jug')).resolves.toBeDefined();
  });

  it('answers a clash that only the database catches (a CSV import) with a plain 409 naming the field, never the rule', async () => {
    const file = 'name,capacity,kind\nTwin demijohn,4.5,demijohn\ntwin DEMIJOHN,4.5,demijohn\n';
    const res = await crew.as.keeper
      .post(
        `/api/cellars/${crew.cellar.id}/imports/vessels?${new URLSearchParams({ columns: JSON.stringify({ name: 'name', capacity: 'capacity', kind: 'kind' }) })}`,
      )
      .set('content-type', 'text/csv')
      .send(file);
    expect(res.status).toBe(409);
    expect(res.body).toEqual({
      error: 'conflict',
      message: 'This cellar already has a vessel with that name. Choose another name.',
      field: 'name',
      issues: [{ path: 'body.name', message: 'This cellar already has a vessel with that name. Choose another name.' }],
    });
    expect(JSON.stringify(res.body)).not.toMatch(/uq_|constraint|index/i);
    // All or nothing: neither row was kept.
    const [{ n }] = await ds.query(`SELECT count(*)::int AS n FROM vessels WHERE cellar_id = $1 AND lower(name) = 'twin demijohn'`, [crew.cellar.id]);
    expect(n).toBe(0);
  });

  it('puts the service’s own refusal under the name field too', async () => {
    await makeVessel(ds, crew.cellar.id, { name: 'Window carboy' });
    const res = await crew.as.hand
      .post(`/api/cellars/${crew.cellar.id}/vessels`)
      .send({ name: 'window Carboy', kind: 'carboy', material: 'glass', capacityL: 23 });
    expect(res.status).toBe(409);
    expect(res.body.issues).toEqual([
      { path: 'body.name', message: 'This cellar already has a vessel called "Window carboy". Choose another name.' },
    ]);
  });

  it('migrates a cellar that already has clashing names: the first keeps its name, the others get their id’s start', async () => {
    const rollback = new Error('rollback');
    const original = new Map<string, string>();
    const seen = await ds
      .transaction(async (tx) => {
        // As a database from before the rule: no index, two "Old jug"s and an "OLD JUG".
        await tx.query(`DROP INDEX uq_vessels_cellar_name`);
        for (const name of ['Old jug', 'OLD JUG', 'Old jug']) {
          const [row]: { id: string }[] = await tx.query(
            `INSERT INTO vessels (cellar_id, code, name, kind, material, capacity_l) VALUES ($1, upper(substr(md5(random()::text), 1, 8)), $2, 'jug', 'glass', 4) RETURNING id`,
            [other.cellar.id, name],
          );
          original.set(row.id, name);
        }
        await new UniqueVesselNames1796170700000().up(tx.queryRunner!);
        const rows: { id: string; name: string }[] = await tx.query(`SELECT id, name FROM vessels WHERE id = ANY($1) ORDER BY created_at, id`, [
          [...original.keys()],
        ]);
        throw Object.assign(rollback, { rows });
      })
      .catch((err: unknown) => (err === rollback ? (rollback as Error & { rows: { id: string; name: string }[] }).rows : Promise.reject(err)));
    expect(seen).toHaveLength(3);
    expect(seen[0].name).toBe(original.get(seen[0].id));
    for (const row of seen.slice(1)) expect(row.name).toBe(`${original.get(row.id)} ${row.id.slice(0, 8)}`);
  });

  it('gives the test factories a free name when one is already taken, so factories never clash', async () => {
    const first = await makeVessel(ds, crew.cellar.id, { name: 'Factory carboy' });
    const second = await makeVessel(ds, crew.cellar.id, { name: 'Factory carboy' });
    expect(first.name).toBe('Factory carboy');
    expect(second.name).toMatch(/^Factory carboy [2-9A-HJ-NP-Z]{8}$/);
  });
});
