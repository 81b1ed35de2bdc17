import { beforeEach, describe, expect, it } from 'vitest';
import { createPinia, setActivePinia } from 'pinia';
import { createMemoryHistory } from 'vue-router';
import { createAppRouter } from '@/router';
import { routeTo } from '@/router/locations';
import type { RouteName } from '@/router/routes';
import { fakeApi, type FakeApi } from './support/fake-api';
import { BATCH_ID, CELLAR_ID, signIn } from './support/fixtures';

// Every name of RouteParams: the compiler checks this list against it (a missing or extra
// name does not build), and the test checks the router knows each one.
const ALL_NAMES = {
  'sign-in': true,
  'forgot-password': true,
  'reset-password': true,
  invitation: true,
  'outgoing-mail': true,
  home: true,
  today: true,
  scan: true,
  batches: true,
  batch: true,
  'batch-family': true,
  vessels: true,
  vessel: true,
  bottles: true,
  'cellar-map': true,
  labels: true,
  tasks: true,
  calculators: true,
  settings: true,
  audit: true,
  'no-such-label': true,
  'bottle-card': true,
  'label-url': true,
  'not-found': true,
} satisfies Record<RouteName, true>;

describe('typed route names', () => {
  let api: FakeApi;
  beforeEach(() => {
    setActivePinia(createPinia());
    api = fakeApi();
  });

  it('has a route for every name the code may link to', () => {
    const router = createAppRouter(createMemoryHistory());
    const missing = (Object.keys(ALL_NAMES) as RouteName[]).filter((name) => !router.hasRoute(name));
    expect(missing).toEqual([]);
  });

  it('turns a name, its ids and a query into the page’s address', () => {
    const router = createAppRouter(createMemoryHistory());
    expect(router.resolve(routeTo('batch', { cellarId: CELLAR_ID, batchId: BATCH_ID })).fullPath).toBe(`/c/${CELLAR_ID}/batches/${BATCH_ID}`);
    expect(router.resolve(routeTo('bottles', { cellarId: CELLAR_ID }, { case: 'K7M2P9QX' })).fullPath).toBe(`/c/${CELLAR_ID}/bottles?case=K7M2P9QX`);
    expect(router.resolve(routeTo('home')).fullPath).toBe('/');
  });

  it('sends a signed-out visitor to sign in, remembering where they were going', async () => {
    api.on('GET', '/api/auth/me', { status: 401, body: { error: 'unauthorized', message: 'Sign in first.' } });
    const router = createAppRouter(createMemoryHistory());
    await router.push(`/c/${CELLAR_ID}/batches`);
    expect(router.currentRoute.value.name).toBe('sign-in');
    expect(router.currentRoute.value.query).toEqual({ next: `/c/${CELLAR_ID}/batches` });
  });

  it('answers a cellar the user is not in with Not found', async () => {
    signIn(api);
    const router = createAppRouter(createMemoryHistory());
    await router.push('/c/9e8d7c6b-5a4f-4e3d-8c2b-1a0f9e8d7c6b/today');
    expect(router.currentRoute.value.name).toBe('not-found');
    expect(router.currentRoute.value.path).toBe('/c/9e8d7c6b-5a4f-4e3d-8c2b-1a0f9e8d7c6b/today');
  });
});
