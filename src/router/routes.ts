import type { RouteRecordRaw } from 'vue-router';

/** The path parameters of a page inside a cellar (`/c/:cellarId/…`). */
type InCellar<Extra = object> = { cellarId: string } & Extra;
type NoParams = Record<string, never>;

/**
 * Every route name with the path parameters it needs, so links and pushes (through `routeTo`,
 * router/locations.ts) are checked by the compiler: a wrong name or a missing id does not build.
 */
export interface RouteParams {
  'sign-in': NoParams;
  'forgot-password': NoParams;
  'reset-password': NoParams;
  invitation: NoParams;
  'outgoing-mail': InCellar;
  home: NoParams;
  today: InCellar;
  scan: InCellar;
  batches: InCellar;
  batch: InCellar<{ batchId: string }>;
  'batch-family': InCellar<{ batchId: string }>;
  vessels: InCellar;
  vessel: InCellar<{ vesselId: string }>;
  bottles: InCellar;
  'cellar-map': InCellar;
  labels: InCellar;
  tasks: InCellar;
  calculators: InCellar;
  settings: InCellar;
  audit: InCellar;
  'no-such-label': NoParams;
  'bottle-card': { code: string };
  'label-url': { code: string };
  'not-found': { pathMatch: string[] };
}
export type RouteName = keyof RouteParams;

/** The screens of a cellar that need nothing but the cellar's id (the menu's screens, the lists). */
export type CellarScreenName = {
  [N in RouteName]: RouteParams[N] extends InCellar ? (InCellar extends RouteParams[N] ? N : never) : never;
}[RouteName];

/** A route record whose name (and its children's) is one of RouteName. */
type NamedRoute = RouteRecordRaw & { name?: RouteName; children?: NamedRoute[] };

declare module 'vue-router' {
  interface RouteMeta {
    /** Reachable without signing in. */
    public?: boolean;
    /** Title shown in the header and the browser tab. */
    title?: string;
  }
}

export const routes: NamedRoute[] = [
  { path: '/sign-in', name: 'sign-in', component: () => import('@/pages/SignInPage.vue'), meta: { public: true, title: 'Sign in' } },
  // Reached from mailed links (server/accounts/): reset a password, answer an invitation.
  {
    path: '/forgot-password',
    name: 'forgot-password',
    component: () => import('@/pages/ForgotPasswordPage.vue'),
    meta: { public: true, title: 'Forgot password' },
  },
  {
    path: '/reset-password',
    name: 'reset-password',
    component: () => import('@/pages/ResetPasswordPage.vue'),
    meta: { public: true, title: 'New password' },
  },
  { path: '/invitation', name: 'invitation', component: () => import('@/pages/InvitationPage.vue'), meta: { public: true, title: 'Invitation' } },
  { path: '/', name: 'home', component: () => import('@/pages/HomeRedirect.vue') },
  {
    path: '/c/:cellarId',
    component: () => import('@/layouts/MainLayout.vue'),
    children: [
      { path: '', redirect: { name: 'today' satisfies RouteName } },
      { path: 'today', name: 'today', component: () => import('@/pages/TodayPage.vue'), meta: { title: 'Today' } },
      { path: 'scan', name: 'scan', component: () => import('@/pages/ScanPage.vue'), meta: { title: 'Scan' } },
      { path: 'batches', name: 'batches', component: () => import('@/pages/BatchesPage.vue'), meta: { title: 'Batches' } },
      { path: 'batches/:batchId', name: 'batch', component: () => import('@/pages/BatchPage.vue'), meta: { title: 'Batch' } },
      { path: 'batches/:batchId/family', name: 'batch-family', component: () => import('@/pages/BatchFamilyPage.vue'), meta: { title: 'Compare' } },
      { path: 'vessels', name: 'vessels', component: () => import('@/pages/VesselsPage.vue'), meta: { title: 'Vessels' } },
      {
        path: 'vessels/:vesselId',
        name: 'vessel',
        component: () => import('@/pages/VesselPage.vue'),
        meta: { title: 'Vessel' },
        // The record with the page's code, so the page's first paint shows it (a scanned label's path).
        beforeEnter: async (to) =>
          (await import('@/components/vessels/vessel-prefetch')).prefetchVessel(String(to.params.cellarId), String(to.params.vesselId)),
      },
      { path: 'bottles', name: 'bottles', component: () => import('@/pages/BottlesPage.vue'), meta: { title: 'Bottles' } },
      { path: 'map', name: 'cellar-map', component: () => import('@/pages/CellarMapPage.vue'), meta: { title: 'Cellar map' } },
      { path: 'labels', name: 'labels', component: () => import('@/pages/LabelsPage.vue'), meta: { title: 'Labels' } },
      { path: 'tasks', name: 'tasks', component: () => import('@/pages/TasksPage.vue'), meta: { title: 'Tasks' } },
      { path: 'calculators', name: 'calculators', component: () => import('@/pages/CalculatorsPage.vue'), meta: { title: 'Calculators' } },
      { path: 'settings', name: 'settings', component: () => import('@/pages/SettingsPage.vue'), meta: { title: 'Settings' } },
      { path: 'outgoing-mail', name: 'outgoing-mail', component: () => import('@/pages/OutgoingMailPage.vue'), meta: { title: 'Outgoing mail' } },
      { path: 'audit', name: 'audit', component: () => import('@/pages/AuditPage.vue'), meta: { title: 'Audit' } },
    ],
  },
  // Where label URLs (/s/:code, served by the API) lead when they open nothing, or a public bottle card.
  {
    path: '/no-such-label',
    name: 'no-such-label',
    component: () => import('@/pages/NoSuchLabelPage.vue'),
    meta: { public: true, title: 'No such label' },
  },
  {
    // A printed label URL reached inside the app (e.g. after signing in with ?next=/s/…): the server decides.
    path: '/s/:code',
    name: 'label-url',
    component: () => import('@/pages/NoSuchLabelPage.vue'),
    meta: { public: true },
    // Without signal, the record kept on this phone (src/offline/label-without-signal.ts).
    beforeEnter: async (to) => (await import('@/offline/label-without-signal')).openLabelUrl(String(to.params.code), to.fullPath),
  },
  { path: '/card/:code', name: 'bottle-card', component: () => import('@/pages/BottleCardPage.vue'), meta: { public: true, title: 'Bottle card' } },
  { path: '/:pathMatch(.*)*', name: 'not-found', component: () => import('@/pages/NotFoundPage.vue'), meta: { public: true, title: 'Not found' } },
];
