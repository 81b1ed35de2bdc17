import { beforeAll, expect, it } from 'vitest';
import request from 'supertest';
import type { Page } from 'playwright-core';
import { makeBatchInVessels } from '../helpers/batches';
import { makeCellarWithCrew, TEST_PASSWORD, type CellarCrew } from '../helpers/crew';
import { describeInBrowser, signInThroughForm } from '../helpers/browser-app';

describeInBrowser('Putting mistakes right from a phone, in Chromium at 390 px', (env) => {
  let crew: CellarCrew;

  beforeAll(async () => {
    crew = await makeCellarWithCrew(env().ds, 'Phone corrections cellar');
  });

  async function phonePage(): Promise<Page> {
    const { baseUrl, context } = env();
    await context.clearCookies();
    const page = await context.newPage();
    await page.setViewportSize({ width: 390, height: 844 });
    await signInThroughForm(page, baseUrl, crew.hand.email, TEST_PASSWORD);
    return page;
  }

  it('corrects a started batch’s original gravity through Amend on the started entry; the OG and the ABV follow', async () => {
    const { ds, baseUrl } = env();
    // Started with a hydrometer misread as 0.990 (accepted: it is a gravity a must can show).
    const { batch } = await makeBatchInVessels(ds, crew, { volumesL: [19], og: 0.99, name: 'Misread melomel' });
    const api = request.agent(baseUrl);
    expect((await api.post('/api/auth/sign-in').send({ email: crew.hand.email, password: TEST_PASSWORD })).status).toBe(200);
    const reading = await api
      .post(`/api/cellars/${crew.cellar.id}/batches/${batch.id}/readings`)
      .send({ sg: 1.01, temperatureC: 20, calibrationC: 20 });
    expect(reading.status, JSON.stringify(reading.body)).toBe(201);
    const detail = await api.get(`/api/cellars/${crew.cellar.id}/batches/${batch.id}`);
    const startedId = detail.body.journal.find((e: { payload: { kind: string } }) => e.payload.kind === 'started').id;

    const page = await phonePage();
    await page.goto(`${baseUrl}/c/${crew.cellar.id}/batches/${batch.id}`);
    await expect.poll(() => page.textContent('[data-test=batch-name]')).toBe('Misread melomel');
    expect(await page.textContent('[data-test=figure-gravity]')).toContain('from 0.990');

    await page.click(`[data-test=amend-${startedId}]`);
    await page.waitForSelector('[data-test=amend-dialog]');
    expect(await page.inputValue('[data-test=amend-og]')).toBe('0.99');
    await page.fill('[data-test=amend-og]', '1.100');
    await page.fill('[data-test=amend-reason]', 'read the hydrometer at the wrong line');
    await page.click('[data-test=amend-submit]');
    await page.waitForSelector('[data-test=amend-dialog]', { state: 'detached' });

    await expect.poll(() => page.textContent('[data-test=figure-gravity]'), { timeout: 10_000 }).toContain('from 1.100');
    // ABV by the linear formula, (OG − FG) × 131.25 (the common homebrewing approximation):
    // (1.100 − 1.010) × 131.25 = 11.8125, shown to one decimal.
    expect(await page.textContent('[data-test=figure-abv]')).toContain('11.8 % ABV by the linear formula');
    expect(await page.locator('[data-test=journal-correction]').first().textContent()).toContain('read the hydrometer at the wrong line');
    await page.close();
    await env().context.clearCookies();
  });

  it('empties a vessel from its page: the vessel reads free and dirty, the batch’s journal shows why', async () => {
    const { ds, baseUrl } = env();
    const { batch, vessels } = await makeBatchInVessels(ds, crew, { volumesL: [4.5], name: 'Sour cyser' });
    const page = await phonePage();
    await page.goto(`${baseUrl}/c/${crew.cellar.id}/vessels/${vessels[0].id}`);
    await expect.poll(() => page.textContent('[data-test=vessel-title]')).toBe(vessels[0].name);

    await page.click('[data-test=action-empty]');
    await page.waitForSelector('[data-test=empty-vessel-dialog]');
    expect(await page.textContent('[data-test=empty-vessel-summary]')).toContain('Sour cyser');
    // No reason chosen yet: the dialog says so and sends nothing.
    await page.click('[data-test=empty-vessel-submit]');
    await expect.poll(() => page.locator('[data-test=empty-vessel-dialog] [role=alert]').first().textContent()).toBe('choose one of the options');
    await page.locator('[data-test=empty-vessel-reason] .q-radio', { hasText: 'Spoiled' }).click();
    await page.fill('[data-test=empty-vessel-note]', 'smelled of vinegar');
    await page.click('[data-test=empty-vessel-submit]');
    await page.waitForSelector('[data-test=empty-vessel-dialog]', { state: 'detached' });

    await expect.poll(() => page.isVisible('[data-test=vessel-empty]'), { timeout: 10_000 }).toBe(true);
    expect(await page.isVisible('[data-test=state-dirty]')).toBe(true);
    expect(await page.locator('[data-test=batch-actions]').count()).toBe(0);

    await page.goto(`${baseUrl}/c/${crew.cellar.id}/batches/${batch.id}`);
    const entry = page.locator('[data-test=journal-entry-emptied]');
    await expect.poll(() => entry.count(), { timeout: 10_000 }).toBe(1);
    const text = await entry.textContent();
    expect(text).toContain(`Emptied ${vessels[0].name}`);
    expect(text).toContain('Spoiled');
    expect(text).toContain('smelled of vinegar');
    await page.close();
    await env().context.clearCookies();
  });
});
