import { Readable } from 'node:stream';
import zlib from 'node:zlib';
import tar from 'tar-stream';
import { beforeAll, describe, expect, it } from 'vitest';
import { openArchive, type OpenedArchive } from '../../server/archive/archive-reader';
import { ARCHIVE_TABLES } from '../../server/archive/archive-tables';
import { makeBatch, makeBatchInVessels } from '../helpers/batches';
import { makeLotWithCases } from '../helpers/bottles';
import { crewWithAgents, type Crew } from '../helpers/crew';
import { addReadings, amendEntry } from '../helpers/journal';
import { makeRack, placeDirectly } from '../helpers/places';
import { sanitisedVessel } from '../helpers/vessels';
import { testApp } from '../helpers/test-app';

let app: Awaited<ReturnType<typeof testApp>>['app'];
let ds: Awaited<ReturnType<typeof testApp>>['ds'];
let crew: Crew;

/** A response body as bytes (supertest leaves binary bodies alone only when told). */
const binary = (res: unknown, done: (err: Error | null, body: Buffer) => void) => {
  const parts: Buffer[] = [];
  const stream = res as NodeJS.ReadableStream;
  stream.on('data', (c: Buffer) => parts.push(c));
  stream.on('end', () => done(null, Buffer.concat(parts)));
};
const archivePath = (cellarId: string) => `/api/cellars/${cellarId}/archive`;

async function download(cellarId: string): Promise<Buffer> {
  const res = await crew.as.keeper.get(archivePath(cellarId)).buffer(true).parse(binary);
  expect(res.status).toBe(200);
  expect(res.headers['content-type']).toBe('application/gzip');
  return res.body as Buffer;
}

const restore = (bytes: Buffer, cellarId = crew.cellar.id) =>
  crew.as.keeper
    .post(`${archivePath(cellarId)}/restorations`)
    .set('content-type', 'application/gzip')
    .send(bytes);

/** Re-packs an archive's entries, changing some: for archives altered after export. */
async function repack(entries: Map<string, Buffer>, change: (name: string, bytes: Buffer) => Buffer): Promise<Buffer> {
  const pack = tar.pack();
  for (const [name, bytes] of entries) pack.entry({ name }, change(name, bytes));
  pack.finalize();
  const parts: Buffer[] = [];
  for await (const part of Readable.from(pack).pipe(zlib.createGzip())) parts.push(part as Buffer);
  return Buffer.concat(parts);
}

const UUID = /[0-9a-f]{8}-[0-9a-f]{4}-[0-9a-f]{4}-[0-9a-f]{4}-[0-9a-f]{12}/g;

/** A table's rows with every id blanked and codes put back, as a sorted list: its content apart from ids. */
function content(archive: OpenedArchive, table: string, codesBack: Map<string, string>): string[] {
  const rows = JSON.parse(archive.entries.get(`tables/${table}.json`)!.toString('utf8')) as unknown[];
  return rows
    .map((row) =>
      JSON.stringify(row)
        .replace(UUID, '<id>')
        .replace(/"([2-9A-HJ-NP-Z]{8})"/g, (whole, code: string) => (codesBack.has(code) ? `"${codesBack.get(code)}"` : whole)),
    )
    .sort();
}

beforeAll(async () => {
  ({ app, ds } = await testApp());
  crew = await crewWithAgents(app, ds);
  const { batch, vessels } = await makeBatchInVessels(ds, crew, { name: 'Archived melomel', volumesL: [10] });
  const [first] = await addReadings(ds, crew, batch.id, [
    { daysAgo: 30, sg: 1.09 },
    { daysAgo: 10, sg: 1.03 },
  ]);
  await amendEntry(ds, crew, batch.id, first, { sg: 1.088 });
  const child = await makeBatch(ds, crew.cellar.id, { name: 'Archived split' });
  await ds.query(`INSERT INTO batch_parents (child_id, parent_id, volume_l) VALUES ($1, $2, 2.5)`, [child.id, batch.id]);
  const rack = await makeRack(ds, crew.cellar.id, 'Archive rack', [4, 4]);
  await placeDirectly(ds, crew.cellar.id, rack.shelfIds[0], 1, { vesselId: vessels[0].id });
  const spare = await sanitisedVessel(ds, crew.cellar.id, { name: 'Archive spare' });
  expect((await crew.as.hand.post(`/api/cellars/${crew.cellar.id}/vessels/${spare.id}/cleaning`).send({ state: 'dirty' })).status).toBe(200);
  const { cases } = await makeLotWithCases(ds, crew.cellar.id, batch, { cases: 2, perCase: 6 });
  expect(
    (await crew.as.hand.post(`/api/cellars/${crew.cellar.id}/cases/${cases[0].id}/departures`).send({ count: 1, reason: 'drunk' })).status,
  ).toBeLessThan(300);
  await ds.query(
    `INSERT INTO photos (cellar_id, batch_id, mime_type, byte_size, data, thumbnail, uploaded_by) VALUES ($1, $2, 'image/png', 3, '\\x010203', '\\x0102', $3)`,
    [crew.cellar.id, batch.id, crew.hand.id],
  );
});

describe('whole-cellar archive', () => {
  it('restores into a new cellar with new ids and remapped codes, and exports again to the same content', async () => {
    const first = await download(crew.cellar.id);
    const res = await restore(first);
    expect(res.status).toBe(201);
    const { cellarId, name, remappedCodes } = res.body as {
      cellarId: string;
      name: string;
      remappedCodes: { table: string; from: string; to: string }[];
    };
    expect(cellarId).not.toBe(crew.cellar.id);
    expect(name).toBe(`${crew.cellar.name} (restored)`);
    // Restored on the same installation, every label code is taken: each one is replaced and listed.
    const [{ n: codeCount }] = await ds.query(
      `SELECT (SELECT count(*) FROM vessels WHERE cellar_id = $1) + (SELECT count(*) FROM bottle_lots WHERE cellar_id = $1) + (SELECT count(*) FROM bottle_cases WHERE cellar_id = $1) AS n`,
      [crew.cellar.id],
    );
    expect(remappedCodes).toHaveLength(Number(codeCount));
    expect(remappedCodes.every((c) => c.from !== c.to)).toBe(true);

    const [a, b] = [await openArchive([first]), await openArchive([await download(cellarId)])];
    const codesBack = new Map(remappedCodes.map((c) => [c.to, c.from]));
    for (const table of ARCHIVE_TABLES) {
      expect([table.name, content(b, table.name, codesBack)]).toEqual([table.name, content(a, table.name, codesBack)]);
    }
    expect(content(a, 'journal_entries', codesBack)).toHaveLength(4);
    expect(content(a, 'batch_parents', codesBack)).toHaveLength(1);
    const photoBytes = (x: OpenedArchive) =>
      [...x.entries]
        .filter(([n]) => n.startsWith('photos/'))
        .map(([n, v]) => `${n.split('/')[2]}:${v.toString('hex')}`)
        .sort();
    expect(photoBytes(b)).toEqual(photoBytes(a));
    expect(photoBytes(a)).toEqual(['data:010203', 'thumbnail:0102']);
    const cellarApartFromIds = (x: OpenedArchive) => {
      const { id: _id, name: _name, ...rest } = JSON.parse(x.entries.get('cellar.json')!.toString('utf8'));
      return rest;
    };
    expect(cellarApartFromIds(b)).toEqual(cellarApartFromIds(a));

    // The restored journal still merges its amendment into the reading it corrects.
    const readings = await crew.as.keeper.get(`/api/cellars/${cellarId}/exports/readings`);
    expect(readings.text).toContain('1.088');
  });

  it('refuses an archive altered after export, and one from a newer version, writing nothing', async () => {
    const original = await openArchive([await download(crew.cellar.id)]);
    const cellarsBefore = (await ds.query(`SELECT count(*)::int AS n FROM cellars`))[0].n;

    const altered = await repack(original.entries, (name, bytes) =>
      name === 'tables/batches.json' ? Buffer.from(bytes.toString('utf8').replace('Archived melomel', 'Altered melomel')) : bytes,
    );
    const refusedAltered = await restore(altered);
    expect(refusedAltered.status).toBe(400);
    expect(refusedAltered.body.message).toBe(
      'This archive cannot be restored: tables/batches.json was changed after the archive was made (its checksum does not match).',
    );

    const newer = await repack(original.entries, (name, bytes) =>
      name === 'manifest.json' ? Buffer.from(JSON.stringify({ ...JSON.parse(bytes.toString('utf8')), version: 99 })) : bytes,
    );
    const refusedNewer = await restore(newer);
    expect(refusedNewer.status).toBe(400);
    expect(refusedNewer.body.message).toMatch(/written by a newer version of Cellarwright \(archive format 99/);

    const notAnArchive = await restore(Buffer.from('just some text'));
    expect(notAnArchive.status).toBe(400);
    expect((await ds.query(`SELECT count(*)::int AS n FROM cellars`))[0].n).toBe(cellarsBefore);
  });

  it('moves the tasting scores of an archive written before our own scale onto it, as the migration moved stored ones', async () => {
    const [batch] = await ds.query(`SELECT id FROM batches WHERE cellar_id = $1 AND name = 'Archived melomel'`, [crew.cellar.id]);
    const tasted = await crew.as.hand
      .post(`/api/cellars/${crew.cellar.id}/batches/${batch.id}/tastings`)
      .send({ aroma: 'Pear', score: 6, at: new Date().toISOString() });
    expect(tasted.status).toBe(201);
    const current = await openArchive([await download(crew.cellar.id)]);
    // The same archive, said to be written by an installation before the TastingScoresOnOwnScale migration.
    const manifest = JSON.parse(current.entries.get('manifest.json')!.toString('utf8'));
    const older = await repack(current.entries, (name, bytes) =>
      name === 'manifest.json' ? Buffer.from(JSON.stringify({ ...manifest, schema: 'CreateIdempotencyKeys1796170900000' })) : bytes,
    );
    const res = await restore(older);
    expect(res.status).toBe(201);
    const scores = await ds.query(`SELECT (payload->>'score')::int AS score FROM journal_entries WHERE cellar_id = $1 AND kind = 'tasted'`, [
      res.body.cellarId,
    ]);
    // Read as 6 out of 20: 1 + round(6 × 7 / 20) = 1 + round(2.1) = 3 (the migration's mapping, worked by hand).
    expect(scores).toEqual([{ score: 3 }]);
  });

  it('is Keeper work', async () => {
    for (const agent of [crew.as.hand, crew.as.guest]) {
      expect((await agent.get(archivePath(crew.cellar.id))).status).toBe(403);
    }
    const guestRestore = await crew.as.guest
      .post(`${archivePath(crew.cellar.id)}/restorations`)
      .set('content-type', 'application/gzip')
      .send(Buffer.from([1]));
    expect(guestRestore.status).toBe(403);
  });
});
