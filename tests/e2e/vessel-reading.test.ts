import { beforeAll, expect, it } from 'vitest';
import type { Page } from 'playwright-core';
import { correctGravity } from '../../shared/calc';
import { makeBatch } from '../helpers/batches';
import { makeCellarWithCrew, TEST_PASSWORD, type CellarCrew } from '../helpers/crew';
import { addJournalEntry } from '../helpers/journal';
import { fillVessel, makeVessel } from '../helpers/vessels';
import { describeInBrowser, signInThroughForm } from '../helpers/browser-app';

describeInBrowser('Vessel page: logging a reading, in Chromium', (env) => {
  let crew: CellarCrew;
  let vesselId: string;
  let batchName: string;
  let batchId: string;

  beforeAll(async () => {
    const { ds } = env();
    crew = await makeCellarWithCrew(ds, 'Vessel reading cellar');
    const batch = await makeBatch(ds, crew.cellar.id, { name: 'Bramble melomel', kind: 'melomel', startedOn: '2026-01-10' });
    const vessel = await makeVessel(ds, crew.cellar.id, { name: 'Carboy 7', material: 'glass', capacityL: 23 });
    await fillVessel(ds, vessel.id, batch.id, 21);
    await addJournalEntry(ds, crew.cellar.id, batch.id, {
      kind: 'started',
      volumeL: 21,
      og: 1.11,
      vessels: [{ vesselId: vessel.id, vesselName: vessel.name, volumeL: 21 }],
      parents: [],
      override: null,
    });
    vesselId = vessel.id;
    batchName = batch.name;
    batchId = batch.id;
  });

  async function openVesselPage(email: string): Promise<Page> {
    const { baseUrl, context } = env();
    const page = await context.newPage();
    await page.setViewportSize({ width: 390, height: 844 });
    await signInThroughForm(page, baseUrl, email, TEST_PASSWORD);
    await page.goto(`${baseUrl}/c/${crew.cellar.id}/vessels/${vesselId}`);
    await expect.poll(() => page.textContent('[data-test=vessel-title]')).toBe('Carboy 7');
    return page;
  }

  async function close(page: Page): Promise<void> {
    await page.close();
    await env().context.clearCookies();
  }

  it('lets a Hand log a reading and shows it, temperature-corrected by shared/calc, as the last reading', async () => {
    const page = await openVesselPage(crew.hand.email);
    expect(await page.textContent('[data-test=vessel-batch]')).toContain(batchName);
    expect(await page.isVisible('[data-test=last-reading-none]')).toBe(true);
    // Glass: the carrying caution sits beside racking.
    expect(await page.isVisible('[data-test=caution-glass]')).toBe(true);

    const asked: string[] = [];
    page.on('request', (r) => {
      const url = new URL(r.url());
      if (url.pathname.startsWith('/api/')) asked.push(`${r.method()} ${url.pathname}`);
    });
    await page.click('[data-test=action-reading]');
    await page.waitForSelector('[data-test=reading-dialog]');
    await page.fill('[data-test=reading-sg]', '1.050');
    await page.fill('[data-test=reading-temperature]', '25');
    await page.click('[data-test=reading-submit]');
    await page.waitForSelector('[data-test=reading-dialog]', { state: 'detached' });

    const expected = correctGravity(1.05, 25, 20).toFixed(3);
    expect(expected).not.toBe('1.050');
    await expect.poll(() => page.textContent('[data-test=last-reading-corrected]'), { timeout: 10_000 }).toBe(expected);
    expect(await page.textContent('[data-test=last-reading-detail]')).toContain('read 1.050');
    // One round trip for the reading: the dialog used what the page had, the page showed the answer.
    // Only the task card asks again (the reading may have been its task).
    await page.waitForLoadState('networkidle');
    const cellarApi = `/api/cellars/${crew.cellar.id}`;
    expect(asked.filter((r) => !r.startsWith(`GET ${cellarApi}/tasks`))).toEqual([`POST ${cellarApi}/batches/${batchId}/readings`]);
    await close(page);
  });

  it('shows a Guest the vessel without any write action', async () => {
    const page = await openVesselPage(crew.guest.email);
    await page.waitForSelector('[data-test=vessel-contents]');
    expect(await page.isVisible('[data-test=read-only-note]')).toBe(true);
    for (const action of [
      'action-reading',
      'action-rack',
      'action-addition',
      'action-top-up',
      'action-move',
      'action-edit',
      'action-retire',
      'action-delete',
      'action-print-label',
    ]) {
      expect(await page.locator(`[data-test=${action}]`).count(), action).toBe(0);
    }
    expect(await page.locator('button', { hasText: /mark|sanitise/i }).count()).toBe(0);
    await close(page);
  });
});
