/**
 * Browser benchmark on the large cellar (tests/bench/large-cellar.ts), in Debian's Chromium
 * against the built client (dist/, or CLIENT_DIR) served by the real app on a loopback port:
 *
 * - Today's first load with an empty cache: the JavaScript bytes on the wire (compressed as
 *   sent), target ≤ 150 kB;
 * - a vessel's printed label URL (/s/:code) opened signed in, until the vessel's name shows:
 *   the median of runs in one warm browser context (target ≤ 400 ms) and of runs each in a
 *   new context with an empty cache (target ≤ 1,200 ms).
 *
 * A script, not a test: `npx vite build && npm run bench:scan`.
 */
import 'reflect-metadata';
import fs from 'node:fs';
import type { Server } from 'node:http';
import type { AddressInfo } from 'node:net';
import os from 'node:os';
import path from 'node:path';
import { performance } from 'node:perf_hooks';
import { chromium, type Browser, type BrowserContext } from 'playwright-core';
import { createApp, SESSION_COOKIE } from '../../server/app';
import { CHROMIUM_ARGS, CHROMIUM_PATH, chromiumAvailable } from '../tools/browser';
import { withBenchDatabase } from './bench-database';
import { BENCH_EMAIL, BENCH_PASSWORD, seedLargeCellar } from './large-cellar';

const RUNS = Number(process.env.BENCH_SCAN_RUNS ?? 10);
const WARM_TARGET_MS = 400;
const COLD_TARGET_MS = 1200;
const TODAY_JS_TARGET_KB = 150;

const clientDir = path.resolve(process.env.CLIENT_DIR ?? path.join(import.meta.dirname, '../../dist'));
if (!fs.existsSync(path.join(clientDir, 'index.html'))) throw new Error(`No built client in ${clientDir}: run \`npx vite build\` first.`);
if (!chromiumAvailable()) throw new Error(`No Chromium at ${CHROMIUM_PATH}.`);

const median = (xs: number[]) => [...xs].sort((a, b) => a - b)[Math.floor(xs.length / 2)]!;

await withBenchDatabase(async ({ ds }) => {
  const cellar = await seedLargeCellar(ds);
  // Every run opens a label; one loopback address stands for many phones here.
  const app = createApp({
    dataSource: ds,
    sessionSecret: 'bench-secret-long-enough-0123456789abcdef',
    cookieSecure: false,
    clientDir,
    scanLookupsPerMinute: 1_000_000,
  });
  const server = await new Promise<Server>((resolve) => {
    const s = app.listen(0, '127.0.0.1', () => resolve(s));
  });
  const base = `http://127.0.0.1:${(server.address() as AddressInfo).port}`;
  const signIn = await fetch(`${base}/api/auth/sign-in`, {
    method: 'POST',
    headers: { 'content-type': 'application/json' },
    body: JSON.stringify({ email: BENCH_EMAIL, password: BENCH_PASSWORD }),
  });
  if (signIn.status !== 200) throw new Error(`sign-in answered ${signIn.status}`);
  const sid = signIn.headers
    .getSetCookie()
    .map((c) => c.split(';')[0]!)
    .find((c) => c.startsWith(`${SESSION_COOKIE}=`))!
    .slice(SESSION_COOKIE.length + 1);

  const browser: Browser = await chromium.launch({
    executablePath: CHROMIUM_PATH,
    headless: true,
    args: CHROMIUM_ARGS,
  });
  /** A new context (empty cache, no service worker) signed in with the bench session. */
  const signedInContext = async (): Promise<BrowserContext> => {
    const context = await browser.newContext({
      viewport: { width: 390, height: 844 },
      serviceWorkers: process.env.BENCH_SCAN_NO_SW ? 'block' : 'allow',
    });
    await context.addCookies([{ name: SESSION_COOKIE, value: sid, domain: '127.0.0.1', path: '/', httpOnly: true, sameSite: 'Lax' }]);
    return context;
  };
  /** Opens the label URL and waits for the vessel's name: milliseconds from navigation. */
  const openLabel = async (context: BrowserContext): Promise<number> => {
    const page = await context.newPage();
    const start = performance.now();
    // BENCH_SCAN_TRACE=1 prints when each request of the run finished (where the time goes).
    if (process.env.BENCH_SCAN_TRACE) {
      const at = () => (performance.now() - start).toFixed(0).padStart(5);
      page.on('request', (r) => console.log(`  ${at()} ms  → ${r.method()} ${r.url().slice(base.length)}`));
      page.on('requestfinished', (r) => console.log(`  ${at()} ms  ← ${r.method()} ${r.url().slice(base.length)}`));
    }
    await page.goto(`${base}/s/${cellar.code}`, { waitUntil: 'commit' });
    await page.locator('[data-test=vessel-title]').waitFor({ state: 'visible' });
    const ms = performance.now() - start;
    if (!page.url().includes(`/vessels/${cellar.vesselId}`)) throw new Error(`label opened ${page.url()}`);
    await page.close();
    return ms;
  };

  try {
    // Today with an empty cache: every script the page loads, as sent over the wire.
    const todayContext = await signedInContext();
    const page = await todayContext.newPage();
    const scripts: { url: string; bytes: number; encoding: string }[] = [];
    page.on('requestfinished', (request) => {
      if (request.resourceType() !== 'script') return;
      void Promise.all([request.sizes(), request.response()]).then(([sizes, response]) =>
        scripts.push({ url: request.url(), bytes: sizes.responseBodySize, encoding: response?.headers()['content-encoding'] ?? 'none' }),
      );
    });
    await page.goto(`${base}/c/${cellar.cellarId}/today`);
    await page.locator('[data-test=today-scan]').waitFor({ state: 'visible' });
    await page.waitForLoadState('networkidle');
    await todayContext.close();
    const todayKb = scripts.reduce((sum, s) => sum + s.bytes, 0) / 1024;
    const encodings = [...new Set(scripts.map((s) => s.encoding))].join(', ');

    const warmContext = await signedInContext();
    await openLabel(warmContext); // fills the cache (and lets the service worker install)
    await openLabel(warmContext);
    const warm: number[] = [];
    for (let i = 0; i < RUNS; i++) warm.push(await openLabel(warmContext));
    await warmContext.close();

    const cold: number[] = [];
    for (let i = 0; i < RUNS; i++) {
      const context = await signedInContext();
      cold.push(await openLabel(context));
      await context.close();
    }

    const cpu = os.cpus();
    console.log(
      `Machine: ${cpu.length} cores (${cpu[0]?.model.trim()}), ${(os.totalmem() / 2 ** 30).toFixed(1)} GiB memory, Node ${process.version}; Chromium headless, loopback`,
    );
    console.log(
      `Today, first load (empty cache): ${scripts.length} scripts, ${todayKb.toFixed(1)} kB of JavaScript on the wire (${encodings}) — target ≤ ${TODAY_JS_TARGET_KB} kB: ${todayKb <= TODAY_JS_TARGET_KB ? 'OK' : 'MISS'}`,
    );
    for (const s of [...scripts].sort((a, b) => b.bytes - a.bytes).slice(0, 5))
      console.log(`  ${(s.bytes / 1024).toFixed(1).padStart(6)} kB  ${s.url.slice(base.length)}`);
    const warmMs = median(warm);
    const coldMs = median(cold);
    console.log(
      `Label URL to vessel shown, warm (${RUNS} runs, one context):   median ${warmMs.toFixed(0)} ms — target ≤ ${WARM_TARGET_MS} ms: ${warmMs <= WARM_TARGET_MS ? 'OK' : 'MISS'}`,
    );
    console.log(
      `Label URL to vessel shown, cold (${RUNS} runs, new context each): median ${coldMs.toFixed(0)} ms — target ≤ ${COLD_TARGET_MS} ms: ${coldMs <= COLD_TARGET_MS ? 'OK' : 'MISS'}`,
    );
  } finally {
    await browser.close();
    await new Promise((r) => {
      server.close(r);
      server.closeIdleConnections();
    });
  }
});
