import { beforeAll, expect, it } from 'vitest';
import type { Page } from 'playwright-core';
import request from 'supertest';
import { memberActor } from '../../server/core/actor';
import { seedDemoRecords } from '../../server/seed/demo-cellar';
import { seedDemoTasks } from '../../server/seed/demo-tasks';
import { makeCellarWithCrew, setPublicCards, TEST_PASSWORD, type CellarCrew } from '../helpers/crew';
import { makeRack, placeDirectly } from '../helpers/places';
import { startRequest } from '../helpers/batches';
import { sanitisedVessel } from '../helpers/vessels';
import { describeInBrowser } from '../helpers/browser-app';
import {
  clientRouteNames,
  measureScreen,
  overflowAt,
  seriousAxeViolations,
  cutLabels,
  shoutedControls,
  MIN_FONT_PX,
  MIN_TARGET_PX,
} from '../helpers/a11y-audit';

/**
 * Every screen of the client, signed in as a Keeper (and the signed-out ones), at phone and
 * desktop width: no serious or critical axe-core violation, touch targets of at least 44 × 44 px,
 * no text under 12 px, and at 360 px nothing wider than the screen, with 64-character names.
 * A new route fails the first test until it is given a recipe below.
 */

/** The longest names a maker might type, on every list: 64 characters for a batch, the most allowed (60) for a vessel and a rack. */
const LONG_BATCH = 'Blackcurrant, elderflower and wildflower honey melomel, trial 2b';
const LONG_VESSEL = 'Tall narrow-necked glass demijohn from the old orchard shed';
const LONG_RACK = 'Steel shelving by the north wall of the cellar, under stairs';

interface World {
  crew: CellarCrew;
  cellarId: string;
  longBatchId: string;
  longVesselId: string;
  /** A batch split from another (the demo's split family), for the Compare view. */
  splitBatchId: string;
  vesselCode: string;
  caseCode: string;
}

interface Recipe {
  /** The address to open. */
  path: (w: World) => string;
  signedIn: boolean;
  /** The address the screen settles on, when it is not `path` (redirects). */
  settlesOn?: (w: World) => RegExp;
  /** Opens a dialog (or the like) once the screen has loaded. */
  open?: (page: Page) => Promise<void>;
  /** Requests answered 503 while the screen loads, for the screen a maker sees without them. */
  failing?: RegExp;
  /** A selector the screen must show once settled, so the state is really the one audited. */
  shows?: string;
}

const inCellar = (rest: string) => (w: World) => `/c/${w.cellarId}/${rest}`;

/** How to reach each route of src/router/routes.ts. A route missing here fails the first test. */
const ROUTE_RECIPES: Record<string, Recipe> = {
  'sign-in': { path: () => '/sign-in', signedIn: false },
  'forgot-password': { path: () => '/forgot-password', signedIn: false },
  'reset-password': { path: () => '/reset-password?token=not-a-real-token', signedIn: false },
  invitation: { path: () => '/invitation?token=not-a-real-token', signedIn: false },
  'no-such-label': { path: () => '/no-such-label', signedIn: false },
  'bottle-card': { path: (w) => `/card/${w.caseCode}`, signedIn: false },
  'not-found': { path: () => '/no/such/page', signedIn: false },
  home: { path: () => '/', signedIn: true, settlesOn: (w) => new RegExp(`/c/${w.cellarId}/today$`) },
  'label-url': { path: (w) => `/s/${w.vesselCode}`, signedIn: true, settlesOn: (w) => new RegExp(`/c/${w.cellarId}/vessels/${w.longVesselId}$`) },
  today: { path: inCellar('today'), signedIn: true },
  scan: { path: inCellar('scan'), signedIn: true },
  batches: { path: inCellar('batches'), signedIn: true },
  batch: { path: (w) => `/c/${w.cellarId}/batches/${w.longBatchId}`, signedIn: true },
  'batch-family': { path: (w) => `/c/${w.cellarId}/batches/${w.splitBatchId}/family`, signedIn: true },
  vessels: { path: inCellar('vessels'), signedIn: true },
  vessel: { path: (w) => `/c/${w.cellarId}/vessels/${w.longVesselId}`, signedIn: true },
  bottles: { path: inCellar('bottles'), signedIn: true },
  'cellar-map': { path: inCellar('map'), signedIn: true },
  labels: { path: inCellar('labels'), signedIn: true },
  tasks: { path: inCellar('tasks'), signedIn: true },
  calculators: { path: inCellar('calculators'), signedIn: true },
  settings: { path: inCellar('settings'), signedIn: true },
  'outgoing-mail': { path: inCellar('outgoing-mail'), signedIn: true },
  audit: { path: inCellar('audit'), signedIn: true },
};

async function openDialog(page: Page, button: string): Promise<void> {
  await page.click(`[data-test=${button}]`);
  await page.waitForSelector('.q-dialog .q-card');
}

/** Dialogs are screens too. */
const DIALOG_RECIPES: Record<string, Recipe> = {
  'Start a batch': { path: inCellar('batches'), signedIn: true, open: (page) => openDialog(page, 'start-batch') },
  'Log a reading': { path: (w) => `/c/${w.cellarId}/vessels/${w.longVesselId}`, signedIn: true, open: (page) => openDialog(page, 'action-reading') },
  'Rack out': { path: (w) => `/c/${w.cellarId}/vessels/${w.longVesselId}`, signedIn: true, open: (page) => openDialog(page, 'action-rack') },
  'New rack': { path: inCellar('map'), signedIn: true, open: (page) => openDialog(page, 'new-rack') },
};

/** Screens in a state the routes alone do not reach. */
const STATE_RECIPES: Record<string, Recipe> = {
  // Today then lists what the records alone tell (additions to take out, batches to rack).
  'today without its tasks': {
    path: inCellar('today'),
    signedIn: true,
    failing: /\/api\/cellars\/[^/]+\/tasks(\?|$)/,
    shows: '[data-test=today-attention] a[href*="/batches/"]',
  },
};

const SCREENS = [
  ...Object.entries(ROUTE_RECIPES),
  ...Object.entries(DIALOG_RECIPES).map(([name, r]) => [`${name} (dialog)`, r] as const),
  ...Object.entries(STATE_RECIPES),
];
const WIDTHS = [
  { width: 390, height: 844 },
  { width: 1280, height: 800 },
];

describeInBrowser('every screen is usable by everyone, in Chromium', (env) => {
  let world: World;
  let page: Page;
  let signedIn = false;

  beforeAll(async () => {
    const { ds, baseUrl, context } = env();
    const crew = await makeCellarWithCrew(ds, 'Accessibility cellar');
    const cellarId = crew.cellar.id;
    const people = { keeper: memberActor(cellarId, crew.keeper.id, 'keeper'), hand: memberActor(cellarId, crew.hand.id, 'hand') };
    await ds.transaction(async (tx) => {
      await seedDemoRecords(tx, people);
      await seedDemoTasks(tx, people);
    });
    await setPublicCards(ds, cellarId, true);

    const api = request.agent(baseUrl);
    expect((await api.post('/api/auth/sign-in').send({ email: crew.keeper.email, password: TEST_PASSWORD })).status).toBe(200);
    const vessel = await sanitisedVessel(ds, cellarId, { name: LONG_VESSEL, capacityL: 23 });
    const started = await api.post(`/api/cellars/${cellarId}/batches`).send(startRequest([{ vessel, volumeL: 20 }], { name: LONG_BATCH }));
    expect(started.status, JSON.stringify(started.body)).toBe(201);
    const longBatchId: string = started.body.batch.id;
    const tasted = await api
      .post(`/api/cellars/${cellarId}/batches/${longBatchId}/tastings`)
      .send({ appearance: 'Hazy purple', aroma: 'Blackcurrant leaf', flavour: 'Sharp, young' });
    expect(tasted.status, JSON.stringify(tasted.body)).toBe(201);
    const { shelves } = await makeRack(ds, cellarId, LONG_RACK, [4, 4]);
    await placeDirectly(ds, cellarId, shelves[0]!.id, 1, { vesselId: vessel.id });
    const [bottleCase] = await ds.query(`SELECT c.code FROM bottle_cases c JOIN bottle_lots l ON l.id = c.lot_id WHERE l.cellar_id = $1 LIMIT 1`, [
      cellarId,
    ]);
    const [split] = await ds.query(
      `SELECT p.child_id AS id FROM batch_parents p JOIN batches b ON b.id = p.child_id WHERE b.cellar_id = $1 LIMIT 1`,
      [cellarId],
    );
    world = { crew, cellarId, longBatchId, longVesselId: vessel.id, splitBatchId: split.id, vesselCode: vessel.code, caseCode: bottleCase.code };

    page = await context.newPage();
  });

  async function session(wanted: boolean): Promise<void> {
    if (wanted === signedIn) return;
    const { baseUrl, context } = env();
    await context.clearCookies();
    if (wanted) {
      await page.goto(`${baseUrl}/sign-in`);
      await page.fill('[data-test=email]', world.crew.keeper.email);
      await page.fill('[data-test=password]', TEST_PASSWORD);
      await page.click('[data-test=sign-in]');
      await page.waitForURL(/\/c\/[^/]+\/today$/);
    }
    signedIn = wanted;
  }

  /** Opens the screen and waits until it has settled (data loaded, transitions done). */
  async function visit(recipe: Recipe): Promise<void> {
    const { baseUrl } = env();
    await session(recipe.signedIn);
    await page.unrouteAll();
    if (recipe.failing) await page.route(recipe.failing, (route) => route.fulfill({ status: 503, json: { error: 'Unavailable in this test' } }));
    await page.goto(`${baseUrl}${recipe.path(world)}`);
    await page.waitForLoadState('networkidle');
    const expected =
      recipe.settlesOn?.(world) ??
      new RegExp(
        `${recipe
          .path(world)
          .split('?')[0]!
          .replace(/[.*+?^${}()|[\]\\]/g, '\\$&')}(\\?.*)?$`,
      );
    await page.waitForURL(expected);
    await page.waitForLoadState('networkidle');
    if (recipe.open) await recipe.open(page);
    if (recipe.shows) await page.waitForSelector(recipe.shows, { timeout: 5_000 });
    await page.waitForTimeout(450);
  }

  it('has a visit recipe for every route of the client router', () => {
    const missing = clientRouteNames().filter((name) => !(name in ROUTE_RECIPES));
    expect(
      missing,
      `route(s) ${missing.join(', ')} of src/router/routes.ts have no visit recipe: add one to ROUTE_RECIPES in tests/e2e/accessibility.test.ts`,
    ).toEqual([]);
  });

  for (const size of WIDTHS) {
    for (const [name, recipe] of SCREENS) {
      it(`${name} at ${size.width} px: no serious axe violation, targets ≥ ${MIN_TARGET_PX} px, text ≥ ${MIN_FONT_PX} px`, async () => {
        await page.setViewportSize(size);
        await visit(recipe);
        const violations = await seriousAxeViolations(page);
        const measures = await measureScreen(page);
        const report = [
          ...violations.map((v) => `axe ${v.impact} ${v.rule}: ${v.help}\n    ${v.nodes.join('\n    ')}`),
          ...measures.smallTargets.map((t) => `target ${t.width} × ${t.height} px: ${t.what}`),
          ...measures.smallText.map((t) => `text ${t.px} px: ${t.what}`),
        ];
        console.info(
          `[a11y] ${name} @${size.width}: axe serious/critical ${violations.reduce((n, v) => n + v.nodes.length, 0)} nodes; smallest target ${measures.smallestTarget ? `${measures.smallestTarget.width}×${measures.smallestTarget.height} ${measures.smallestTarget.what}` : '-'}; smallest font ${measures.smallestFontPx ?? '-'} px; inline links ${measures.inlineLinks.length}`,
        );
        expect(report, `${name} at ${size.width} px:\n${report.join('\n')}`).toEqual([]);
      }, 60_000);
    }
  }

  for (const [name, recipe] of SCREENS) {
    it(`${name} at 360 px: nothing wider than the screen, bottom bar inside it, buttons in sentence case, labels whole`, async () => {
      await page.setViewportSize({ width: 360, height: 760 });
      await visit(recipe);
      const box = await overflowAt(page);
      expect(box.scrollWidth, `${name}: the page is ${box.scrollWidth} px wide on a 360 px screen`).toBeLessThanOrEqual(360);
      if (recipe.signedIn) {
        expect(box.bottomBar, `${name}: no bottom bar`).not.toBeNull();
        expect(box.bottomBar!.left).toBeGreaterThanOrEqual(0);
        expect(box.bottomBar!.right).toBeLessThanOrEqual(360);
        expect(box.bottomBar!.bottom).toBeLessThanOrEqual(box.viewportHeight);
      }
      // "Empty this vessel", never "EMPTY THIS VESSEL": labels read as written (src/css/app.css).
      expect(await shoutedControls(page), `${name}: buttons shown in capitals`).toEqual([]);
      expect(await cutLabels(page), `${name}: field labels cut short`).toEqual([]);
    }, 60_000);
  }
});
