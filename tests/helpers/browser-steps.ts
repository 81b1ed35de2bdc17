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

/**
 * Opens a select and clicks the option with this text, then waits for its menu to be gone.
 * Quasar gives focus back to the select only when the menu has finished closing; text typed
 * into the next field before then lands in the select and is lost.
 * @param field - the select's data-test selector
 */
export async function chooseFromMenu(page: Page, field: string, option: string): Promise<void> {
  await page.click(field);
  await page.locator('.q-menu .q-item', { hasText: option }).click();
  await page.waitForSelector('.q-menu', { state: 'detached' });
}
