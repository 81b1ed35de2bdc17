/**
 * Browser benchmark on the large cellar (tests/bench/large-cellar.ts), in Debian's Chromium
 * against the built client (dist/) served by the real app, in its own process, on a loopback port:
 *
 * - Today's first load with an empty cache: the JavaScript bytes on the wire (compressed as
 *   sent), target ≤ 150 kB;
 * - a vessel's printed label URL (/s/:code) opened signed in, until the record is on screen —
 *   the vessel's name, in its first glance (shared/first-glance-script.ts) or on the app's page,
 *   whichever paints first: the median of runs in one warm browser context (target ≤ 400 ms) and
 *   of runs each in a new context with an empty cache (target ≤ 1,200 ms); beside it, when the
 *   app's whole page was on screen (the glance gone), which has no target of its own;
 * - the floor: a static page with one heading, behind the same kind of redirect, from a bare
 *   Node server in the same browser — what a new page load costs here before any app.
 *
 * A script, not a test: `npx vite build && npm run bench:scan`.
 */
import 'reflect-metadata';
import fs from 'node:fs';
import http from 'node:http';
import os from 'node:os';
import path from 'node:path';
import { performance } from 'node:perf_hooks';
import { chromium, type Browser, type BrowserContext } from 'playwright-core';
import { SESSION_COOKIE } from '../../server/app';
import { freePort, startAppProcess } from '../helpers/app-process';
import { CHROMIUM_ARGS, CHROMIUM_PATH, chromiumAvailable } from '../tools/browser';
import { withBenchDatabase } from './bench-database';
import { BENCH_EMAIL, BENCH_PASSWORD, seedLargeCellar } from './large-cellar';

const RUNS = Number(process.env.BENCH_SCAN_RUNS ?? 20);
const WARM_TARGET_MS = 400;
const COLD_TARGET_MS = 1200;
const TODAY_JS_TARGET_KB = 150;

// The app serves the client built in dist/.
const clientDir = path.resolve(import.meta.dirname, '../../dist');
if (!fs.existsSync(path.join(clientDir, 'index.html'))) throw new Error(`No built client in ${clientDir}: run \`npx vite build\` first.`);
if (!chromiumAvailable()) throw new Error(`No Chromium at ${CHROMIUM_PATH}.`);

const median = (xs: number[]) => [...xs].sort((a, b) => a - b)[Math.floor(xs.length / 2)]!;

await withBenchDatabase(async ({ ds, dir }) => {
  const cellar = await seedLargeCellar(ds);
  // The app in a process of its own, as `npm start` runs it: the browser driver's event loop
  // (every request of every page reported to it) is not the server's.
  const app = await startAppProcess({ databaseUrl: (ds.options as { url: string }).url, port: await freePort(), dataDir: path.join(dir, 'app') });
  const base = app.baseUrl;
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
  /**
   * Waits until a new page of the context is controlled by an activated service worker (whose
   * install, the precache, has then finished). Says what it found; blocked workers are none.
   */
  const untilServiceWorkerControls = async (context: BrowserContext): Promise<string> => {
    if (process.env.BENCH_SCAN_NO_SW) return 'blocked';
    const page = await context.newPage();
    await page.goto(`${base}/c/${cellar.cellarId}/today`);
    const state = await page.evaluate(async () => {
      const registration = await navigator.serviceWorker.ready;
      return registration.active?.state ?? 'none';
    });
    await page.close();
    const check = await context.newPage();
    await check.goto(`${base}/c/${cellar.cellarId}/today`);
    const controlled = await check.evaluate(() => navigator.serviceWorker.controller !== null);
    await check.close();
    return controlled ? `active (${state}), controlling` : `not controlling (${state})`;
  };

  /**
   * Opens the label URL and answers the milliseconds from the start of that navigation (the
   * page's time origin, before the /s/ redirect) to the first animation frame in which the
   * vessel's name is on screen (`recordMs`: the first glance's or the page's) and to the first
   * in which the app's page shows it with the glance gone (`pageMs`), read in the page.
   * Playwright's own waitFor checks at growing intervals (20, 50, 100, 100, then every 500 ms),
   * so timing with it measured its schedule more than the page: it is used only for the wall
   * time printed beside, as a cross-check.
   */
  const openLabel = async (context: BrowserContext): Promise<{ recordMs: number; pageMs: number; wallMs: number }> => {
    const page = await context.newPage();
    const start = performance.now();
    // BENCH_SCAN_TRACE=1 prints when each request of the run finished (where the time goes).
    if (process.env.BENCH_SCAN_TRACE) {
      const at = () => (performance.now() - start).toFixed(0).padStart(5);
      page.on('request', (r) => console.log(`  ${at()} ms  → ${r.method()} ${r.url().slice(base.length)}`));
      page.on('requestfinished', (r) => console.log(`  ${at()} ms  ← ${r.method()} ${r.url().slice(base.length)}`));
    }
    await page.goto(`${base}/s/${cellar.code}`, { waitUntil: 'commit' });
    const shown = await page.waitForFunction(
      () => {
        // One name on screen per selector (no named helpers: the function runs in the page as written).
        const [glance, title] = ['[data-test=glance-title]', '[data-test=vessel-title]'].map((selector) => {
          const heading = document.querySelector(selector);
          const box = heading?.getBoundingClientRect();
          return Boolean(heading?.textContent?.trim() && box && box.width > 0 && box.height > 0);
        });
        const seen = window as unknown as { benchRecordAt?: number; benchPageAt?: number };
        const now = performance.now();
        if (seen.benchRecordAt === undefined && (glance || title)) seen.benchRecordAt = now;
        if (seen.benchPageAt === undefined && title && !document.getElementById('first-glance')) seen.benchPageAt = now;
        return seen.benchPageAt !== undefined ? [seen.benchRecordAt ?? now, seen.benchPageAt] : false;
      },
      undefined,
      { polling: 'raf', timeout: 30_000 },
    );
    const [recordMs, pageMs] = (await shown.jsonValue()) as [number, number];
    const wallMs = performance.now() - start;
    // In the page: the browser's Navigation Timing (Node's typings know only their own performance).
    const redirected = await page.evaluate(
      () =>
        (performance as unknown as { getEntriesByType(type: string): { redirectCount: number }[] }).getEntriesByType('navigation')[0]!.redirectCount,
    );
    if (process.env.BENCH_SCAN_TRACE) {
      // The same run from the page's clock: the navigation's phases and each API request's start/sent/first byte/end.
      // A string, not a function: tsx would wrap the page's named helpers in its own __name.
      const phases = (await page.evaluate(`(() => {
        const round = (n) => Math.round(Number(n));
        const nav = performance.getEntriesByType('navigation')[0];
        const marks = ['redirectEnd', 'fetchStart', 'workerStart', 'responseStart', 'responseEnd', 'domInteractive', 'domContentLoadedEventEnd'];
        const requests = performance
          .getEntriesByType('resource')
          .filter((r) => r.name.includes('/api/'))
          .map((r) => new URL(r.name).pathname.replace(/[0-9a-f-]{36}/g, ':id') + ' ' + [r.startTime, r.requestStart, r.responseStart, r.responseEnd].map(round).join('/'));
        return [marks.map((m) => m + ' ' + round(nav[m])).join(', '), ...requests];
      })()`)) as string[];
      console.log(`  page clock: ${phases.join('\n              ')}\n  record on screen ${Math.round(recordMs)}, page ${Math.round(pageMs)}`);
    }
    if (redirected !== 1) throw new Error(`expected the label's one redirect inside the measured navigation, saw ${redirected}`);
    if (!page.url().includes(`/vessels/${cellar.vesselId}`)) throw new Error(`label opened ${page.url()}`);
    await page.close();
    return { recordMs, pageMs, wallMs };
  };

  /** The floor: a static page with one heading, behind a redirect, from a bare Node server (new context, warm). */
  const staticFloorMs = async (): Promise<number> => {
    const floorServer = http.createServer((req, res) => {
      if (req.url === '/s/floor') res.writeHead(302, { location: '/floor', 'cache-control': 'no-store' }).end();
      else
        res
          .writeHead(200, { 'content-type': 'text/html' })
          .end(
            '<!doctype html><html lang="en"><head><meta charset="utf-8"><title>Floor</title></head><body><h1 data-test="vessel-title">Jug 4</h1></body></html>',
          );
    });
    const port = await freePort();
    await new Promise<void>((resolve) => floorServer.listen(port, '127.0.0.1', resolve));
    const context = await browser.newContext({ viewport: { width: 390, height: 844 } });
    const times: number[] = [];
    try {
      for (let i = 0; i < RUNS + 1; i++) {
        const page = await context.newPage();
        await page.goto(`http://127.0.0.1:${port}/s/floor`, { waitUntil: 'commit' });
        const shown = await page.waitForFunction(
          () => {
            const box = document.querySelector('[data-test=vessel-title]')?.getBoundingClientRect();
            return box && box.width > 0 ? performance.now() : false;
          },
          undefined,
          { polling: 'raf', timeout: 30_000 },
        );
        if (i > 0) times.push(Number(await shown.jsonValue())); // the first fills the cache
        await page.close();
      }
    } finally {
      await context.close();
      floorServer.close();
    }
    return median(times);
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
    // Warm is a returning phone: the installed app's service worker active and its precache
    // complete, not still downloading the client in the background while the runs are timed.
    const serviceWorker = await untilServiceWorkerControls(warmContext);
    await openLabel(warmContext);
    type Run = Awaited<ReturnType<typeof openLabel>>;
    const warm: Run[] = [];
    for (let i = 0; i < RUNS; i++) warm.push(await openLabel(warmContext));
    await warmContext.close();

    const cold: Run[] = [];
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
    const floorMs = await staticFloorMs();
    const report = (label: string, runs: Run[], target: number) => {
      const recordMs = median(runs.map((r) => r.recordMs));
      const pageMs = median(runs.map((r) => r.pageMs));
      const wallMs = median(runs.map((r) => r.wallMs));
      console.log(
        `Label URL to record on screen, ${label}: median ${recordMs.toFixed(0)} ms — target ≤ ${target} ms: ${recordMs <= target ? 'OK' : 'MISS'}; ` +
          `the app's whole page ${pageMs.toFixed(0)} ms (wall time with Playwright's polling ${wallMs.toFixed(0)} ms)`,
      );
    };
    report(`warm (${RUNS} runs, one context, service worker ${serviceWorker})`, warm, WARM_TARGET_MS);
    report(`cold (${RUNS} runs, new context each)`, cold, COLD_TARGET_MS);
    console.log(`Floor, a static page with one heading behind a redirect (${RUNS} runs, warm): median ${floorMs.toFixed(0)} ms`);
    console.log("(the record on screen: the vessel's name, contents and place in its first glance, or on the page if that paints first)");
  } finally {
    await browser.close();
    await app.kill('SIGTERM');
  }
});
