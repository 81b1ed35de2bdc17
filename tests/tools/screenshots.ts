/**
 * Takes small-phone (360 px), phone (390 px) and desktop (1280 px) screenshots of screens of a running app.
 * Usage: tsx tests/tools/screenshots.ts [baseUrl] [outDir] [path ...]
 * Signs in as the demo Keeper first. Paths may use {cellar} for the first cellar's id.
 */
import fs from 'node:fs';
import path from 'node:path';
import { launchBrowser } from './browser';

const [baseUrl = 'http://127.0.0.1:8460', outDir = 'screenshots', ...paths] = process.argv.slice(2);
const email = process.env.SCREENSHOT_EMAIL ?? 'maren@fernhollow.test';
const password = process.env.SCREENSHOT_PASSWORD ?? 'demo-cellar-2026';

const { context, close } = await launchBrowser();
fs.mkdirSync(outDir, { recursive: true });
try {
  const page = await context.newPage();
  for (const [label, width, height] of [
    ['phone-360', 360, 760],
    ['phone', 390, 844],
    ['desktop', 1280, 860],
  ] as const) {
    await page.setViewportSize({ width, height });
    await page.goto(`${baseUrl}/sign-in`);
    await page.screenshot({ path: path.join(outDir, `sign-in-${label}.png`) });
    await page.fill('[data-test=email]', email);
    await page.fill('[data-test=password]', password);
    await page.click('[data-test=sign-in]');
    await page.waitForURL(/\/c\/[^/]+\/today/);
    const cellarId = page.url().split('/c/')[1]!.split('/')[0]!;
    for (const p of paths.length ? paths : ['/c/{cellar}/today']) {
      await page.goto(`${baseUrl}${p.replace('{cellar}', cellarId)}`);
      await page.waitForLoadState('networkidle');
      await page.waitForTimeout(400);
      const name = p
        .replace('{cellar}', 'c')
        .replace(/[^a-z0-9]+/gi, '-')
        .replace(/^-|-$/g, '');
      await page.screenshot({ path: path.join(outDir, `${name}-${label}.png`), fullPage: true });
    }
    await context.clearCookies();
  }
} finally {
  await close();
}
console.log(`Screenshots in ${outDir}`);
