import { beforeAll, expect, it } from 'vitest';
import type { Page, Request } from 'playwright-core';
import { brandColours } from '../../shared/palette';
import { rackBatch } from '../../server/batches/racking.service';
import { inTransaction } from '../../server/core/unit-of-work';
import { makeBatch } from '../helpers/batches';
import { contextOf, makeCellarWithCrew, TEST_PASSWORD, type CellarCrew } from '../helpers/crew';
import { addJournalEntry } from '../helpers/journal';
import { fillVessel, makeVessel, sanitisedVessel } from '../helpers/vessels';
import { describeInBrowser, signInThroughForm } from '../helpers/browser-app';
import { logReadingThroughDialog } from '../helpers/browser-steps';

/** A queued write as the page keeps it in IndexedDB (src/offline/queued-write.ts). */
interface KeptWrite {
  id: string;
  url: string;
  method: string;
  body: Record<string, unknown>;
  madeAt: string;
  problem: { status: number; message: string } | null;
}

interface Reading {
  entryId: string;
  at: string;
  sg: number;
}

describeInBrowser(
  'Offline: installable app, writes kept without signal and sent once, in Chromium',
  (env) => {
    let crew: CellarCrew;

    beforeAll(async () => {
      crew = await makeCellarWithCrew(env().ds, 'Offline cellar');
    });

    /** A batch of its own in one glass carboy, as a start would leave it. */
    async function batchInCarboy(name: string): Promise<{ batchId: string; vesselId: string; code: string }> {
      const { ds } = env();
      const batch = await makeBatch(ds, crew.cellar.id, { name, kind: 'melomel', startedOn: '2026-01-10' });
      const vessel = await makeVessel(ds, crew.cellar.id, { name: `${name} carboy`, material: 'glass', capacityL: 23 });
      await fillVessel(ds, vessel.id, batch.id, 20);
      await addJournalEntry(ds, crew.cellar.id, batch.id, {
        kind: 'started',
        volumeL: 20,
        og: 1.1,
        vessels: [{ vesselId: vessel.id, vesselName: vessel.name, volumeL: 20 }],
        parents: [],
        override: null,
      });
      return { batchId: batch.id, vesselId: vessel.id, code: vessel.code };
    }

    /** Signs the Hand in and waits until the service worker controls the page. */
    async function signedInPage(): Promise<Page> {
      const { baseUrl, context } = env();
      const page = await context.newPage();
      await page.setViewportSize({ width: 390, height: 844 });
      await signInThroughForm(page, baseUrl, crew.hand.email, TEST_PASSWORD);
      await page.evaluate(() => navigator.serviceWorker.ready.then(() => true));
      await expect.poll(() => page.evaluate(() => navigator.serviceWorker.controller !== null), { timeout: 15_000 }).toBe(true);
      return page;
    }

    /** Opens the Vessel page with a connection, its batch fetched too, so both are kept for later. */
    async function openVesselOnline(page: Page, batchId: string, vesselId: string): Promise<void> {
      const { baseUrl } = env();
      await page.evaluate((url) => fetch(url).then((r) => r.status), `/api/cellars/${crew.cellar.id}/batches/${batchId}`);
      await page.goto(`${baseUrl}/c/${crew.cellar.id}/vessels/${vesselId}`);
      await page.waitForSelector('[data-test=action-reading]');
    }

    /** The writes kept in the page's IndexedDB. */
    function keptWrites(page: Page): Promise<KeptWrite[]> {
      return page.evaluate(
        () =>
          new Promise<KeptWrite[]>((resolve, reject) => {
            const open = indexedDB.open('cellarwright-offline');
            open.onerror = () => reject(open.error);
            open.onsuccess = () => {
              const all = open.result.transaction('writes').objectStore('writes').getAll();
              all.onsuccess = () => resolve(all.result as KeptWrite[]);
              all.onerror = () => reject(all.error);
            };
          }),
      );
    }

    /** The batch's readings as the server has them, asked with a connection. */
    async function readingsOf(page: Page, batchId: string): Promise<Reading[]> {
      const body = await page.evaluate(
        (url) => fetch(url, { cache: 'no-store' }).then((r) => r.json()),
        `/api/cellars/${crew.cellar.id}/batches/${batchId}`,
      );
      return (body as { readings: Reading[] }).readings;
    }

    it('is installable: Chromium finds no installability errors, the manifest is ours and the service worker is ready', async () => {
      const { baseUrl, context } = env();
      const page = await signedInPage();
      const cdp = await context.newCDPSession(page);
      const { installabilityErrors } = (await cdp.send('Page.getInstallabilityErrors')) as { installabilityErrors: { errorId: string }[] };
      expect(installabilityErrors).toEqual([]);
      await cdp.detach();

      const manifestHref = await page.getAttribute('link[rel=manifest]', 'href');
      expect(manifestHref).toBe('/manifest.webmanifest');
      const manifest = await page.evaluate((href) => fetch(href).then((r) => r.json()), manifestHref!);
      expect(manifest).toMatchObject({
        name: 'Cellarwright',
        short_name: 'Cellarwright',
        start_url: '/',
        display: 'standalone',
        theme_color: brandColours.primary,
        background_color: '#f5f2ec',
      });
      const icons = manifest.icons as { src: string; sizes: string; purpose: string }[];
      expect(icons.map((i) => `${i.sizes} ${i.purpose}`).sort()).toEqual(['192x192 any', '512x512 any', '512x512 maskable']);
      for (const icon of icons) {
        // A PNG's width and height are the big-endian words at bytes 16 and 20 (the IHDR chunk, PNG specification §11.2.2).
        const size = await page.evaluate(async (src) => {
          const bytes = new DataView(await (await fetch(src)).arrayBuffer());
          return `${bytes.getUint32(16)}x${bytes.getUint32(20)}`;
        }, icon.src);
        expect(size, icon.src).toBe(icon.sizes);
      }

      const worker = await fetch(`${baseUrl}/sw.js`);
      expect(worker.status).toBe(200);
      expect(worker.headers.get('cache-control')).toBe('no-cache');
      expect(worker.headers.get('content-type')).toMatch(/javascript/);
      expect(await page.evaluate(() => navigator.serviceWorker.ready.then((r) => r.scope))).toBe(`${baseUrl}/`);
      await page.close();
    });

    it('keeps a reading made without a connection, shows it waiting, and sends it once with the time it was made', async () => {
      const { baseUrl, context } = env();
      const { batchId, vesselId } = await batchInCarboy('Offline melomel');
      const page = await signedInPage();
      await openVesselOnline(page, batchId, vesselId);

      await context.setOffline(true);
      await page.waitForSelector('[data-test=offline-banner]');
      await logReadingThroughDialog(page, '1.030');
      await expect.poll(() => page.textContent('[data-test=pending-count]')).toBe('1');
      const [kept] = await keptWrites(page);
      expect(kept.body).toMatchObject({ sg: 1.03, vesselId, at: kept.madeAt });
      await page.click('[data-test=pending-writes]');
      expect(await page.locator('[data-test=pending-write]').count()).toBe(1);
      expect(await page.textContent('[data-test=pending-panel]')).toContain('Reading 1.030');
      await page.keyboard.press('Escape');

      // Time passes in the cellar before the phone finds signal again.
      await page.waitForTimeout(2500);
      const restoredAt = Date.now();
      await context.setOffline(false);
      await page.waitForSelector('[data-test=pending-writes]', { state: 'detached', timeout: 15_000 });
      await page.waitForSelector('[data-test=offline-banner]', { state: 'detached' });

      const readings = await readingsOf(page, batchId);
      expect(readings).toHaveLength(1);
      expect(readings[0].sg).toBe(1.03);
      expect(Date.parse(readings[0].at)).toBe(Date.parse(kept.madeAt));
      expect(Date.parse(readings[0].at)).toBeLessThan(restoredAt - 2000);

      await page.goto(`${baseUrl}/c/${crew.cellar.id}/batches/${batchId}`);
      await page.waitForSelector('[data-test=journal-entry-reading]');
      expect(await page.locator('[data-test=journal-entry-reading]').count()).toBe(1);

      // The same queued request sent again (a lost answer, a second tab) records nothing more.
      const replay = await page.evaluate(
        (write) =>
          fetch(write.url, {
            method: write.method,
            headers: { 'content-type': 'application/json', 'Idempotency-Key': write.id },
            body: JSON.stringify(write.body),
          }).then((r) => ({ status: r.status, replayed: r.headers.get('idempotent-replayed') })),
        kept,
      );
      expect(replay).toEqual({ status: 201, replayed: 'true' });
      expect(await readingsOf(page, batchId)).toHaveLength(1);
      await page.close();
    });

    it('records a request sent twice at once with one key once', async () => {
      const { batchId } = await batchInCarboy('Twice-sent cyser');
      const page = await signedInPage();
      const statuses = await page.evaluate((url) => {
        const key = crypto.randomUUID();
        const send = () =>
          fetch(url, {
            method: 'POST',
            headers: { 'content-type': 'application/json', 'Idempotency-Key': key },
            body: JSON.stringify({ sg: 1.02 }),
          }).then((r) => r.status);
        return Promise.all([send(), send()]);
      }, `/api/cellars/${crew.cellar.id}/batches/${batchId}/readings`);
      expect(statuses).toEqual([201, 201]);
      expect(await readingsOf(page, batchId)).toHaveLength(1);
      await page.close();
    });

    it('shows a reading that meets a racked vessel, with what changed, and sends it only when told', async () => {
      const { context, ds } = env();
      const { batchId, vesselId } = await batchInCarboy('Racked meanwhile');
      const target = await sanitisedVessel(ds, crew.cellar.id, { name: 'Fresh carboy', capacityL: 23 });
      const page = await signedInPage();
      await openVesselOnline(page, batchId, vesselId);

      await context.setOffline(true);
      await logReadingThroughDialog(page, '1.012');
      await expect.poll(() => page.textContent('[data-test=pending-count]')).toBe('1');
      // Someone else racks the batch into another vessel while the phone has no signal.
      await inTransaction(ds, 'write', (tx) =>
        rackBatch(contextOf(crew, 'keeper'), tx, batchId, { from: [{ vesselId }], to: [{ vesselId: target.id, volumeL: 19 }] }),
      );
      await context.setOffline(false);

      await expect.poll(async () => (await keptWrites(page))[0]?.problem?.status, { timeout: 15_000 }).toBe(409);
      expect(await readingsOf(page, batchId)).toHaveLength(0);
      await page.click('[data-test=pending-writes]');
      const problem = await page.textContent('[data-test=pending-problem]');
      expect(problem).toMatch(/^Changed meanwhile: /);
      expect(problem).toContain('Racked meanwhile carboy');

      await page.click('[data-test=pending-keep]');
      await expect.poll(async () => (await keptWrites(page)).length, { timeout: 15_000 }).toBe(0);
      const readings = await readingsOf(page, batchId);
      expect(readings.map((r) => r.sg)).toEqual([1.012]);
      await page.close();
    });

    it("asks for a scanned vessel's record as the worker serves its page, once, and opens that page without signal from what it kept", async () => {
      const { baseUrl, context } = env();
      const { vesselId, code } = await batchInCarboy('Early pear cider');
      const page = await signedInPage();
      const recordUrl = `${baseUrl}/api/cellars/${crew.cellar.id}/vessels/${vesselId}`;
      let asked: { by: 'worker' | 'page'; fromWorker: Promise<boolean> }[] = [];
      const onRequest = (request: Request) => {
        if (request.url() !== recordUrl) return;
        const fromWorker = request.response().then((response) => response?.fromServiceWorker() ?? false);
        asked.push({ by: request.serviceWorker() ? 'worker' : 'page', fromWorker });
      };
      context.on('request', onRequest);
      try {
        // With the page's scripts switched off, the record is still asked for: by the worker, as it serves the page.
        const cdp = await context.newCDPSession(page);
        await cdp.send('Emulation.setScriptExecutionDisabled', { value: true });
        await page.goto(`${baseUrl}/s/${code}`);
        await expect.poll(() => asked.map((a) => a.by)).toEqual(['worker']);
        await cdp.send('Emulation.setScriptExecutionDisabled', { value: false });
        await cdp.detach();

        // With them on, the page's own request is answered by the worker with what it asked for:
        // the server is asked once.
        asked = [];
        await page.goto(`${baseUrl}/s/${code}`);
        await expect.poll(() => page.textContent('[data-test=vessel-title]')).toBe('Early pear cider carboy');
        expect(asked.map((a) => a.by).sort()).toEqual(['page', 'worker']);
        expect(await asked.find((a) => a.by === 'page')!.fromWorker).toBe(true);
      } finally {
        context.off('request', onRequest);
      }
      // ...and the worker kept it, as it keeps every record that passes through it.
      await expect.poll(() => page.evaluate((url) => caches.match(url).then((r) => r?.status ?? null), recordUrl)).toBe(200);

      // Without signal the worker's early request fails: the page shows the record it kept.
      await context.setOffline(true);
      try {
        await page.goto(`${baseUrl}/c/${crew.cellar.id}/vessels/${vesselId}`);
        await expect.poll(() => page.textContent('[data-test=vessel-title]')).toBe('Early pear cider carboy');
      } finally {
        await context.setOffline(false);
      }
      await page.close();
    });

    it('opens a label scanned without signal from what the phone kept, and lets a reading wait for the connection', async () => {
      const { baseUrl, context } = env();
      const { batchId, vesselId, code } = await batchInCarboy('Shed cider');
      const page = await signedInPage();
      // A few seconds after it opens, the app keeps the cellar's label codes and in-use records on the phone.
      const keptLabelUrl = (labelCode: string) =>
        page.evaluate(
          (c) =>
            new Promise<string | null>((resolve) => {
              const open = indexedDB.open('cellarwright-offline');
              open.onsuccess = () => {
                const got = open.result.transaction('labels').objectStore('labels').get(c);
                got.onsuccess = () => resolve((got.result as { url: string } | undefined)?.url ?? null);
                got.onerror = () => resolve(null);
              };
              open.onerror = () => resolve(null);
            }),
          labelCode,
        );
      await expect.poll(() => keptLabelUrl(code), { timeout: 30_000 }).toBe(`/c/${crew.cellar.id}/vessels/${vesselId}`);
      const keptInCache = (path: string) => page.evaluate((p) => caches.match(p).then((r) => r !== undefined), path);
      await expect.poll(() => keptInCache(`/api/cellars/${crew.cellar.id}/batches/${batchId}`), { timeout: 30_000 }).toBe(true);
      expect(await keptInCache(`/api/cellars/${crew.cellar.id}/vessels/${vesselId}`)).toBe(true);

      await context.setOffline(true);
      await page.goto(`${baseUrl}/s/${code}`);
      await page.waitForURL(`${baseUrl}/c/${crew.cellar.id}/vessels/${vesselId}`);
      await expect.poll(() => page.textContent('[data-test=vessel-title]')).toBe('Shed cider carboy');
      await logReadingThroughDialog(page, '1.004');
      await expect.poll(() => page.textContent('[data-test=pending-count]')).toBe('1');

      // The Scan page's typed code (as the camera's) finds the same kept record without signal.
      await page.goto(`${baseUrl}/c/${crew.cellar.id}/scan`);
      await page.fill('[data-test=scan-code-input]', code);
      await page.click('[data-test=scan-code-submit]');
      await page.waitForURL(`${baseUrl}/c/${crew.cellar.id}/vessels/${vesselId}`);

      await context.setOffline(false);
      await page.waitForSelector('[data-test=pending-writes]', { state: 'detached', timeout: 15_000 });
      expect((await readingsOf(page, batchId)).map((r) => r.sg)).toEqual([1.004]);
      await page.close();
    }, 90_000);
  },
  { serviceWorkers: 'allow' },
);
