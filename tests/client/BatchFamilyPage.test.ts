import { afterEach, describe, expect, it, vi } from 'vitest';
import { flushPromises } from '@vue/test-utils';
import { defineComponent, h, type PropType } from 'vue';
import type { JournalEntry } from '@shared/schemas/journal';
import BatchFamilyPage from '@/pages/BatchFamilyPage.vue';
import { fakeApi } from './support/fake-api';
import { BATCH_ID, CELLAR_ID, batchDetail, signIn } from './support/fixtures';
import { mountInApp, pick } from './support/mount-in-app';

// The chart is drawn on a canvas, which happy-dom does not have: a stand-in shows what it was given.
vi.mock('@/components/batches/GravityChart.vue', () => ({
  __esModule: true,
  default: defineComponent({
    props: { overlay: { type: Array as PropType<{ label: string; readings: unknown[] }[]>, default: () => [] } },
    setup: (props) => () => h('div', { 'data-test': 'chart-stand-in' }, props.overlay.map((s) => `${s.label}:${s.readings.length}`).join('|')),
  }),
}));

const CHILD_ID = '9b8a7c6d-5e4f-4a3b-8c2d-1e0f9a8b7c6d';
const AUTHOR = { id: '0f1e2d3c-4b5a-4968-8776-655443322110', name: 'Wren Quillfield' };
let n = 0;
function entry(batchId: string, occurredAt: string, payload: JournalEntry['payload']): JournalEntry {
  n += 1;
  const id = `00000000-0000-4000-8000-${String(n).padStart(12, '0')}`;
  return { id, batchId, occurredAt, recordedAt: occurredAt, author: AUTHOR, amendsEntryId: null, amendedBy: [], payload };
}
const reading = (batchId: string, at: string, sg: number, inheritedFrom?: { batchId: string; name: string }) => ({
  entryId: `10000000-0000-4000-8000-${String((n += 1)).padStart(12, '0')}`,
  at,
  sg,
  correctedSg: sg,
  temperatureC: null,
  ph: null,
  ...(inheritedFrom ? { inheritedFrom } : {}),
});

/** A must started 1 Feb 2026 and a half split off on 3 Mar 2026 for oak; tasted side by side in May. */
function family() {
  const parent = batchDetail({
    name: 'Hedgerow melomel',
    readings: [reading(BATCH_ID, '2026-02-10T10:00:00.000Z', 1.05), reading(BATCH_ID, '2026-02-28T10:00:00.000Z', 1.0)],
    children: [{ id: CHILD_ID, name: 'Hedgerow on oak' }],
    journal: [
      entry(BATCH_ID, '2026-05-02T18:00:00.000Z', { kind: 'tasted', appearance: '', aroma: 'Bramble', flavour: 'Bright', score: 5 }),
      entry(BATCH_ID, '2026-03-03T10:00:00.000Z', { kind: 'split', childBatchId: CHILD_ID, childName: 'Hedgerow on oak', vessels: [] }),
    ],
  });
  const inherited = { batchId: BATCH_ID, name: 'Hedgerow melomel' };
  const child = batchDetail({
    id: CHILD_ID,
    name: 'Hedgerow on oak',
    parents: [{ id: BATCH_ID, name: 'Hedgerow melomel', volumeL: 10 }],
    ownSince: '2026-03-03T10:00:00.000Z',
    vessels: [],
    vesselCount: 0,
    readings: [reading(BATCH_ID, '2026-02-10T10:00:00.000Z', 1.05, inherited), reading(BATCH_ID, '2026-02-28T10:00:00.000Z', 1.0, inherited)],
    journal: [
      entry(CHILD_ID, '2026-05-03T18:00:00.000Z', { kind: 'tasted', appearance: '', aroma: 'Vanilla, toast', flavour: 'Round', score: 6 }),
      entry(CHILD_ID, '2026-03-03T10:05:00.000Z', {
        kind: 'addition',
        category: 'oak',
        name: 'Oak cubes',
        amount: 10,
        unit: 'g',
        vesselId: null,
        removeOn: null,
      }),
    ],
  });
  return { batchId: BATCH_ID, members: [parent, child], truncated: false };
}

afterEach(() => {
  document.body.innerHTML = '';
});

describe('the Compare view', () => {
  it('sets the family side by side: figures, curves, what was done by age, tastings at the same age', async () => {
    const api = fakeApi();
    signIn(api);
    api.on('GET', `/api/cellars/${CELLAR_ID}/batches/${BATCH_ID}/family`, { body: family() });
    await mountInApp(BatchFamilyPage, `/c/${CELLAR_ID}/batches/${BATCH_ID}/family`);
    await vi.waitFor(() => pick('[data-test=family-figures]'));
    await flushPromises();

    expect(pick('[data-test=family-title]').textContent).toContain('Hedgerow melomel');
    const figures = pick('[data-test=family-figures]').textContent ?? '';
    expect(figures).toContain('The must');
    expect(figures).toContain('Split from Hedgerow melomel on 3 Mar 2026');
    // Both read 1.000 now: the split's figures follow the must's readings before the split.
    expect(figures.match(/1\.000/g)?.length).toBeGreaterThanOrEqual(2);

    await vi.waitFor(() => pick('[data-test=chart-stand-in]'));
    expect(pick('[data-test=chart-stand-in]').textContent).toBe('Hedgerow melomel:2|Hedgerow on oak:2');

    // The oak went into the split on day 30 of the must (1 Feb → 3 Mar), in the split's column only.
    const work = [...document.querySelectorAll('[data-test=family-work] tbody tr')].map((tr) =>
      [...tr.children].map((c) => c.textContent?.replace(/\s+/g, ' ').trim()),
    );
    const day30 = work.find((cells) => cells[0] === 'Day 30')!;
    expect(day30[1]).toContain('Split');
    expect(day30[2]).toContain('Oak cubes');

    // Tasted on days 90 and 91: one row, each in its own words of our scale.
    const tastings = [...document.querySelectorAll('[data-test=family-tastings] tbody tr')].map((tr) => tr.textContent?.replace(/\s+/g, ' ') ?? '');
    expect(tastings).toHaveLength(1);
    expect(tastings[0]).toContain('Days 90–119');
    expect(tastings[0]).toContain('5 · Agreeable');
    expect(tastings[0]).toContain('6 · Fine');
  });

  it('links back to the batch and offers to print', async () => {
    const api = fakeApi();
    signIn(api);
    api.on('GET', `/api/cellars/${CELLAR_ID}/batches/${BATCH_ID}/family`, { body: family() });
    await mountInApp(BatchFamilyPage, `/c/${CELLAR_ID}/batches/${BATCH_ID}/family`);
    await vi.waitFor(() => pick('[data-test=family-print]'));
    const print = vi.fn();
    window.print = print;
    pick('[data-test=family-print]').click();
    expect(print).toHaveBeenCalledTimes(1);
    expect(pick('[data-test=back-to-batch]').getAttribute('href')).toBe(`/c/${CELLAR_ID}/batches/${BATCH_ID}`);
  });
});
