import { launchBrowser } from './browser';
const base = 'http://127.0.0.1:8472';
const [units = 'us', width = '360', ...paths] = process.argv.slice(2);
const { context, close } = await launchBrowser();
const page = await context.newPage();
await page.setViewportSize({ width: Number(width), height: 760 });
await page.goto(base + '/sign-in');
await page.evaluate((u) => localStorage.setItem('cellarwright.units', u), units);
await page.fill('[data-test=email]', 'maren@fernhollow.test');
await page.fill('[data-test=password]', 'demo-cellar-2026');
await page.click('[data-test=sign-in]');
await page.waitForURL(/\/c\/[^/]+\/today/);
const cellar = page.url().split('/c/')[1]!.split('/')[0]!;
for (const p of paths) {
  await page.goto(base + p.replace('{cellar}', cellar));
  await page.waitForLoadState('networkidle');
  await page.waitForTimeout(600);
  const name = p.replace('{cellar}', 'c').replace(/[^a-z0-9]+/gi, '-');
  await page.screenshot({ path: `/tmp/shots3/${units}-${width}${name}.png`, fullPage: true });
}
await close();
