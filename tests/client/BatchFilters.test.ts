import { beforeEach, describe, expect, it, vi } from 'vitest';
import { flushPromises } from '@vue/test-utils';
import BatchFilters from '@/components/batches/BatchFilters.vue';
import { filtersFromQuery } from '@/components/batches/useBatchList';
import BatchesPage from '@/pages/BatchesPage.vue';
import { fakeApi, type FakeApi } from './support/fake-api';
import { CELLAR_ID, batchPage, signIn } from './support/fixtures';
import { chooseOption, mountInApp, pick } from './support/mount-in-app';

const batchesPath = `/api/cellars/${CELLAR_ID}/batches`;

describe('BatchFilters on its own', () => {
  beforeEach(() => signIn(fakeApi()));

  async function mountFilters(query: Record<string, string> = {}) {
    const { wrapper } = await mountInApp(BatchFilters, `/c/${CELLAR_ID}/tasks`, { props: { filters: filtersFromQuery(query) } });
    return wrapper;
  }

  it('emits the chosen stage', async () => {
    const wrapper = await mountFilters();
    await chooseOption('[data-test=batch-filter-stage]', 'Secondary');
    expect(wrapper.emitted('change')).toEqual([[{ stage: 'secondary' }]]);
  });

  it('emits "any kind" as null', async () => {
    const wrapper = await mountFilters({ kind: 'cyser' });
    await chooseOption('[data-test=batch-filter-kind]', 'Any kind');
    expect(wrapper.emitted('change')).toEqual([[{ kind: null }]]);
  });

  it('emits the age in months and the order', async () => {
    const wrapper = await mountFilters();
    await chooseOption('[data-test=batch-filter-aged]', 'Aged 6 months or more');
    await chooseOption('[data-test=batch-sort]', 'By name');
    expect(wrapper.emitted('change')).toEqual([[{ agedMonths: 6 }], [{ sort: 'name' }]]);
  });

  it('emits "needs racking" when the toggle is switched on', async () => {
    const wrapper = await mountFilters();
    pick('[data-test=batch-filter-needs-racking]').click();
    await flushPromises();
    expect(wrapper.emitted('change')).toEqual([[{ needsRacking: true }]]);
  });

  it('emits the search text once typing pauses', async () => {
    const wrapper = await mountFilters();
    // Typing fires `input`; `change` would only come on leaving the field.
    const search = pick<HTMLInputElement>('[data-test=batch-search]');
    search.value = 'bramble';
    search.dispatchEvent(new Event('input', { bubbles: true }));
    await flushPromises();
    // The search waits 300 ms after the last key before asking the server.
    expect(wrapper.emitted('change')).toBeUndefined();
    await vi.waitFor(() => expect(wrapper.emitted('change')).toEqual([[{ q: 'bramble' }]]), { timeout: 1000 });
  });

  it('offers Clear only while a filter narrows the list, and Clear resets every filter but the order', async () => {
    expect((await mountFilters()).find('[data-test=batch-filters-clear]').exists()).toBe(false);
    const wrapper = await mountFilters({ stage: 'secondary', needsRacking: 'true', sort: 'name' });
    await wrapper.get('[data-test=batch-filters-clear]').trigger('click');
    expect(wrapper.emitted('change')).toEqual([[{ q: '', stage: null, kind: null, agedMonths: null, needsRacking: false }]]);
  });
});

describe('BatchFilters on the Batches page', () => {
  let api: FakeApi;

  beforeEach(() => {
    api = fakeApi();
    signIn(api);
    api.on('GET', batchesPath, { body: batchPage() });
  });

  it('puts a chosen filter into the route query and asks the server for that filter', async () => {
    const { router } = await mountInApp(BatchesPage, `/c/${CELLAR_ID}/batches?page=3`);
    expect(api.callsTo('GET', batchesPath)).toHaveLength(1);

    await chooseOption('[data-test=batch-filter-stage]', 'Bulk ageing');
    await flushPromises();

    // A new filter starts again from page 1, which the URL leaves out.
    expect(router.currentRoute.value.query).toEqual({ stage: 'bulk-ageing' });
    const lists = api.callsTo('GET', batchesPath);
    expect(lists).toHaveLength(2);
    expect(Object.fromEntries(lists[1].query)).toEqual({ stage: 'bulk-ageing', sort: 'started-desc', page: '1', pageSize: '25' });
  });

  it('reads its filters from the route query it was opened with', async () => {
    await mountInApp(BatchesPage, `/c/${CELLAR_ID}/batches?kind=cyser&needsRacking=true`);
    expect(pick('[data-test=batch-filter-kind]').closest('.q-field')?.textContent).toContain('Cyser (apple mead)');
    expect(Object.fromEntries(api.callsTo('GET', batchesPath)[0].query)).toEqual({
      kind: 'cyser',
      needsRacking: 'true',
      sort: 'started-desc',
      page: '1',
      pageSize: '25',
    });
  });
});
