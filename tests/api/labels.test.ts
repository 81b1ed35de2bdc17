import { execFile } from 'node:child_process';
import fs from 'node:fs';
import os from 'node:os';
import path from 'node:path';
import { promisify } from 'node:util';
import dayjs from 'dayjs';
import jsQR from 'jsqr';
import { PNG } from 'pngjs';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { abvBy } from '../../shared/calc';
import { labelChoicesSchema } from '../../shared/schemas/labels';
import { cellOrigin, mm } from '../../server/labels/layout';
import { renderLabelsPdf } from '../../server/labels/render';
import { vesselLabel } from '../../server/labels/content';
import { localDate } from '../../server/core/local-date';
import { fitText } from '../../server/labels/text-fit';
import { LABELS_DIR, labelTemplates, LabelTemplateError, loadTemplates } from '../../server/labels/templates';
import type { LabelTemplate } from '../../server/labels/template-schema';
import type { TextReport } from '../../server/labels/types';
import { makeBatch } from '../helpers/batches';
import { makeLotWithCases } from '../helpers/bottles';
import { makeCellarWithCrew, TEST_PASSWORD, type CellarCrew } from '../helpers/crew';
import { makeRack, placeDirectly } from '../helpers/places';
import { makeVessel } from '../helpers/vessels';
import { signedInAgent, testApp } from '../helpers/test-app';

const run = promisify(execFile);
const PUBLIC_URL = 'https://cellar.example.test';
const DPI = 300;
const tmp = fs.mkdtempSync(path.join(os.tmpdir(), 'cw-labels-'));
afterAll(() => fs.rmSync(tmp, { recursive: true, force: true }));

type Agent = Awaited<ReturnType<typeof signedInAgent>>;
let crew: CellarCrew;
let other: CellarCrew;
let hand: Agent;
let guest: Agent;
let app: Awaited<ReturnType<typeof testApp>>['app'];
let ds: Awaited<ReturnType<typeof testApp>>['ds'];
const codes: Record<string, { id: string; code: string }> = {};

beforeAll(async () => {
  ({ app, ds } = await testApp({ publicUrl: PUBLIC_URL }));
  crew = await makeCellarWithCrew(ds);
  other = await makeCellarWithCrew(ds);
  hand = await signedInAgent(app, crew.hand.email, TEST_PASSWORD);
  guest = await signedInAgent(app, crew.guest.email, TEST_PASSWORD);
  const cellarId = crew.cellar.id;
  const melomel = await makeBatch(ds, cellarId, { name: 'Bramble Melomel', kind: 'melomel', og: 1.112, lastReadingSg: 1.01 });
  const long = await makeBatch(ds, cellarId, {
    name: 'Smoked pear, wildflower honey and long pepper metheglin for the midwinter feast',
    kind: 'metheglin',
    og: 1.11,
  });
  codes.v1 = await makeVessel(ds, cellarId, { name: 'Carboy 1', batch: melomel });
  codes.v2 = await makeVessel(ds, cellarId, { name: 'The long-named green demijohn behind the cellar stairs', batch: long, capacityL: 5 });
  codes.v3 = await makeVessel(ds, cellarId, { name: 'Jug 3' });
  const sulfited = await makeLotWithCases(ds, cellarId, melomel, { cases: 2, sulfiteAdded: true });
  codes.lot = sulfited.lot;
  codes.c1 = sulfited.cases[0]!;
  codes.c2 = sulfited.cases[1]!;
  const plain = await makeLotWithCases(ds, cellarId, long, { cases: 1, sulfiteAdded: false, abvEstimate: null });
  codes.plainCase = plain.cases[0]!;
  codes.foreign = await makeVessel(ds, other.cellar.id, { name: 'Not yours' });
});

const pdfUrl = (query: Record<string, string | number>) =>
  `/api/cellars/${crew.cellar.id}/labels/pdf?${new URLSearchParams(Object.entries(query).map(([k, v]) => [k, String(v)]))}`;

async function fetchPdf(query: Record<string, string | number>): Promise<string> {
  const res = await hand
    .get(pdfUrl(query))
    .buffer(true)
    .parse((r, cb) => {
      const chunks: Buffer[] = [];
      r.on('data', (c: Buffer) => chunks.push(c));
      r.on('end', () => cb(null, Buffer.concat(chunks)));
    });
  expect(res.status, String(res.body)).toBe(200);
  expect(res.headers['content-type']).toBe('application/pdf');
  expect(res.headers['content-disposition']).toMatch(/^inline; filename=".+\.pdf"$/);
  const file = path.join(tmp, `${Math.random().toString(36).slice(2)}.pdf`);
  fs.writeFileSync(file, res.body as Buffer);
  return file;
}

async function pdfInfo(file: string): Promise<{ pages: number; widthPt: number; heightPt: number }> {
  const { stdout } = await run('pdfinfo', [file]);
  const size = /Page size:\s+([\d.]+) x ([\d.]+) pts/.exec(stdout)!;
  return { pages: Number(/Pages:\s+(\d+)/.exec(stdout)![1]), widthPt: Number(size[1]), heightPt: Number(size[2]) };
}

/** Rasterises pages first..last at 300 dpi. */
async function rasterise(file: string, first: number, last: number): Promise<PNG[]> {
  const prefix = `${file}-page`;
  await run('pdftoppm', ['-r', String(DPI), '-png', '-f', String(first), '-l', String(last), file, prefix]);
  const pngs = fs
    .readdirSync(tmp)
    .filter((f) => path.join(tmp, f).startsWith(prefix))
    .sort();
  return pngs.map((f) => PNG.sync.read(fs.readFileSync(path.join(tmp, f))));
}

/** Decodes the QR code in one label cell of a rasterised page (null when there is none). */
function decodeCell(page: PNG, t: LabelTemplate, cell: number): string | null {
  const px = (v: number) => Math.round((v / 25.4) * DPI);
  const o = cellOrigin(t, cell);
  const x0 = px(o.x);
  const y0 = px(o.y);
  const w = Math.min(px(t.label.width), page.width - x0);
  const h = Math.min(px(t.label.height), page.height - y0);
  const data = new Uint8ClampedArray(w * h * 4);
  for (let row = 0; row < h; row++) {
    const from = ((y0 + row) * page.width + x0) * 4;
    data.set(page.data.subarray(from, from + w * 4), row * w * 4);
  }
  return jsQR(data, w, h)?.data ?? null;
}

const urlOf = (code: string) => `${PUBLIC_URL}/s/${code}`;

describe('templates', () => {
  it('lists every template file with its page, label size and labels per page', async () => {
    const res = await guest.get(`/api/cellars/${crew.cellar.id}/labels/templates`);
    expect(res.status).toBe(200);
    const files = fs
      .readdirSync(LABELS_DIR)
      .filter((f) => f.endsWith('.json'))
      .map((f) => f.replace(/\.json$/, ''));
    expect(res.body.map((t: { id: string }) => t.id).sort()).toEqual(files.sort());
    expect(res.body.find((t: { id: string }) => t.id === 'a4-3x8-70x37')).toMatchObject({
      kind: 'sheet',
      pageSize: { widthMm: 210, heightMm: 297 },
      labelSize: { widthMm: 70, heightMm: 37 },
      labelsPerPage: 24,
    });
    expect(res.body.filter((t: { kind: string }) => t.kind === 'roll').length).toBeGreaterThanOrEqual(2);
  });

  it('refuses a template file whose boxes leave the label or cover the QR code, naming the file', () => {
    const dir = fs.mkdtempSync(path.join(tmp, 'bad-'));
    const good = JSON.parse(fs.readFileSync(path.join(LABELS_DIR, 'a4-3x8-70x37.json'), 'utf8'));
    good.id = 'broken-sheet';
    good.layouts.vessel.fields[0].box.w = 60; // runs off the right edge
    good.layouts.case.fields[0].box.x = 10; // onto the QR code
    fs.writeFileSync(path.join(dir, 'broken-sheet.json'), JSON.stringify(good));
    expect(() => loadTemplates(dir)).toThrow(LabelTemplateError);
    expect(() => loadTemplates(dir)).toThrow(
      /broken-sheet\.json[\s\S]*layouts\.vessel\.fields\.0\.box: the name box leaves the label[\s\S]*overlaps the QR/,
    );
    fs.writeFileSync(path.join(dir, 'broken-sheet.json'), '{ "id": ');
    expect(() => loadTemplates(dir)).toThrow(/not valid JSON/);
  });
});

describe('fitting text', () => {
  // Every character 0.5 pt wide at 1 pt: easy to reason about.
  const measure = (text: string) => text.length * 0.5;

  it('shrinks first, then wraps at the smallest size, then cuts the last line with "…"', () => {
    expect(fitText('abcdefghij', { w: 50, h: 30 }, 12, 6, measure)).toMatchObject({ size: 10, lines: ['abcdefghij'], wrapped: false });
    const wrapped = fitText('aaaa bbbb cccc dddd', { w: 30, h: 30 }, 12, 6, measure);
    expect(wrapped).toMatchObject({ size: 6, lines: ['aaaa bbbb', 'cccc dddd'], wrapped: true, truncated: false });
    const cut = fitText('aaaa bbbb cccc dddd eeee ffff', { w: 30, h: 15 }, 12, 6, measure);
    expect(cut.lines).toEqual(['aaaa bbbb', 'cccc dddd…']);
    expect(cut.truncated).toBe(true);
    for (const w of cut.widths) expect(w).toBeLessThanOrEqual(30);
  });

  it('never starts a line with a separator dot: the dot stays on the line before', () => {
    // 10 characters a line at 6 pt: "aaaa bbbb ·" (11) does not fit, so "bbbb ·" moves down whole.
    expect(fitText('aaaa bbbb · cc', { w: 30, h: 30 }, 12, 6, measure).lines).toEqual(['aaaa', 'bbbb · cc']);
  });
});

describe.each([...labelTemplates().values()].map((t) => [t.id, t] as const))('template %s', (_id, template) => {
  it('prints a QR code per label that opens that vessel or case', async () => {
    const order = [codes.v1, codes.v2, codes.v3, codes.c1, codes.c2];
    const file = await fetchPdf({
      template: template.id,
      vessels: [codes.v1, codes.v2, codes.v3].map((v) => v.id).join(','),
      cases: `${codes.c1.id},${codes.c2.id}`,
    });
    const info = await pdfInfo(file);
    expect(info.widthPt).toBeCloseTo(mm(template.page.width), 1);
    expect(info.heightPt).toBeCloseTo(mm(template.page.height), 1);
    const perPage = template.grid.columns * template.grid.rows;
    expect(info.pages).toBe(Math.ceil(order.length / perPage));
    // A sheet holds all five on page 1; a roll has one label per page.
    const pages = await rasterise(file, 1, perPage === 1 ? order.length : 1);
    const decoded = order.map((_, i) => (perPage === 1 ? decodeCell(pages[i]!, template, 0) : decodeCell(pages[0]!, template, i)));
    expect(decoded).toEqual(order.map((o) => urlOf(o.code)));
  });

  it('keeps a very long vessel and batch name inside their boxes', async () => {
    const reports: TextReport[] = [];
    const item = vesselLabel({
      id: codes.v2.id,
      code: codes.v2.code,
      name: 'WIDE CAPITAL LETTERS MAKE THE LONGEST VESSEL NAME WE ALLOW 60'.slice(0, 60),
      vesselKind: 'demijohn',
      capacityL: 5,
      batchName: 'Smoked pear, wildflower honey and long pepper metheglin for the midwinter feast'.slice(0, 80),
      batchKind: 'metheglin',
      startedOn: '2025-11-30',
      og: 1.13,
      lastSg: 1.02,
      unitSystem: 'metric',
    });
    await renderLabelsPdf(template, [item], { publicUrl: PUBLIC_URL, onText: (r) => reports.push(r) });
    const spec = new Map(template.layouts.vessel.fields.map((f) => [f.field, f]));
    expect(reports.map((r) => r.field).sort()).toEqual([...spec.keys()].sort());
    for (const r of reports) {
      for (const width of r.widths) expect(width).toBeLessThanOrEqual(r.box.w + 1e-6);
      expect(r.lines.length * r.lineHeight).toBeLessThanOrEqual(r.box.h + 1e-6);
      expect(r.size).toBeGreaterThanOrEqual(Math.min(spec.get(r.field as never)!.minPt, r.box.h / 1.2) - 1e-6);
    }
    const name = reports.find((r) => r.field === 'name')!;
    expect(name.truncated).toBe(true);
    expect(name.lines.at(-1)).toMatch(/…$/);
  });
});

describe('sheets', () => {
  const a4 = () => labelTemplates().get('a4-3x8-70x37')!;

  it('puts 25 vessels on two A4 sheets of 24', async () => {
    const batch = await makeBatch(ds, crew.cellar.id, { name: 'Elderflower cider', kind: 'traditional-mead', og: 1.11 });
    const many = [];
    for (let i = 0; i < 25; i++) many.push(await makeVessel(ds, crew.cellar.id, { name: `Jug ${i + 10}`, batch, capacityL: 4.5 }));
    const file = await fetchPdf({ template: 'a4-3x8-70x37', vessels: many.map((v) => v.id).join(',') });
    expect((await pdfInfo(file)).pages).toBe(2);
    const [, second] = await rasterise(file, 1, 2);
    expect(decodeCell(second!, a4(), 0)).toBe(urlOf(many[24]!.code));
    expect(decodeCell(second!, a4(), 1)).toBeNull();
  });

  it('skips the used labels of a partly used sheet', async () => {
    const file = await fetchPdf({ template: 'a4-3x8-70x37', vessels: `${codes.v1.id},${codes.v3.id}`, skip: 5 });
    const [page] = await rasterise(file, 1, 1);
    expect([0, 1, 2, 3, 4].map((cell) => decodeCell(page!, a4(), cell))).toEqual([null, null, null, null, null]);
    expect(decodeCell(page!, a4(), 5)).toBe(urlOf(codes.v1.code));
    expect(decodeCell(page!, a4(), 6)).toBe(urlOf(codes.v3.code));
  });
});

describe('what the labels say', () => {
  async function textOf(query: Record<string, string>) {
    const { stdout } = await run('pdftotext', ['-layout', await fetchPdf({ template: 'a4-3x8-70x37', ...query }), '-']);
    return stdout;
  }

  it('shows the batch, start, OG and the default (Balling) ABV estimate on a vessel label; "—" when unknown', async () => {
    const text = await textOf({ vessels: `${codes.v1.id},${codes.v2.id}` });
    const abv = abvBy(1.112, 1.01).toFixed(1);
    expect(text).toContain('Bramble Melomel');
    expect(text).toContain('Started 10 Jan 2026');
    expect(text).toContain('OG 1.112');
    expect(text).toMatch(new RegExp(`ABV\\s+${abv.replace('.', '\\.')} % \\(est\\., Balling\\)`));
    expect(text).toMatch(/ABV —/);
  });

  it('prints what does not change on a vessel label, and its contents only with the day they were printed', async () => {
    // Today in the cellar's zone, written by dayjs (not the code under test) the way labels write dates.
    const printedOn = dayjs(localDate(new Date(), crew.cellar.timeZone ?? 'UTC')).format('D MMM YYYY');
    const filled = await textOf({ vessels: codes.v1.id });
    expect(filled).toMatch(/Carboy · 23 L/);
    expect(filled).toContain(codes.v1.code);
    expect(filled).toContain(`Contents on ${printedOn}`);
    const empty = await textOf({ vessels: codes.v3.id });
    expect(empty).toContain('Jug 3');
    expect(empty).toContain(codes.v3.code);
    expect(empty).not.toMatch(/Empty|Contents on|Started|OG|ABV/);
  });

  it('says "Contains sulfites" only on cases of a lot with added sulfite', async () => {
    const sulfited = await textOf({ cases: codes.c1.id });
    expect(sulfited).toContain('Contains sulfites');
    expect(sulfited).toContain('Case 1 · 12 × 750 mL');
    expect(sulfited).toContain('Bottled 2 Feb 2026');
    const plain = await textOf({ cases: codes.plainCase.id });
    expect(plain).not.toContain('sulfites');
  });
});

describe('selections and refusals', () => {
  const count = async (query: Record<string, string | number>) => {
    const res = await hand.get(pdfUrl({ template: 'roll-62x32', ...query }));
    return res.status === 200 ? Number(res.headers['x-label-count']) : res.status;
  };

  it("prints a shelf, a lot's cases, a batch's vessels and lots", async () => {
    const { shelves } = await makeRack(ds, crew.cellar.id, 'Print rack', [6]);
    await placeDirectly(ds, crew.cellar.id, shelves[0]!.id, 2, { vesselId: codes.v3.id });
    await placeDirectly(ds, crew.cellar.id, shelves[0]!.id, 4, { caseId: codes.c2.id });
    expect(await count({ shelf: shelves[0]!.id })).toBe(2);
    expect(await count({ lotCases: codes.lot.id })).toBe(2);
    expect(await count({ lots: codes.lot.id })).toBe(1);
    expect(await count({ vessels: `${codes.v1.id},${codes.v1.id}`, cases: codes.c1.id })).toBe(2);
  });

  it('answers 400 for an unknown template, an empty selection, a bad id or a skip past the sheet', async () => {
    const unknown = await hand.get(pdfUrl({ template: 'no-such-size', vessels: codes.v1.id }));
    expect(unknown.status).toBe(400);
    expect(unknown.body.message).toMatch(/No label template "no-such-size"/);
    const empty = await hand.get(pdfUrl({ template: 'a4-3x8-70x37' }));
    expect(empty.status).toBe(400);
    expect(empty.body.message).toMatch(/Choose what to print/);
    expect((await hand.get(pdfUrl({ template: 'a4-3x8-70x37', vessels: 'not-an-id' }))).status).toBe(400);
    const skip = await hand.get(pdfUrl({ template: 'a4-3x8-70x37', vessels: codes.v1.id, skip: 24 }));
    expect(skip.status).toBe(400);
    expect(skip.body.message).toMatch(/skip at most 23/);
  });

  it('ignores ids of another cellar, and answers 404 when nothing is left', async () => {
    expect(await count({ vessels: `${codes.foreign.id},${codes.v1.id}` })).toBe(1);
    const res = await hand.get(pdfUrl({ template: 'a4-3x8-70x37', vessels: codes.foreign.id }));
    expect(res.status).toBe(404);
    expect(res.body.message).toMatch(/Nothing to print/);
  });

  it('lets a Guest print and a signed-out visitor nothing', async () => {
    expect((await guest.get(pdfUrl({ template: 'a4-3x8-70x37', vessels: codes.v1.id }))).status).toBe(200);
    const { default: request } = await import('supertest');
    expect((await request(app).get(pdfUrl({ template: 'a4-3x8-70x37', vessels: codes.v1.id }))).status).toBe(401);
  });

  it('offers vessels, lots with cases and batches to pick from, only of this cellar', async () => {
    const res = await guest.get(`/api/cellars/${crew.cellar.id}/labels/choices?q=bramble`);
    expect(res.status).toBe(200);
    expect(res.body.vessels.map((v: { id: string }) => v.id)).toEqual([codes.v1.id]);
    expect(res.body.lots[0]).toMatchObject({ id: codes.lot.id, batchName: 'Bramble Melomel' });
    expect(res.body.lots[0].cases.map((c: { id: string }) => c.id)).toEqual([codes.c1.id, codes.c2.id]);
    expect(res.body.batches[0].vesselIds).toEqual([codes.v1.id]);
    const all = await guest.get(`/api/cellars/${crew.cellar.id}/labels/choices`);
    expect(all.body.vessels.map((v: { id: string }) => v.id)).not.toContain(codes.foreign.id);
    // Where each vessel sits comes as data; the page words it.
    const vessels = labelChoicesSchema.parse(all.body).vessels;
    expect(vessels.find((v) => v.id === codes.v3.id)?.place).toEqual({ rackName: 'Print rack', shelfNumber: 1, slot: 2 });
    expect(vessels.find((v) => v.id === codes.v1.id)?.place).toBeNull();
  });
});
