import type { Server } from 'node:http';
import type { AddressInfo } from 'node:net';
import path from 'node:path';
import fs from 'node:fs';
import type { BrowserContext } from 'playwright-core';
import { afterAll, beforeAll, describe } from 'vitest';
import { chromiumAvailable, launchBrowser } from '../tools/browser';
import { testApp } from './test-app';

const distDir = path.resolve(import.meta.dirname, '../../dist');

/**
 * Runs an end-to-end suite against the built client (dist/) served by the real app on a
 * loopback port, in Debian's Chromium. Without Chromium the suite is skipped locally but
 * fails under CI=true.
 * @param options.serviceWorkers - 'block' (the default) for suites that do not test working
 *   offline: otherwise every fresh page installs the service worker and precaches the whole
 *   client (about 2 MB) while the test runs, which on a loaded 2-core machine starved the
 *   test's own work. The offline suite passes 'allow'.
 */
export function describeInBrowser(name: string, body: (env: () => BrowserEnv) => void, options: { serviceWorkers?: 'allow' | 'block' } = {}): void {
  const missing = !chromiumAvailable()
    ? 'Chromium (/usr/bin/chromium)'
    : !fs.existsSync(path.join(distDir, 'index.html'))
      ? 'the built client (run `npm run build`)'
      : null;
  if (missing && process.env.CI !== 'true') {
    describe.skip(`${name} (needs ${missing})`, () =>
      body(() => {
        throw new Error('skipped');
      }));
    return;
  }
  describe(name, () => {
    let env: BrowserEnv | undefined;
    let server: Server;
    let closeBrowser: () => Promise<void>;
    beforeAll(async () => {
      if (missing) throw new Error(`End-to-end tests need ${missing}; .ci/run installs it.`);
      const { app, ds } = await testApp({ clientDir: distDir });
      server = await new Promise<Server>((resolve) => {
        const s = app.listen(0, '127.0.0.1', () => resolve(s));
      });
      const baseUrl = `http://127.0.0.1:${(server.address() as AddressInfo).port}`;
      const browser = await launchBrowser({ serviceWorkers: options.serviceWorkers ?? 'block' });
      closeBrowser = browser.close;
      env = { baseUrl, context: browser.context, ds };
    });
    afterAll(async () => {
      await closeBrowser?.();
      await new Promise((resolve) => server?.close(resolve));
    });
    body(() => {
      if (!env) throw new Error('browser environment not ready');
      return env;
    });
  });
}

export interface BrowserEnv {
  baseUrl: string;
  context: BrowserContext;
  ds: Awaited<ReturnType<typeof testApp>>['ds'];
}

export { chooseFromMenu, signInThroughForm } from './browser-steps';
