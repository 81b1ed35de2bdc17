import { beforeAll, expect, it } from 'vitest';
import type { Page } from 'playwright-core';
import { makeBatchInVessels } from '../helpers/batches';
import { makeCellarWithCrew, TEST_PASSWORD, type CellarCrew } from '../helpers/crew';
import { describeInBrowser, signInThroughForm } from '../helpers/browser-app';

describeInBrowser('Tasks screen at phone width: done, snooze, dismiss and undo, in Chromium', (env) => {
  let crew: CellarCrew;
  let rackKey: string;
  let readingKey: string;

  beforeAll(async () => {
    const { ds } = env();
    crew = await makeCellarWithCrew(ds, 'Tasks cellar');
    // 40 days in primary: the racking (30 days, common practice) and the weekly reading of day 35 are overdue.
    const { batch } = await makeBatchInVessels(ds, crew, { name: 'Sloe melomel', startedDaysAgo: 40 });
    rackKey = `${batch.id}/rack-off-primary/start`;
    readingKey = `${batch.id}/weekly-reading/primary.4`;
  });

  async function openTasks(email: string): Promise<Page> {
    const { baseUrl, context } = env();
    const page = await context.newPage();
    await page.setViewportSize({ width: 390, height: 844 });
    await signInThroughForm(page, baseUrl, email, TEST_PASSWORD);
    await page.goto(`${baseUrl}/c/${crew.cellar.id}/tasks`);
    await page.waitForSelector(`[data-key="${rackKey}"]`);
    return page;
  }

  const inSection = (page: Page, section: string, key: string) => page.isVisible(`[data-test=tasks-${section}] [data-key="${key}"]`);

  it('lets a Hand mark a task done and undo it, snooze one and dismiss one', async () => {
    const page = await openTasks(crew.hand.email);
    expect(await inSection(page, 'overdue', rackKey)).toBe(true);
    expect(await inSection(page, 'overdue', readingKey)).toBe(true);

    await page.click(`[data-key="${rackKey}"] [data-test=task-done]`);
    await expect.poll(() => inSection(page, 'done', rackKey), { timeout: 10_000 }).toBe(true);
    await page.click('.q-notification button:has-text("Undo")');
    await expect.poll(() => inSection(page, 'overdue', rackKey), { timeout: 10_000 }).toBe(true);

    await page.click(`[data-key="${readingKey}"] [data-test=task-snooze] button >> nth=0`);
    await expect.poll(() => inSection(page, 'upcoming', readingKey), { timeout: 10_000 }).toBe(true);
    expect(await page.textContent(`[data-key="${readingKey}"] [data-test=task-when]`)).toContain('Snoozed until');

    await page.click(`[data-key="${rackKey}"] [data-test=task-dismiss]`);
    await expect.poll(() => inSection(page, 'done', rackKey), { timeout: 10_000 }).toBe(true);
    expect(await page.textContent(`[data-key="${rackKey}"] [data-test=task-when]`)).toContain('Dismissed');
    await page.close();
    await env().context.clearCookies();
  });

  it('shows a Guest the tasks without the buttons', async () => {
    const page = await openTasks(crew.guest.email);
    expect(await page.isVisible('[data-test=guest-note]')).toBe(true);
    // What the Hand did shows to everyone: the racking dismissed (by Hal Hand, in the first test).
    expect(await inSection(page, 'done', rackKey)).toBe(true);
    expect(await page.locator('[data-test=task-done]').count()).toBe(0);
    await page.close();
    await env().context.clearCookies();
  });
});
