import { parse } from 'csv-parse/sync';
import { beforeAll, describe, expect, it } from 'vitest';
import { importPreviewSchema, importResultSchema } from '../../shared/schemas/exchange';
import { Cellar } from '../../server/entities/cellar.entity';
import { utf8Text } from '../../server/exchange/csv-upload';
import { makeBatchInVessels } from '../helpers/batches';
import { crewWithAgents, type Crew } from '../helpers/crew';
import { addReadings } from '../helpers/journal';
import { testApp } from '../helpers/test-app';

let app: Awaited<ReturnType<typeof testApp>>['app'];
let ds: Awaited<ReturnType<typeof testApp>>['ds'];
let crew: Crew;

beforeAll(async () => {
  ({ app, ds } = await testApp());
  crew = await crewWithAgents(app, ds);
  await ds.getRepository(Cellar).update({ id: crew.cellar.id }, { timeZone: 'Europe/Berlin' });
});

const imports = (what: string, query: Record<string, string>) => `/api/cellars/${crew.cellar.id}/imports/${what}?${new URLSearchParams(query)}`;
const readingCount = async (batchId: string) =>
  (await ds.query(`SELECT count(*)::int AS n FROM journal_entries WHERE batch_id = $1 AND kind = 'reading'`, [batchId]))[0].n as number;

/** A hydrometer log as a European spreadsheet writes it: semicolons, decimal commas, day-first dates, °F. */
const EUROPEAN = [
  'Datum;Gravity;Temp (°F);Battery',
  '03.11.2026 08:00;1,090;68;4,1',
  '10.11.2026 08:00;1,050;64,4;4,0',
  '17.11.2026;1,020;;3,9',
  '',
].join('\r\n');

describe('CSV import preview', () => {
  it('detects the delimiter, decimal comma, day-first dates and °F, and matches columns by name', async () => {
    const res = await crew.as.keeper
      .post(imports('preview', { target: 'readings' }))
      .set('content-type', 'text/csv')
      .send(EUROPEAN);
    expect(res.status).toBe(200);
    const preview = importPreviewSchema.parse(res.body);
    expect(preview).toMatchObject({ delimiter: ';', decimalComma: true, dateFormat: 'dmy', temperatureUnit: 'F', gravityUnit: 'sg' });
    expect(preview.headers).toEqual(['Datum', 'Gravity', 'Temp (°F)', 'Battery']);
    expect(preview.rows[0]).toEqual(['03.11.2026 08:00', '1,090', '68', '4,1']);
    // "Datum" is no header word we know, but its cells read as dates.
    expect(preview.suggestedColumns).toEqual({ at: 'Datum', sg: 'Gravity', temperature: 'Temp (°F)' });
    expect(preview.notes).toContain('Columns not used unless you map them: Battery.');
  });
});

describe('CSV import of readings', () => {
  const options = {
    delimiter: ';',
    decimalComma: 'true',
    dateFormat: 'dmy',
    temperatureUnit: 'F',
    columns: JSON.stringify({ at: 'Datum', sg: 'Gravity', temperature: 'Temp (°F)' }),
  };

  it('imports every row through the journal, converting units, and adds nothing the second time', async () => {
    const { batch } = await makeBatchInVessels(ds, crew, { volumesL: [10], startedDaysAgo: 120 });
    const query = { ...options, batchId: batch.id };
    const first = await crew.as.keeper.post(imports('readings', query)).set('content-type', 'text/csv').send(EUROPEAN);
    expect(first.status).toBe(200);
    expect(importResultSchema.parse(first.body)).toEqual({ added: 3, alreadyImported: 0, rows: 3 });
    const rows: { at: Date; sg: number; temperatureC: number | null }[] = await ds.query(
      `SELECT occurred_at AS at, (payload->>'sg')::float8 AS sg, (payload->>'temperatureC')::float8 AS "temperatureC"
         FROM journal_entries WHERE batch_id = $1 AND kind = 'reading' ORDER BY occurred_at`,
      [batch.id],
    );
    // 08:00 in Berlin in November (UTC+01:00, IANA tz database, from memory) is 07:00 UTC; a date alone is noon there.
    expect(rows.map((r) => r.at.toISOString())).toEqual(['2026-11-03T07:00:00.000Z', '2026-11-10T07:00:00.000Z', '2026-11-17T11:00:00.000Z']);
    expect(rows.map((r) => r.sg)).toEqual([1.09, 1.05, 1.02]);
    // t/°C = (t/°F − 32)/1.8 (NIST SP 811, Appendix B): 68 °F = 20 °C, 64.4 °F = 18 °C.
    expect(rows.map((r) => r.temperatureC)).toEqual([20, 18, null]);
    const [{ lastSg }] = await ds.query(`SELECT last_reading_sg::float8 AS "lastSg" FROM batches WHERE id = $1`, [batch.id]);
    expect(lastSg).toBe(1.02);

    const again = await crew.as.keeper.post(imports('readings', query)).set('content-type', 'text/csv').send(EUROPEAN);
    expect(importResultSchema.parse(again.body)).toEqual({ added: 0, alreadyImported: 3, rows: 3 });
    expect(await readingCount(batch.id)).toBe(3);
  });

  it('lists every bad row by row and column and writes nothing', async () => {
    const { batch } = await makeBatchInVessels(ds, crew, { volumesL: [10], startedDaysAgo: 120 });
    const bad = [
      'Datum;Gravity;Temp (°F);Battery',
      '03.11.2026 08:00;1,090;68;4,1',
      '04.11.2026 08:00;10,5;68;4,1',
      '2026-11-05;1,040;68;4,1',
      '06.11.2026 08:00;1,030;68',
      '07.11.2026 08:00;abc;68;4,1',
      '01.01.2099;10,5;68;4,1',
    ].join('\n');
    const res = await crew.as.keeper
      .post(imports('readings', { ...options, batchId: batch.id }))
      .set('content-type', 'text/csv')
      .send(bad);
    expect(res.status).toBe(400);
    expect(res.body.message).toMatch(/nothing was imported/);
    const problems = res.body.problems as { row: number; column: string; message: string }[];
    expect(problems.map((p) => [p.row, p.column])).toEqual([
      [2, 'Gravity'],
      [3, 'Datum'],
      [4, ''],
      [5, 'Gravity'],
      [6, 'Datum'],
      [6, 'Gravity'],
    ]);
    // A gravity of 10.5 is no specific gravity: the reading's own range check names it.
    expect(problems[0].message).toBe('a gravity is at most 1.200');
    expect(problems[1].message).toMatch(/not a date in the chosen format \(DMY\)/);
    expect(problems[2].message).toMatch(/3 cells where the header has 4/);
    expect(problems[4].message).toBe('is in the future');
    expect(await readingCount(batch.id)).toBe(0);
  });

  it('refuses broken quotes, text that is not UTF-8, and a mapping that names no such column', async () => {
    const { batch } = await makeBatchInVessels(ds, crew, { volumesL: [10] });
    const query = { columns: JSON.stringify({ at: 'at', sg: 'sg' }), batchId: batch.id };
    const quotes = await crew.as.keeper
      .post(imports('readings', query))
      .set('content-type', 'text/csv')
      .send('at,sg\n"2026-11-03,1.050\n2026-11-04,1.040\n');
    expect(quotes.status).toBe(400);
    expect(quotes.body.message).toMatch(/cannot be read as CSV/);

    const latin1 = Buffer.concat([
      Buffer.from('at,sg,note\n2026-11-03,1.050,ok\n2026-11-04,1.040,'),
      Buffer.from([0xe9, 0x74, 0xe9]),
      Buffer.from('\n'),
    ]);
    const encoding = await crew.as.keeper.post(imports('readings', query)).set('content-type', 'text/csv').send(latin1);
    expect(encoding.status).toBe(400);
    expect(encoding.body.message).toBe('Line 3 of the file is not UTF-8 text. Save the file as "CSV UTF-8" and import it again.');

    const unmapped = await crew.as.keeper
      .post(imports('readings', { ...query, columns: JSON.stringify({ at: 'Date', sg: 'sg' }) }))
      .set('content-type', 'text/csv')
      .send('at,sg\n2026-11-03,1.050\n');
    expect(unmapped.status).toBe(400);
    expect(unmapped.body.problems).toEqual([{ row: 0, column: 'Date', message: 'is not a column of the file (mapped to at)' }]);
    expect(await readingCount(batch.id)).toBe(0);
  });

  it('stops reading past the size limit', async () => {
    const chunks = [Buffer.alloc(6, 'a'), Buffer.alloc(6, 'b')];
    const read = async () => {
      for await (const _ of utf8Text(chunks, 10)) void _;
    };
    await expect(read()).rejects.toMatchObject({ status: 413 });
  });

  it('is Keeper work', async () => {
    const { batch } = await makeBatchInVessels(ds, crew, { volumesL: [10] });
    for (const agent of [crew.as.hand, crew.as.guest]) {
      const res = await agent
        .post(imports('readings', { ...options, batchId: batch.id }))
        .set('content-type', 'text/csv')
        .send(EUROPEAN);
      expect(res.status).toBe(403);
    }
  });

  it("takes a batch's readings exported as CSV into another batch", async () => {
    const { batch: source } = await makeBatchInVessels(ds, crew, { name: 'Source batch', volumesL: [10], startedDaysAgo: 30 });
    await addReadings(ds, crew, source.id, [
      { daysAgo: 20, sg: 1.08 },
      { daysAgo: 10, sg: 1.03 },
    ]);
    const exported = await crew.as.guest.get(`/api/cellars/${crew.cellar.id}/exports/readings?batchId=${source.id}&bom=true`);
    const { batch: target } = await makeBatchInVessels(ds, crew, { name: 'Target batch', volumesL: [10], startedDaysAgo: 40 });
    const columns = JSON.stringify({ at: 'taken at', sg: 'gravity (SG)', temperature: 'temperature (°C)', ph: 'pH' });
    const res = await crew.as.keeper
      .post(imports('readings', { columns, batchId: target.id }))
      .set('content-type', 'text/csv')
      .send(Buffer.from(exported.text, 'utf8'));
    expect(res.status).toBe(200);
    expect(res.body).toEqual({ added: 2, alreadyImported: 0, rows: 2 });
    const back = parse((await crew.as.guest.get(`/api/cellars/${crew.cellar.id}/exports/readings?batchId=${target.id}`)).text, {
      columns: true,
    }) as Record<string, string>[];
    const before = parse(exported.text, { columns: true, bom: true }) as Record<string, string>[];
    expect(back.map((r) => [r['taken at'], r['gravity (SG)']])).toEqual(before.map((r) => [r['taken at'], r['gravity (SG)']]));
  });
});

describe('CSV import of vessels', () => {
  it('adds vessels with fresh codes, capacity converted from US gallons, once', async () => {
    const file = 'Name,Capacity (gal),Type,Material\nBig carboy,5,carboy,glass\nSmall jug,1,jug,glass\n';
    const query = { volumeUnit: 'US gal', columns: JSON.stringify({ name: 'Name', capacity: 'Capacity (gal)', kind: 'Type', material: 'Material' }) };
    const res = await crew.as.keeper.post(imports('vessels', query)).set('content-type', 'text/csv').send(file);
    expect(res.status).toBe(200);
    expect(res.body).toEqual({ added: 2, alreadyImported: 0, rows: 2 });
    const rows: { name: string; capacityL: number; code: string }[] = await ds.query(
      `SELECT name, capacity_l::float8 AS "capacityL", code FROM vessels WHERE cellar_id = $1 AND name IN ('Big carboy', 'Small jug') ORDER BY name`,
      [crew.cellar.id],
    );
    // 1 US gallon = 3.785411784 L (NIST Handbook 44, Appendix C): 5 gal = 18.927 L, 1 gal = 3.785 L.
    expect(rows.map((r) => [r.name, r.capacityL])).toEqual([
      ['Big carboy', 18.927],
      ['Small jug', 3.785],
    ]);
    expect(new Set(rows.map((r) => r.code)).size).toBe(2);
    const again = await crew.as.keeper.post(imports('vessels', query)).set('content-type', 'text/csv').send(file);
    expect(again.body).toEqual({ added: 0, alreadyImported: 2, rows: 2 });
  });

  it('names an unknown kind by row and column', async () => {
    const res = await crew.as.keeper
      .post(imports('vessels', { columns: JSON.stringify({ name: 'name', capacity: 'capacity', kind: 'kind' }) }))
      .set('content-type', 'text/csv')
      .send('name,capacity,kind\nOdd one,4,amphora\n');
    expect(res.status).toBe(400);
    expect(res.body.problems).toEqual([expect.objectContaining({ row: 1, column: 'kind' })]);
  });
});
