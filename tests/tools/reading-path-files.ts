/**
 * Which of the project's files run when a Hand logs a reading from the Vessel page — counted by
 * the JavaScript engines themselves, not by reading the code. The worked example in DEVELOPERS.md
 * is the same path as a person follows it; this is the count without judgement.
 *
 * It starts a checkout's API server (with the V8 inspector on) and its Vite dev server (one module
 * per source file), signs in to the demo cellar in Debian's Chromium, opens a vessel that holds a
 * batch and logs one reading to warm everything up. Then, with both engines' call counters reset,
 * it logs a second reading — open the dialog, type a gravity, save, until the page shows it — and
 * lists every file of the checkout (src/, server/, shared/) with a function that ran. A quiet
 * window of the same length, measured just before, names what runs without anyone asking
 * (timers, pollers); those files are left out and listed apart. The server's scheduled jobs are
 * turned off, so that window holds only what no request can explain.
 *
 * `npm run measure:reading-path [checkout]` — by default this one. Any commit can be measured by
 * pointing it at a worktree of it (with node_modules linked), so the figure before a change and
 * after it are counted the same way.
 */
import { spawn, type ChildProcess } from 'node:child_process';
import fs from 'node:fs';
import os from 'node:os';
import path from 'node:path';
import { chromium, type CDPSession, type Page } from 'playwright-core';
import WebSocket from 'ws';
import { freePort } from '../helpers/app-process';
import { logReadingThroughDialog, signInThroughForm } from '../helpers/browser-steps';
import { CHROMIUM_ARGS, CHROMIUM_PATH } from './browser';

const checkout = path.resolve(process.argv[2] ?? path.join(import.meta.dirname, '../..'));
// The demo seed's Keeper (server/seed/demo.ts), the same in every checkout since the demo cellar began.
const DEMO_EMAIL = 'maren@fernhollow.test';
const DEMO_PASSWORD = 'demo-cellar-2026';
/** Long enough for the pollers (the mail outbox looks every few seconds) to show themselves. */
const QUIET_MS = 6000;

interface FunctionCoverage {
  functionName: string;
  ranges: { startOffset: number; endOffset: number; count: number }[];
}
interface ScriptCoverage {
  url: string;
  functions: FunctionCoverage[];
}

/** The checkout's own source files among the scripts, each with whether any of its functions ran. */
function filesThatRan(scripts: ScriptCoverage[], fileOf: (url: string) => string | null): Set<string> {
  const ran = new Set<string>();
  for (const script of scripts) {
    const file = fileOf(script.url);
    if (!file) continue;
    // The module's own top level (offset 0) runs once, at load; a function called is what counts.
    if (script.functions.some((f) => f.ranges[0]!.startOffset > 0 && f.ranges[0]!.count > 0)) ran.add(file);
  }
  return ran;
}

const SOURCE_DIRS = /^(src|server|shared)\//;

/** `file:///…/server/app.ts` → `server/app.ts`, for this checkout's files only. */
function serverFile(url: string): string | null {
  if (!url.startsWith('file://')) return null;
  const rel = path.relative(checkout, new URL(url).pathname);
  return SOURCE_DIRS.test(rel) ? rel : null;
}

/** `http://127.0.0.1:5190/src/pages/VesselPage.vue?t=…` → `src/pages/VesselPage.vue`. */
function clientFile(url: string): string | null {
  if (!url.startsWith('http')) return null;
  const { pathname, search } = new URL(url);
  // A .vue file's style part is a module of its own that only injects CSS.
  if (search.includes('type=style')) return null;
  const rel = pathname.replace(/^\//, '');
  return SOURCE_DIRS.test(rel) ? rel : null;
}

/** The Node inspector's Profiler, over its WebSocket. */
async function connectInspector(port: number): Promise<(method: string, params?: object) => Promise<Record<string, unknown>>> {
  let targets: { webSocketDebuggerUrl: string }[] = [];
  for (let i = 0; i < 100 && targets.length === 0; i++) {
    targets = await fetch(`http://127.0.0.1:${port}/json/list`)
      .then((r) => r.json() as Promise<typeof targets>)
      .catch(() => []);
    if (targets.length === 0) await new Promise((r) => setTimeout(r, 100));
  }
  const socket = new WebSocket(targets[0]!.webSocketDebuggerUrl);
  await new Promise((resolve, reject) => socket.once('open', resolve).once('error', reject));
  let nextId = 1;
  const waiting = new Map<number, (result: Record<string, unknown>) => void>();
  socket.on('message', (data) => {
    const message = JSON.parse(String(data)) as { id?: number; result?: Record<string, unknown> };
    if (message.id !== undefined) waiting.get(message.id)?.(message.result ?? {});
  });
  return (method, params = {}) =>
    new Promise((resolve) => {
      const id = nextId++;
      waiting.set(id, resolve);
      socket.send(JSON.stringify({ id, method, params }));
    });
}

/** Starts a process in the checkout and waits until `ready` answers. */
async function start(command: string, args: string[], env: Record<string, string>, ready: string): Promise<ChildProcess> {
  const child = spawn(command, args, { cwd: checkout, env: { ...process.env, ...env }, stdio: ['ignore', 'pipe', 'pipe'], detached: true });
  let output = '';
  child.stdout!.on('data', (d) => (output += String(d)));
  child.stderr!.on('data', (d) => (output += String(d)));
  for (let i = 0; i < 1200; i++) {
    if (child.exitCode !== null) throw new Error(`${command} ${args.join(' ')} stopped:\n${output}`);
    const answered = await fetch(ready).then(
      (r) => r.status < 500,
      () => false,
    );
    if (answered) return child;
    await new Promise((r) => setTimeout(r, 250));
  }
  throw new Error(`${ready} did not answer:\n${output}`);
}

/** Stops a started process and everything it started (the API server's PostgreSQL), forcibly after 10 s. */
async function stop(child: ChildProcess): Promise<void> {
  const signal = (name: NodeJS.Signals) => {
    try {
      process.kill(-child.pid!, name);
    } catch {
      // already gone
    }
  };
  signal('SIGTERM');
  const exited = new Promise((r) => (child.exitCode !== null || child.signalCode !== null ? r(null) : child.once('exit', r)));
  const late = setTimeout(() => signal('SIGKILL'), 10_000);
  await exited;
  clearTimeout(late);
}

/** Logs a reading through the dialog and waits until the page shows it. */
async function logReading(page: Page, sg: string): Promise<void> {
  await logReadingThroughDialog(page, sg);
  await page.waitForFunction((text) => document.querySelector('[data-test=last-reading-corrected]')?.textContent?.trim() === text, sg);
}

async function main(): Promise<void> {
  const [apiPort, pgPort, inspectorPort, clientPort] = await Promise.all([freePort(), freePort(), freePort(), freePort()]);
  const dataDir = fs.mkdtempSync(path.join(os.tmpdir(), 'cw-path-'));
  const processes: ChildProcess[] = [];
  const browser = await chromium.launch({ executablePath: CHROMIUM_PATH, headless: true, args: CHROMIUM_ARGS });
  try {
    processes.push(
      await start(
        process.execPath,
        [`--inspect=127.0.0.1:${inspectorPort}`, '--import', 'tsx', 'server/index.ts'],
        {
          PORT: String(apiPort),
          PG_PORT: String(pgPort),
          DATA_DIR: dataDir,
          TSX_TSCONFIG_PATH: 'tsconfig.server.json',
          // The reminder pass and the outbox worker run the same files as a request (the actor, the
          // unit of work, the journal's queries): left on, a pass in the quiet window would take
          // those files out of the count. Checkouts from before the mail work ignore both.
          REMINDER_CRON: 'off',
          MAIL_WORKER_INTERVAL_MS: '600000',
        },
        `http://127.0.0.1:${apiPort}/api/auth/me`,
      ),
    );
    const server = await connectInspector(inspectorPort);
    await server('Profiler.enable');
    await server('Profiler.startPreciseCoverage', { callCount: true, detailed: false });
    processes.push(
      await start(
        path.join(checkout, 'node_modules/.bin/vite'),
        ['--port', String(clientPort), '--strictPort', '--host', '127.0.0.1'],
        { API_URL: `http://127.0.0.1:${apiPort}` },
        `http://127.0.0.1:${clientPort}/`,
      ),
    );

    const base = `http://127.0.0.1:${clientPort}`;
    const page = await browser.newPage({ viewport: { width: 390, height: 844 } });
    page.setDefaultTimeout(60_000);
    await signInThroughForm(page, base, DEMO_EMAIL, DEMO_PASSWORD);
    const cellarId = new URL(page.url()).pathname.split('/')[2]!;
    const vessels = (await page.evaluate((url) => fetch(url).then((r) => r.json()), `/api/cellars/${cellarId}/vessels`)) as
      | { items?: { id: string; batchId?: string | null; batch?: { id: string } | null }[] }
      | { id: string; batchId?: string | null; batch?: { id: string } | null }[];
    const list = Array.isArray(vessels) ? vessels : (vessels.items ?? []);
    const vessel = list.find((v) => v.batchId ?? v.batch?.id);
    if (!vessel) throw new Error('The demo cellar has no vessel holding a batch.');
    await page.goto(`${base}/c/${cellarId}/vessels/${vessel.id}`);
    await page.waitForSelector('[data-test=action-reading]');

    const client: CDPSession = await page.context().newCDPSession(page);
    await client.send('Profiler.enable');
    await client.send('Profiler.startPreciseCoverage', { callCount: true, detailed: false });
    const takeBoth = async () => ({
      server: ((await server('Profiler.takePreciseCoverage')) as { result: ScriptCoverage[] }).result,
      client: ((await client.send('Profiler.takePreciseCoverage')) as { result: ScriptCoverage[] }).result,
    });
    // The reading's answer is held until both counters are read: what ran up to then is the way
    // from the dialog to the SQL; what runs after it, the page brought up to date.
    let toTheSql: Awaited<ReturnType<typeof takeBoth>> | null = null;
    let measuring = false;
    await page.route(/\/api\/cellars\/[^/]+\/batches\/[^/]+\/readings$/, async (route) => {
      // Sent again by Playwright, which leaves out the browser's own Sec-Fetch-Site (the app's cross-site guard asks for it).
      const response = await route.fetch({ headers: { ...route.request().headers(), 'sec-fetch-site': 'same-origin' } });
      if (!response.ok()) throw new Error(`The reading was refused: ${response.status()} ${await response.text()}`);
      if (measuring) toTheSql = await takeBoth();
      await route.fulfill({ response });
    });
    await logReading(page, '1.031');
    await page.waitForLoadState('networkidle');

    // Taking resets the counters: a quiet window, the reading in two parts, a quiet window.
    await takeBoth();
    await new Promise((r) => setTimeout(r, QUIET_MS));
    const quietBefore = await takeBoth();
    measuring = true;
    const started = Date.now();
    await logReading(page, '1.024');
    await page.waitForLoadState('networkidle');
    const took = Date.now() - started;
    const backToThePage = await takeBoth();
    await new Promise((r) => setTimeout(r, QUIET_MS));
    const quietAfter = await takeBoth();
    if (!toTheSql) throw new Error('The reading was not sent.');

    const quiet = new Set([
      ...filesThatRan(quietBefore.server, serverFile),
      ...filesThatRan(quietAfter.server, serverFile),
      ...filesThatRan(quietBefore.client, clientFile),
      ...filesThatRan(quietAfter.client, clientFile),
    ]);
    const ranIn = (window: Awaited<ReturnType<typeof takeBoth>>) =>
      new Set([...filesThatRan(window.server, serverFile), ...filesThatRan(window.client, clientFile)].filter((f) => !quiet.has(f)));
    const report = (title: string, files: Set<string>) => {
      const under = (dir: string) => [...files].filter((f) => f.startsWith(dir)).length;
      console.log(`\n${title}: ${files.size} files (src/ ${under('src/')}, server/ ${under('server/')}, shared/ ${under('shared/')})`);
      for (const f of [...files].sort()) console.log(`  ${f}`);
    };
    console.log(`Checkout ${checkout}: a reading logged from the Vessel page (${took} ms, dialog to page).`);
    const first = ranIn(toTheSql);
    const second = ranIn(backToThePage);
    report('From the dialog to the SQL (the click, the form, the request and the server until it answers)', first);
    report('Back to the page (the answer shown, and whatever the page asks for after it)', second);
    console.log(`\nIn all: ${new Set([...first, ...second]).size} files.`);
    console.log(`Left out, as they ran with nobody asking too: ${[...quiet].sort().join(', ') || 'none'}.`);
  } finally {
    await browser.close();
    for (const p of processes.reverse()) await stop(p);
    fs.rmSync(dataDir, { recursive: true, force: true });
  }
}

await main();
