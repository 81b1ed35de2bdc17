import { createHash } from 'node:crypto';
import fs from 'node:fs';
import path from 'node:path';

/**
 * CSP sources that allow exactly the inline scripts of the index.html this app serves — the
 * early-requests script (shared/early-requests.ts, put there at build by pwa/first-load.ts) —
 * by their SHA-256, read from the built file, so the policy always matches what is sent.
 * Data blocks (`<script type="application/json">`) run nothing and need no source.
 * @param clientDir - the built client; none for an API-only app
 */
export function inlineScriptHashes(clientDir: string | undefined): string[] {
  const file = clientDir && path.join(clientDir, 'index.html');
  if (!file || !fs.existsSync(file)) return [];
  const html = fs.readFileSync(file, 'utf8');
  return [...html.matchAll(/<script>([\s\S]*?)<\/script>/g)].map((m) => `'sha256-${createHash('sha256').update(m[1]!).digest('base64')}'`);
}
