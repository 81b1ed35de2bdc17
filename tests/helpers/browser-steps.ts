import type { Page } from 'playwright-core';

// Steps a person takes in the app, shared by the browser tests and the measuring tools (no vitest here,
// so a plain script can use them too).

/** Signs in through the sign-in form and waits for the Today screen. */
export async function signInThroughForm(page: Page, baseUrl: string, email: string, password: string): Promise<void> {
  await page.goto(`${baseUrl}/sign-in`);
  await page.fill('[data-test=email]', email);
  await page.fill('[data-test=password]', password);
  await page.click('[data-test=sign-in]');
  await page.waitForURL(/\/c\/[^/]+\/today$/);
}

/** On a Vessel page: opens "Log a reading", types the gravity, saves, and waits for the dialog to close. */
export async function logReadingThroughDialog(page: Page, sg: string): Promise<void> {
  await page.click('[data-test=action-reading]');
  await page.waitForSelector('[data-test=reading-sg]');
  await page.fill('[data-test=reading-sg]', sg);
  await page.click('[data-test=reading-submit]');
  await page.waitForSelector('[data-test=reading-dialog]', { state: 'detached' });
}
