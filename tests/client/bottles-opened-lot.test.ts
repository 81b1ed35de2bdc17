import { afterEach, describe, expect, it, vi } from 'vitest';
import { flushPromises } from '@vue/test-utils';
import { bottleLotSchema, caseDetailSchema, lotDetailSchema, type BottleLot } from '@shared/schemas/bottles';
import BottlesPage from '@/pages/BottlesPage.vue';
import { fakeApi, type FakeApi } from './support/fake-api';
import { BATCH_ID, CELLAR_ID, signIn } from './support/fixtures';
import { mountInApp } from './support/mount-in-app';

const OLD_LOT_ID = '4a5b6c7d-8e9f-4a0b-8c1d-2e3f4a5b6c7d';
const OLD_CASE_ID = '5b6c7d8e-9f0a-4b1c-8d2e-3f4a5b6c7d8e';
const lotsPath = `/api/cellars/${CELLAR_ID}/lots`;

/** A lot as the API sends it, checked against the shared schema. */
function lot(n: number, overrides: Partial<BottleLot> = {}): BottleLot {
  const id = `00000000-0000-4000-8000-${String(n).padStart(12, '0')}`;
  return bottleLotSchema.parse({
    id,
    code: `LOT${String(n).padStart(5, '0')}`,
    batchId: BATCH_ID,
    batchName: `Spring cider ${n}`,
    batchKind: 'cider',
    bottledOn: '2026-10-01',
    bottleMl: 750,
    bottleCount: 12,
    bottlesLeft: 12,
    closure: 'cork',
    carbonation: 'still',
    sulfiteAdded: false,
    abvEstimate: 6,
    note: '',
    cases: [],
    ...overrides,
  });
}

// Last year's lot, older than a whole page of newer ones: the Bottles page's first page does not hold it.
const oldLot = lot(999, {
  id: OLD_LOT_ID,
  code: 'OLDLOT01',
  batchName: 'Quince perry',
  bottledOn: '2025-09-14',
  cases: [{ id: OLD_CASE_ID, code: 'OLDCASE1', lotId: OLD_LOT_ID, number: 2, bottlesInitial: 12, bottlesLeft: 7, place: null, version: 3 }],
});

function cellarWithManyLots(): FakeApi {
  const api = fakeApi();
  signIn(api);
  api.on('GET', lotsPath, ({ query }) => {
    const items = query.get('q') === 'Quince perry' ? [oldLot] : Array.from({ length: 20 }, (_, i) => lot(i + 1));
    return { body: { items, total: query.get('q') ? items.length : 40, page: 1, pageSize: 20 } };
  });
  api.on('GET', `${lotsPath}/${OLD_LOT_ID}`, { body: lotDetailSchema.parse({ ...oldLot, departures: [] }) });
  api.on('GET', `/api/cellars/${CELLAR_ID}/cases/${OLD_CASE_ID}`, {
    body: caseDetailSchema.parse({ ...oldLot.cases[0], lot: { id: OLD_LOT_ID, batchName: 'Quince perry' } }),
  });
  return api;
}

afterEach(() => {
  vi.restoreAllMocks();
  document.body.innerHTML = '';
});

describe('the Bottles page opened on one lot or case (a scanned label)', () => {
  it('finds a scanned lot that is not on the first page, and opens it', async () => {
    const api = cellarWithManyLots();
    const { router } = await mountInApp(BottlesPage, `/c/${CELLAR_ID}/bottles?lot=${OLD_LOT_ID}`);
    await flushPromises();
    expect(router.currentRoute.value.query).toEqual({ q: 'Quince perry', all: 'true', lot: OLD_LOT_ID });
    const lists = api.callsTo('GET', lotsPath);
    // One list asked for, already narrowed to the lot's batch (in stock or not): never the page without it.
    expect(lists.map((c) => [c.query.get('q'), c.query.get('inStock')])).toEqual([['Quince perry', null]]);
    expect(document.querySelector('[data-test=lot-OLDLOT01]')?.classList.contains('q-expansion-item--expanded')).toBe(true);
  });

  it('finds a scanned case’s lot the same way, with the case picked out and brought into view', async () => {
    cellarWithManyLots();
    const scrolled: Element[] = [];
    vi.spyOn(HTMLElement.prototype, 'scrollIntoView').mockImplementation(function (this: HTMLElement) {
      scrolled.push(this);
    });
    const { router } = await mountInApp(BottlesPage, `/c/${CELLAR_ID}/bottles?case=${OLD_CASE_ID}`);
    await flushPromises();
    expect(router.currentRoute.value.query).toEqual({ q: 'Quince perry', all: 'true', lot: OLD_LOT_ID, case: OLD_CASE_ID });
    expect(document.querySelector('[data-test=lot-OLDLOT01]')?.classList.contains('q-expansion-item--expanded')).toBe(true);
    const picked = document.querySelector('[data-test=case-2]');
    expect(picked?.classList.contains('case-card--focus')).toBe(true);
    expect(scrolled).toContain(picked);
  });

  it('leaves a search the person typed as it is', async () => {
    const api = cellarWithManyLots();
    const { router } = await mountInApp(BottlesPage, `/c/${CELLAR_ID}/bottles?q=Spring`);
    await flushPromises();
    expect(router.currentRoute.value.query).toEqual({ q: 'Spring' });
    expect(api.callsTo('GET', lotsPath).map((c) => c.query.get('q'))).toEqual(['Spring']);
  });
});
