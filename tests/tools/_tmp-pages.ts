import { launchBrowser } from './browser';
const base = 'http://127.0.0.1:8472';
const [path, prefix, width = '360', pages = '5', email = 'maren@fernhollow.test'] = process.argv.slice(2);
const { context, close } = await launchBrowser();
const page = await context.newPage();
await page.setViewportSize({ width: Number(width), height: 760 });
await page.goto(base + '/sign-in');
await page.fill('[data-test=email]', email);
await page.fill('[data-test=password]', 'demo-cellar-2026');
await page.click('[data-test=sign-in]');
await page.waitForURL(/\/c\/[^/]+\/today/);
const cellar = page.url().split('/c/')[1]!.split('/')[0]!;
await page.goto(base + path!.replace('{cellar}', cellar));
await page.waitForLoadState('networkidle');
await page.waitForTimeout(500);
const height = await page.evaluate(() => document.documentElement.scrollHeight);
for (let i = 0; i < Number(pages) && i * 640 < height; i++) {
  await page.evaluate((y) => window.scrollTo(0, y), i * 640);
  await page.waitForTimeout(250);
  await page.screenshot({ path: `${prefix}-${i}.png` });
}
console.log('height', height);
await close();
