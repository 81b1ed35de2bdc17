import fs from 'node:fs';
import os from 'node:os';
import path from 'node:path';
import { chromium, type BrowserContext } from 'playwright-core';

/** Debian's Chromium; never a browser downloaded by a test tool. */
export const CHROMIUM_PATH = process.env.CHROMIUM_PATH ?? '/usr/bin/chromium';

/** Flags that keep Chromium from reaching out to the network on its own (this machine has none). */
export const CHROMIUM_ARGS = [
  '--no-sandbox',
  '--disable-gpu',
  '--disable-quic',
  '--no-first-run',
  '--disable-background-networking',
  '--disable-component-update',
  '--disable-sync',
  '--disable-dev-shm-usage',
];

export function chromiumAvailable(): boolean {
  return fs.existsSync(CHROMIUM_PATH);
}

/**
 * Starts headless Chromium with a fresh profile. The flags keep it from reaching out to
 * the network on its own (this machine has none, and the page must not need any).
 */
export async function launchBrowser(
  options: { serviceWorkers?: 'allow' | 'block'; fakeCameraVideo?: string } = {},
): Promise<{ context: BrowserContext; close: () => Promise<void> }> {
  const profile = fs.mkdtempSync(path.join(os.tmpdir(), 'cw-chromium-'));
  // A camera that films a video file (Y4M), allowed without asking: for tests of the in-app scanner.
  const camera = options.fakeCameraVideo
    ? ['--use-fake-device-for-media-stream', '--use-fake-ui-for-media-stream', `--use-file-for-fake-video-capture=${options.fakeCameraVideo}`]
    : [];
  const context = await chromium.launchPersistentContext(profile, {
    executablePath: CHROMIUM_PATH,
    headless: true,
    serviceWorkers: options.serviceWorkers ?? 'allow',
    args: [...CHROMIUM_ARGS, ...camera],
  });
  return {
    context,
    close: async () => {
      await context.close();
      fs.rmSync(profile, { recursive: true, force: true });
    },
  };
}
