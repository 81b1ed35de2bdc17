import { beforeEach, describe, expect, it } from 'vitest';
import { flushPromises } from '@vue/test-utils';
import { defineComponent, h } from 'vue';
import { filtersFromQuery, queryFromFilters, useBatchList } from '@/components/batches/useBatchList';
import { routeTo } from '@/router/locations';
import { fakeApi, type FakeAnswer, type FakeApi } from './support/fake-api';
import { BATCH_ID, CELLAR_ID, batchPage, batchSummary, signIn } from './support/fixtures';
import { mountInApp } from './support/mount-in-app';

const batchesPath = `/api/cellars/${CELLAR_ID}/batches`;

describe('the Batches list filters in the URL', () => {
  it('reads each filter from the query and falls back to the default for anything malformed', () => {
    expect(
      filtersFromQuery({
        q: 'oak',
        stage: 'secondary',
        kind: 'cyser',
        agedMonths: '6',
        needsRacking: 'true',
        sort: 'name',
        page: '2',
        pageSize: '50',
      }),
    ).toEqual({
      q: 'oak',
      stage: 'secondary',
      kind: 'cyser',
      agedMonths: 6,
      needsRacking: true,
      sort: 'name',
      page: 2,
      pageSize: 50,
    });
    expect(
      filtersFromQuery({ stage: 'fizzy', kind: 'lager', agedMonths: '1.5', needsRacking: 'yes', sort: 'random', page: '0', pageSize: '500' }),
    ).toEqual({
      q: '',
      stage: null,
      kind: null,
      agedMonths: null,
      needsRacking: false,
      sort: 'started-desc',
      page: 1,
      pageSize: 25,
    });
  });

  it('leaves defaults out of the URL and trims the search', () => {
    expect(queryFromFilters(filtersFromQuery({}))).toEqual({});
    expect(queryFromFilters({ ...filtersFromQuery({}), q: '  bramble ', kind: 'melomel', page: 3 })).toEqual({
      q: 'bramble',
      kind: 'melomel',
      page: '3',
    });
  });
});

describe('useBatchList', () => {
  let api: FakeApi;
  let list!: ReturnType<typeof useBatchList>;
  const Harness = defineComponent({
    setup() {
      list = useBatchList();
      return () => h('div');
    },
  });

  beforeEach(() => {
    api = fakeApi();
    signIn(api);
  });

  it('loads the page the URL asks for and exposes it', async () => {
    const page = batchPage([batchSummary(), batchSummary({ id: '2b3c4d5e-6f7a-4b8c-9d0e-1f2a3b4c5d6e', name: 'Quince cyser', kind: 'cyser' })]);
    api.on('GET', batchesPath, { body: page });
    await mountInApp(Harness, `/c/${CELLAR_ID}/batches?q=quince&page=2`);

    const calls = api.callsTo('GET', batchesPath);
    expect(calls).toHaveLength(1);
    expect(Object.fromEntries(calls[0].query)).toEqual({ q: 'quince', sort: 'started-desc', page: '2', pageSize: '25' });
    expect(list.result.value).toEqual(page);
    expect(list.loading.value).toBe(false);
    expect(list.error.value).toBeNull();
  });

  it('changes filters in the URL, back to page 1, and loads again', async () => {
    api.on('GET', batchesPath, { body: batchPage() });
    const { router } = await mountInApp(Harness, `/c/${CELLAR_ID}/batches?stage=primary&page=4`);

    list.update({ kind: 'melomel' });
    await flushPromises();
    expect(router.currentRoute.value.query).toEqual({ stage: 'primary', kind: 'melomel' });

    list.update({ page: 2 });
    await flushPromises();
    expect(router.currentRoute.value.query).toEqual({ stage: 'primary', kind: 'melomel', page: '2' });

    expect(api.callsTo('GET', batchesPath).map((c) => c.query.get('page'))).toEqual(['4', '1', '2']);
  });

  it('keeps the newest answer when an older, slower one arrives after it', async () => {
    const pending: ((a: FakeAnswer) => void)[] = [];
    api.on('GET', batchesPath, () => new Promise<FakeAnswer>((resolve) => pending.push(resolve)));
    await mountInApp(Harness, `/c/${CELLAR_ID}/batches`);
    list.update({ stage: 'secondary' });
    await flushPromises();
    expect(pending).toHaveLength(2);

    const newer = batchPage([batchSummary({ stage: 'secondary' })]);
    pending[1]({ body: newer });
    await flushPromises();
    pending[0]({ body: batchPage([batchSummary({ name: 'Stale answer' })]) });
    await flushPromises();

    expect(list.result.value).toEqual(newer);
    expect(list.loading.value).toBe(false);
  });

  it('shows the server’s message when the list cannot be loaded', async () => {
    api.on('GET', batchesPath, { status: 503, body: { error: 'unavailable', message: 'The database is not answering.' } });
    await mountInApp(Harness, `/c/${CELLAR_ID}/batches`);
    expect(list.error.value).toBe('The database is not answering.');
    expect(list.result.value).toBeNull();
    expect(list.loading.value).toBe(false);
  });

  it('stops following the URL once the user has left the Batches page', async () => {
    api.on('GET', batchesPath, { body: batchPage() });
    const { router } = await mountInApp(Harness, `/c/${CELLAR_ID}/batches`);
    api.on('GET', `${batchesPath}/${BATCH_ID}`, { status: 404, body: { error: 'not_found', message: 'No such batch.' } });
    await router.push(routeTo('batch', { cellarId: CELLAR_ID, batchId: BATCH_ID }, { stage: 'bottled' }));
    await flushPromises();
    expect(api.callsTo('GET', batchesPath)).toHaveLength(1);
  });
});
