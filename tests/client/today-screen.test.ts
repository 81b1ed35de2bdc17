import { afterEach, describe, expect, it, vi } from 'vitest';
import { flushPromises } from '@vue/test-utils';
import type { Today } from '@shared/schemas/today';
import AttentionList from '@/components/today/AttentionList.vue';
import FermentList from '@/components/today/FermentList.vue';
import ReadyVessels from '@/components/today/ReadyVessels.vue';
import VesselsPage from '@/pages/VesselsPage.vue';
import { fakeApi } from './support/fake-api';
import { CELLAR_ID, plannedTask, signIn } from './support/fixtures';
import { mountInApp, pick } from './support/mount-in-app';

const ferment = (id: string, name: string, state: Today['ferments'][number]['state']): Today['ferments'][number] => ({
  id,
  name,
  kind: 'traditional-mead',
  stage: 'primary',
  startedOn: '2026-11-01',
  og: 1.1,
  lastReading: { sg: 1.01, at: '2026-11-30T10:00:00Z' },
  state,
  vesselNames: ['Fermenter 1'],
});

afterEach(() => {
  document.body.innerHTML = '';
});

describe('Today', () => {
  it('never lists a finished batch under "Fermenting now", and uses the batch page’s words for states', async () => {
    signIn(fakeApi());
    const ferments = [
      ferment('0a1b2c3d-4e5f-4a6b-8c7d-8e9f0a1b2c3d', 'Working one', 'active'),
      ferment('1a1b2c3d-4e5f-4a6b-8c7d-8e9f0a1b2c3d', 'Steady one', 'finished'),
    ];
    await mountInApp(FermentList, `/c/${CELLAR_ID}/today`, { props: { ferments, cellarId: CELLAR_ID } });
    const fermenting = pick('[data-test=today-ferments]').textContent ?? '';
    const finished = pick('[data-test=today-finished]').textContent ?? '';
    expect(fermenting).toContain('Working one');
    expect(fermenting).not.toContain('Steady one');
    // The last reading and when it was taken, apart: "1.010 (3 days ago)", not "1.010 3 days ago".
    expect(fermenting).toMatch(/· 1\.010 \(.+ ago\)/);
    expect(finished).toContain('Steady one');
    // The Batch page's words (components/batches/fermentation-words.ts), not "Working" / "Done".
    expect(pick('[data-test=ferment-state-active]').textContent).toContain('Active');
    expect(pick('[data-test=ferment-state-finished]').textContent).toContain('Finished');
  });

  it('makes each free-and-sanitised size a link to the vessels of that size and state', async () => {
    signIn(fakeApi());
    await mountInApp(ReadyVessels, `/c/${CELLAR_ID}/today`, {
      props: { freeSanitised: [{ capacityL: 4.5, count: 2 }], cellarId: CELLAR_ID },
    });
    const tile = pick<HTMLAnchorElement>('[data-test="today-free-size-4.5"]');
    const href = new URL(tile.getAttribute('href') ?? '', 'http://cellar.test');
    expect(href.pathname).toBe(`/c/${CELLAR_ID}/vessels`);
    expect(href.searchParams.get('free')).toBe('true');
    expect(href.searchParams.get('cap')).toBe('4.5');
  });
});

describe('Today: needs a hand', () => {
  const due = (n: number) =>
    Array.from({ length: n }, (_, i) =>
      plannedTask('weekly-reading', `Reading ${i + 1}`, `2026-11-${String(20 + i).padStart(2, '0')}`, '2026-12-04', `primary.${i}`),
    );
  const mountWith = (items: ReturnType<typeof due>) =>
    mountInApp(AttentionList, `/c/${CELLAR_ID}/today`, {
      props: { needsRacking: [], additionsDue: [], cellarId: CELLAR_ID, tasks: { today: '2026-12-04', items }, canAct: true },
    });
  const titles = () =>
    [...document.querySelectorAll('[data-test=today-attention] [data-key] .q-item__label:first-child')].map((e) => e.textContent?.trim());

  it('shows the five most pressing tasks and links to the Tasks screen for the rest', async () => {
    signIn(fakeApi());
    await mountWith(due(8));
    expect(titles()).toEqual(['Reading 1', 'Reading 2', 'Reading 3', 'Reading 4', 'Reading 5']);
    const more = pick<HTMLAnchorElement>('[data-test=today-more-tasks]');
    expect(more.textContent).toContain('3 more due');
    expect(more.getAttribute('href')).toBe(`/c/${CELLAR_ID}/tasks`);
  });

  it('shows every task, and no link, when there are five or fewer', async () => {
    signIn(fakeApi());
    await mountWith(due(5));
    expect(titles()).toHaveLength(5);
    expect(document.querySelector('[data-test=today-more-tasks]')).toBeNull();
  });
});

describe('Vessels page', () => {
  it.each([
    ['?freeAndSanitised=true', { freeAndSanitised: 'true', capacityL: null }],
    ['?free=true&cap=4.5', { freeAndSanitised: 'true', capacityL: '4.5' }],
  ])('honours the filter in its address %s', async (query, expected) => {
    const api = fakeApi();
    signIn(api);
    api.on('GET', `/api/cellars/${CELLAR_ID}/vessels`, { body: { items: [], total: 0, page: 1, pageSize: 25 } });
    api.on('GET', `/api/cellars/${CELLAR_ID}/racks`, { body: [] });
    await mountInApp(VesselsPage, `/c/${CELLAR_ID}/vessels${query}`);
    await vi.waitFor(() => expect(api.callsTo('GET', `/api/cellars/${CELLAR_ID}/vessels`).length).toBeGreaterThan(0));
    await flushPromises();
    const sent = api.callsTo('GET', `/api/cellars/${CELLAR_ID}/vessels`).at(-1)!.query;
    expect(sent.get('freeAndSanitised')).toBe(expected.freeAndSanitised);
    expect(sent.get('capacityL')).toBe(expected.capacityL);
  });

  it.each([
    ['keeper', true],
    ['hand', false],
    ['guest', false],
  ] as const)('shows a %s the way to the plans (the Settings section that sets what is due): %s', async (role, offered) => {
    signIn(fakeApi(), role);
    await mountInApp(AttentionList, `/c/${CELLAR_ID}/today`, {
      props: { needsRacking: [], additionsDue: [], cellarId: CELLAR_ID, tasks: { today: '2026-12-04', items: [] } },
    });
    const link = document.querySelector('[data-test=today-plans-link]');
    expect(link?.getAttribute('href') ?? null).toBe(offered ? `/c/${CELLAR_ID}/settings#plans` : null);
  });
});
