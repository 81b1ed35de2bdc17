import { beforeAll, expect, it } from 'vitest';
import { makeCellarWithCrew, TEST_PASSWORD, type CellarCrew } from '../helpers/crew';
import { describeInBrowser, signInThroughForm } from '../helpers/browser-app';

describeInBrowser('signing in, in Chromium', (env) => {
  let crew: CellarCrew;
  beforeAll(async () => {
    crew = await makeCellarWithCrew(env().ds, 'Browser test cellar');
  });

  it.each([
    ['keeper', 'Keeper'],
    ['hand', 'Hand'],
    ['guest', 'Guest'],
  ] as const)('signs in as the %s and shows the main layout, loading nothing from outside', async (role, badge) => {
    const { baseUrl, context } = env();
    const page = await context.newPage();
    await page.setViewportSize({ width: 1280, height: 800 });
    const outside: string[] = [];
    page.on('request', (req) => {
      const url = req.url();
      if (!url.startsWith(baseUrl) && !url.startsWith('data:') && !url.startsWith('blob:')) outside.push(url);
    });

    await signInThroughForm(page, baseUrl, crew[role].email, TEST_PASSWORD);
    await expect.poll(() => page.textContent('[data-test=cellar-switcher]')).toContain('Browser test cellar');
    expect(await page.textContent('[data-test=current-role]')).toContain(badge);
    for (const screen of ['today', 'batches', 'vessels', 'calculators', 'settings']) {
      expect(await page.isVisible(`[data-test=nav-${screen}]`)).toBe(true);
    }
    // The shipped font is really used (no CDN).
    expect(await page.evaluate(() => document.fonts.check('16px "Work Sans"'))).toBe(true);

    await page.click('[data-test=nav-settings]');
    await page.waitForSelector('[data-test=cellar-name]');
    expect(await page.isVisible('[data-test=save-cellar]')).toBe(role === 'keeper');

    expect(outside).toEqual([]);
    await page.close();
    await context.clearCookies();
  });

  it('returns to the page asked for after signing in', async () => {
    const { baseUrl, context } = env();
    const page = await context.newPage();
    await page.goto(`${baseUrl}/c/${crew.cellar.id}/settings`);
    await page.waitForURL(/\/sign-in\?next=/);
    await page.fill('[data-test=email]', crew.hand.email);
    await page.fill('[data-test=password]', TEST_PASSWORD);
    await page.click('[data-test=sign-in]');
    await page.waitForURL(new RegExp(`/c/${crew.cellar.id}/settings$`));
    await page.close();
    await context.clearCookies();
  });

  it('shows the server message for a wrong password and keeps what was typed', async () => {
    const { baseUrl, context } = env();
    const page = await context.newPage();
    await page.goto(`${baseUrl}/sign-in`);
    await page.fill('[data-test=email]', crew.hand.email);
    await page.fill('[data-test=password]', 'wrong-password');
    await page.click('[data-test=sign-in]');
    await expect.poll(() => page.textContent('[data-test=sign-in-error]')).toContain('Wrong e-mail or password.');
    expect(await page.inputValue('[data-test=email]')).toBe(crew.hand.email);
    await page.close();
  });
});
