import { beforeAll, expect, it } from 'vitest';
import request from 'supertest';
import type { Page } from 'playwright-core';
import { makeBatchInVessels } from '../helpers/batches';
import { makeCellarWithCrew, TEST_PASSWORD, type CellarCrew } from '../helpers/crew';
import { chooseFromMenu, describeInBrowser, signInThroughForm } from '../helpers/browser-app';

describeInBrowser('Forms on a phone: out-of-range numbers, in Chromium at 390 px', (env) => {
  let crew: CellarCrew;

  beforeAll(async () => {
    const { ds, baseUrl } = env();
    crew = await makeCellarWithCrew(ds, 'Phone form cellar');
    const api = request.agent(baseUrl);
    expect((await api.post('/api/auth/sign-in').send({ email: crew.hand.email, password: TEST_PASSWORD })).status).toBe(200);
    const res = await api
      .post(`/api/cellars/${crew.cellar.id}/vessels`)
      .send({ name: 'Phone carboy', kind: 'carboy', material: 'glass', capacityL: 19, state: 'sanitised' });
    expect(res.status, JSON.stringify(res.body)).toBe(201);
  });

  it('keeps the Start a batch form whole with a negative planned or fill volume, says why under the field, and clears it once fixed', async () => {
    const { baseUrl, context } = env();
    const page = await context.newPage();
    await page.setViewportSize({ width: 390, height: 844 });
    await signInThroughForm(page, baseUrl, crew.hand.email, TEST_PASSWORD);
    await page.goto(`${baseUrl}/c/${crew.cellar.id}/batches`);
    await page.click('[data-test=start-batch]');
    await page.waitForSelector('[data-test=start-batch-dialog]');
    await page.fill('[data-test=start-name]', 'Phone mead');
    await page.fill('[data-test=start-yeast]', 'Test wine yeast');
    await page.fill('[data-test=start-volume]', '-5');
    await chooseFromMenu(page, '[data-test=start-vessels-vessel-0]', 'Phone carboy');
    await page.fill('[data-test=start-vessels-volume-0]', '-3');

    // Nothing vanished: every part of the form is still there with what was typed.
    expect(await page.inputValue('[data-test=start-name]')).toBe('Phone mead');
    expect(await page.isVisible('[data-test=start-vessels-volume-0]')).toBe(true);

    await page.click('[data-test=start-batch-submit]');
    const messages = page.locator('[data-test=start-batch-dialog] .q-field--error .q-field__messages');
    await expect.poll(() => messages.allTextContents()).toEqual(['at least 0.001 L', 'at least 0.001 L']);
    expect(await page.inputValue('[data-test=start-name]')).toBe('Phone mead');

    await page.fill('[data-test=start-volume]', '5');
    await page.fill('[data-test=start-vessels-volume-0]', '5');
    await expect.poll(() => page.locator('[data-test=start-batch-dialog] .q-field--error').count()).toBe(0);
    await page.close();
  });

  async function phonePage(): Promise<Page> {
    const { baseUrl, context } = env();
    // Each page signs in afresh through the form.
    await context.clearCookies();
    const page = await context.newPage();
    await page.setViewportSize({ width: 390, height: 844 });
    await signInThroughForm(page, baseUrl, crew.hand.email, TEST_PASSWORD);
    return page;
  }

  it('keeps what was typed into Start a batch through Cancel, while the page stays', async () => {
    const { baseUrl } = env();
    const page = await phonePage();
    await page.goto(`${baseUrl}/c/${crew.cellar.id}/batches`);
    await page.click('[data-test=start-batch]');
    await page.waitForSelector('[data-test=start-batch-dialog]');
    await page.fill('[data-test=start-name]', 'Half-typed mead');
    await page.fill('[data-test=start-volume]', '-5');
    await page.locator('[data-test=start-batch-dialog] button', { hasText: 'Cancel' }).click();
    await page.waitForSelector('[data-test=start-batch-dialog]', { state: 'detached' });

    await page.click('[data-test=start-batch]');
    await page.waitForSelector('[data-test=start-batch-dialog]');
    await expect.poll(() => page.inputValue('[data-test=start-name]')).toBe('Half-typed mead');
    expect(await page.inputValue('[data-test=start-volume]')).toBe('-5');
    await page.close();
  });

  it('keeps the Top up form whole with a negative volume, says why under the field, clears it once fixed, and keeps a draft through Cancel', async () => {
    const { baseUrl, ds } = env();
    const { vessels } = await makeBatchInVessels(ds, crew, { volumesL: [17], name: 'Topped melomel' });
    const page = await phonePage();
    await page.goto(`${baseUrl}/c/${crew.cellar.id}/vessels/${vessels[0].id}`);
    await page.click('[data-test=action-top-up]');
    await page.waitForSelector('[data-test=top-up-dialog]');
    await page.fill('[data-test=top-up-with]', 'a similar mead');
    await page.fill('[data-test=top-up-volume]', '-2');

    // Nothing vanished: every part of the form is still there with what was typed.
    expect(await page.isVisible('[data-test=top-up-vessel]')).toBe(true);
    expect(await page.inputValue('[data-test=top-up-with]')).toBe('a similar mead');

    await page.click('[data-test=top-up-submit]');
    const messages = page.locator('[data-test=top-up-dialog] .q-field--error .q-field__messages');
    await expect.poll(() => messages.allTextContents()).toEqual(['at least 0.001 L']);
    expect(await page.inputValue('[data-test=top-up-with]')).toBe('a similar mead');

    await page.fill('[data-test=top-up-volume]', '0.3');
    await expect.poll(() => page.locator('[data-test=top-up-dialog] .q-field--error').count()).toBe(0);

    await page.locator('[data-test=top-up-dialog] button', { hasText: 'Cancel' }).click();
    await page.waitForSelector('[data-test=top-up-dialog]', { state: 'detached' });
    await page.click('[data-test=action-top-up]');
    await page.waitForSelector('[data-test=top-up-dialog]');
    await expect.poll(() => page.inputValue('[data-test=top-up-volume]')).toBe('0.3');
    expect(await page.inputValue('[data-test=top-up-with]')).toBe('a similar mead');
    await page.close();
  });
});
