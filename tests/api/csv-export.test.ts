import { parse } from 'csv-parse/sync';
import { beforeAll, describe, expect, it } from 'vitest';
import { Cellar } from '../../server/entities/cellar.entity';
import { makeBatchInVessels } from '../helpers/batches';
import { makeLotWithCases } from '../helpers/bottles';
import { crewWithAgents, type Crew } from '../helpers/crew';
import { addReadings, amendEntry } from '../helpers/journal';
import { makeVessel } from '../helpers/vessels';
import { testApp } from '../helpers/test-app';

let app: Awaited<ReturnType<typeof testApp>>['app'];
let ds: Awaited<ReturnType<typeof testApp>>['ds'];
let crew: Crew;
let stranger: Crew;

beforeAll(async () => {
  ({ app, ds } = await testApp());
  [crew, stranger] = await Promise.all([crewWithAgents(app, ds), crewWithAgents(app, ds)]);
  await ds.getRepository(Cellar).update({ id: crew.cellar.id }, { timeZone: 'Europe/Berlin' });
});

const exportPath = (table: string, query = '') => `/api/cellars/${crew.cellar.id}/exports/${table}${query ? `?${query}` : ''}`;

/** The CSV answer parsed back into records keyed by header. */
function records(text: string): Record<string, string>[] {
  return parse(text, { columns: true, bom: true, skip_empty_lines: true });
}

describe('CSV export', () => {
  it('writes vessels in the units asked for, says them in the header, and keeps to the page filter', async () => {
    await makeVessel(ds, crew.cellar.id, { name: 'Export carboy', capacityL: 23 });
    await makeVessel(ds, crew.cellar.id, { name: 'Other jug', capacityL: 4.5 });
    const res = await crew.as.guest.get(exportPath('vessels', 'units=us&q=export'));
    expect(res.status).toBe(200);
    expect(res.headers['content-type']).toBe('text/csv; charset=utf-8');
    expect(res.headers['content-disposition']).toMatch(/^attachment; filename="cellarwright-vessels-\d{4}-\d{2}-\d{2}\.csv"$/);
    const rows = records(res.text);
    expect(rows.map((r) => r.name)).toEqual(['Export carboy']);
    // 1 US gallon = 3.785411784 L exactly (NIST Handbook 44, Appendix C): 23 / 3.785411784 = 6.0759…
    expect(Number(rows[0]['capacity (US gal)'])).toBeCloseTo(6.076, 3);
    expect(rows[0]).not.toHaveProperty('capacity (L)');

    const metric = records((await crew.as.guest.get(exportPath('vessels', 'q=export'))).text);
    expect(metric[0]['capacity (L)']).toBe('23');
  });

  it('neutralises cells that a spreadsheet would run as a formula', async () => {
    for (const name of ['=HYPERLINK("x")', '+1+2', '-2+3', '@SUM(A1)']) await makeVessel(ds, crew.cellar.id, { name });
    const rows = records((await crew.as.keeper.get(exportPath('vessels'))).text);
    const names = rows.map((r) => r.name);
    expect(names).toEqual(expect.arrayContaining([`'=HYPERLINK("x")`, `'+1+2`, `'-2+3`, `'@SUM(A1)`]));
    expect(names.filter((n) => /^[=+\-@]/.test(n))).toEqual([]);
  });

  it('writes readings with corrections applied, temperatures in °F for US units, and moments with the cellar offset', async () => {
    const { batch } = await makeBatchInVessels(ds, crew, { name: 'Export melomel', volumesL: [10] });
    const [first] = await addReadings(ds, crew, batch.id, [
      { daysAgo: 20, sg: 1.05 },
      { daysAgo: 10, sg: 1.02 },
    ]);
    await amendEntry(ds, crew, batch.id, first, { sg: 1.048, correctedSg: 1.048, temperatureC: 20 });
    const res = await crew.as.hand.get(exportPath('readings', `units=us&batchId=${batch.id}`));
    const rows = records(res.text);
    expect(rows.map((r) => r['gravity (SG)'])).toEqual(['1.048', '1.02']);
    // t/°F = 1.8 · t/°C + 32 (NIST SP 811, Appendix B): 20 °C is 68 °F.
    expect(rows[0]['temperature (°F)']).toBe('68');
    expect(rows[1]['temperature (°F)']).toBe('');
    // Europe/Berlin is UTC+01:00 in winter and UTC+02:00 in summer (IANA tz database, from memory).
    for (const row of rows) expect(row['taken at']).toMatch(/^\d{4}-\d{2}-\d{2}T\d{2}:\d{2}:\d{2}\+0[12]:00$/);
    const stored: { at: Date }[] = await ds.query(`SELECT occurred_at AS at FROM journal_entries WHERE id = $1`, [first]);
    expect(new Date(rows[0]['taken at']).getTime()).toBe(Math.floor(stored[0].at.getTime() / 1000) * 1000);
  });

  it('writes one row per journal entry, amendments included, with a byte-order mark when asked', async () => {
    const { batch } = await makeBatchInVessels(ds, crew, { name: 'Journal export', volumesL: [5] });
    const [reading] = await addReadings(ds, crew, batch.id, [{ daysAgo: 3, sg: 1.01 }]);
    await amendEntry(ds, crew, batch.id, reading, { sg: 1.012 });
    const res = await crew.as.keeper.get(exportPath('journal', `batchId=${batch.id}&bom=true`)).buffer(true);
    expect([...Buffer.from(res.text, 'utf8').subarray(0, 3)]).toEqual([0xef, 0xbb, 0xbf]);
    const rows = records(res.text);
    expect(rows.map((r) => r.kind)).toEqual(['started', 'reading', 'amendment']);
    expect(rows[1]['gravity (SG)']).toBe('1.01');
    expect(rows[2]['corrects entry']).toBe(reading);
    expect(JSON.parse(rows[2]['corrected fields'])).toEqual({ sg: 1.012 });
    expect(rows[0]['volume (L)']).toBe('5');
    expect(rows[1].by).toBe('Hal Hand');
  });

  it('streams a journal longer than one page, every entry once, in order', async () => {
    const { batch } = await makeBatchInVessels(ds, crew, { name: 'Long journal', volumesL: [5] });
    await ds.query(
      `INSERT INTO journal_entries (cellar_id, batch_id, kind, payload, occurred_at)
       SELECT $1, $2, 'note', jsonb_build_object('kind', 'note', 'text', 'note ' || n), now() - make_interval(secs => 2000 - n)
         FROM generate_series(1, 1234) AS n`,
      [crew.cellar.id, batch.id],
    );
    const rows = records((await crew.as.guest.get(exportPath('journal', `batchId=${batch.id}`))).text);
    expect(rows).toHaveLength(1235);
    expect(rows[1].text).toBe('note 1');
    expect(rows[1234].text).toBe('note 1234');
    expect(new Set(rows.map((r) => r['entry id'])).size).toBe(1235);
    expect(rows[5].by).toBe('the cellar');
  });

  it('writes batches, lots, cases and departures', async () => {
    const { batch } = await makeBatchInVessels(ds, crew, { name: 'Bottled cyser', volumesL: [8] });
    const { lot, cases } = await makeLotWithCases(ds, crew.cellar.id, batch, { cases: 2, perCase: 6 });
    const draw = await crew.as.hand
      .post(`/api/cellars/${crew.cellar.id}/cases/${cases[0].id}/departures`)
      .send({ count: 2, reason: 'gift', note: '-for a friend' });
    expect(draw.status).toBeLessThan(300);

    const batches = records((await crew.as.guest.get(exportPath('batches', 'q=cyser'))).text);
    expect(batches).toHaveLength(1);
    expect(batches[0]).toMatchObject({ name: 'Bottled cyser', 'volume in vessels (L)': '8', 'original gravity (SG)': '1.1' });

    const lots = records((await crew.as.guest.get(exportPath('lots', 'q=cyser'))).text);
    expect(lots).toEqual([
      expect.objectContaining({ 'lot code': lot.code, bottles: '12', 'bottles left': '10', 'sulfite added': 'yes', cases: '2' }),
    ]);

    const caseRows = records((await crew.as.guest.get(exportPath('cases', 'q=cyser'))).text);
    expect(caseRows.map((c) => [c['case number'], c['bottles left']])).toEqual([
      ['1', '4'],
      ['2', '6'],
    ]);

    const departures = records((await crew.as.guest.get(exportPath('departures'))).text);
    const mine = departures.filter((d) => d['lot code'] === lot.code);
    expect(mine).toEqual([expect.objectContaining({ bottles: '2', reason: 'gift', note: "'-for a friend", by: 'Hal Hand' })]);
  });

  it("answers 404 to another cellar's member and 400 to an unknown filter value", async () => {
    const res = await stranger.as.keeper.get(exportPath('vessels'));
    expect(res.status).toBe(404);
    const bad = await crew.as.keeper.get(exportPath('vessels', 'units=imperial'));
    expect(bad.status).toBe(400);
  });
});
