import { beforeAll, expect, it } from 'vitest';
import type { Page } from 'playwright-core';
import request from 'supertest';
import { casesFrom } from '../../shared/calc';
import { makeCellarWithCrew, TEST_PASSWORD, type CellarCrew } from '../helpers/crew';
import { describeInBrowser, signInThroughForm } from '../helpers/browser-app';

/** What a Quasar field shows (its data-test sits on the inner control). */
const fieldText = (page: Page, selector: string) => page.$eval(selector, (el) => el.closest('.q-field')?.textContent ?? '');

describeInBrowser('Batch page: bottling into cases, in Chromium', (env) => {
  let crew: CellarCrew;
  let batchId: string;

  beforeAll(async () => {
    const { ds, baseUrl } = env();
    crew = await makeCellarWithCrew(ds, 'Bottling cellar');
    const api = request.agent(baseUrl);
    const signIn = await api.post('/api/auth/sign-in').send({ email: crew.hand.email, password: TEST_PASSWORD });
    expect(signIn.status).toBe(200);
    const base = `/api/cellars/${crew.cellar.id}`;
    const vessel = await api
      .post(`${base}/vessels`)
      .send({ name: 'Carboy 23', kind: 'carboy', material: 'glass', capacityL: 23, state: 'sanitised' });
    expect(vessel.status, JSON.stringify(vessel.body)).toBe(201);
    // An OG and no readings: the server cannot call it finished, so it asks for confirmation.
    const started = await api.post(`${base}/batches`).send({
      name: 'Crabapple cider',
      kind: 'cider',
      yeast: { name: 'Cider yeast', toleranceAbv: 9 },
      plannedVolumeL: 21,
      startedOn: '2026-01-05',
      og: 1.052,
      vessels: [{ vesselId: vessel.body.id, volumeL: 21 }],
    });
    expect(started.status, JSON.stringify(started.body)).toBe(201);
    batchId = started.body.batch.id;
  });

  it('bottles 26 × 750 mL, 12 per case, after confirming the not-finished caution, and shows the lot with its cases', async () => {
    const { baseUrl, context } = env();
    const page = await context.newPage();
    await page.setViewportSize({ width: 390, height: 844 });
    await signInThroughForm(page, baseUrl, crew.hand.email, TEST_PASSWORD);
    await page.goto(`${baseUrl}/c/${crew.cellar.id}/batches/${batchId}`);
    await expect.poll(() => page.textContent('[data-test=batch-name]')).toBe('Crabapple cider');

    await page.click('[data-test=op-bottle]');
    await page.waitForSelector('[data-test=bottle-dialog]');
    await page.locator('[data-test=bottle-from]').waitFor();
    expect(await fieldText(page, '[data-test=bottle-size]')).toContain('750 mL');
    await page.fill('[data-test=bottle-count]', '26');
    await page.fill('[data-test=bottle-per-case]', '12');
    const { cases, loose } = casesFrom(26, 12);
    const expectedCases = cases + (loose > 0 ? 1 : 0);
    expect(expectedCases).toBe(3);
    // In plain words: the full cases, then the part case.
    await expect.poll(() => page.textContent('[data-test=bottle-packing]')).toContain(`26 bottles: two full cases of 12 and a part case of ${loose}`);
    expect(await page.isVisible('[data-test=caution-bottle-pressure]')).toBe(true);

    await page.click('[data-test=bottle-submit]');
    const confirm = page.locator('[data-test=bottle-confirm]');
    await confirm.waitFor();
    expect(await confirm.textContent()).toContain('does not look finished');
    await page.click('[data-test=bottle-anyway]');
    await page.waitForSelector('[data-test=bottle-dialog]', { state: 'detached' });

    const lotCases = page.locator('[data-test=batch-bottles] [data-test=lot-cases]');
    await lotCases.waitFor();
    expect(await lotCases.textContent()).toBe(String(expectedCases));
    expect(await page.textContent('[data-test=batch-bottles] [data-test=lot-summary]')).toContain('26 × 750 mL');
    const bottled = await page.textContent('[data-test=journal-entry-bottled]');
    expect(bottled).toContain('did not look finished');
    await page.close();
    await context.clearCookies();
  });
});
