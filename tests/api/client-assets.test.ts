import fs from 'node:fs';
import os from 'node:os';
import path from 'node:path';
import zlib from 'node:zlib';
import request from 'supertest';
import { beforeAll, describe, expect, it } from 'vitest';
import { testApp } from '../helpers/test-app';

/**
 * A built client in miniature, as `vite build` leaves it (hashed files under assets/, each with
 * a .br and .gz copy beside it), so the serving is checked without a build.
 */
function miniClient(): string {
  const dir = fs.mkdtempSync(path.join(os.tmpdir(), 'cw-client-'));
  const files: Record<string, string> = {
    'index.html': '<!doctype html><title>Cellarwright</title><script type="module" src="/assets/index-AbC123.js"></script>',
    'assets/index-AbC123.js': `export const words = ${JSON.stringify('cellar '.repeat(400))};`,
    'favicon.svg': '<svg xmlns="http://www.w3.org/2000/svg"/>',
  };
  for (const [name, text] of Object.entries(files)) {
    const file = path.join(dir, name);
    fs.mkdirSync(path.dirname(file), { recursive: true });
    fs.writeFileSync(file, text);
    if (name.endsWith('.svg')) continue;
    fs.writeFileSync(`${file}.br`, zlib.brotliCompressSync(text));
    fs.writeFileSync(`${file}.gz`, zlib.gzipSync(text));
  }
  return dir;
}

describe('the built client', () => {
  let app: Awaited<ReturnType<typeof testApp>>['app'];
  let clientDir: string;
  beforeAll(async () => {
    clientDir = miniClient();
    ({ app } = await testApp({ clientDir }));
  });

  it('sends the brotli copy of a hashed file to a browser that takes it, cached for a year', async () => {
    const res = await request(app).get('/assets/index-AbC123.js').set('Accept-Encoding', 'gzip, deflate, br');
    expect(res.status).toBe(200);
    expect(res.headers['content-encoding']).toBe('br');
    expect(res.headers['vary']).toMatch(/Accept-Encoding/);
    expect(res.headers['content-type']).toMatch(/javascript/);
    expect(res.headers['cache-control']).toBe('public, max-age=31536000, immutable');
    // The bytes sent are the brotli file's, far fewer than the plain file's.
    const sizeOf = (name: string) => fs.statSync(path.join(clientDir, name)).size;
    expect(Number(res.headers['content-length'])).toBe(sizeOf('assets/index-AbC123.js.br'));
    expect(sizeOf('assets/index-AbC123.js.br')).toBeLessThan(sizeOf('assets/index-AbC123.js') / 10);
  });

  it('sends gzip to a browser without brotli, and the plain file to one without either', async () => {
    const gzip = await request(app).get('/assets/index-AbC123.js').set('Accept-Encoding', 'gzip');
    expect(gzip.headers['content-encoding']).toBe('gzip');
    const plain = await request(app).get('/assets/index-AbC123.js').set('Accept-Encoding', 'identity');
    expect(plain.headers['content-encoding']).toBeUndefined();
    expect(plain.text).toContain('cellar cellar');
  });

  it('has the app shell and unhashed files asked again on every use', async () => {
    for (const url of ['/c/some-cellar/today', '/index.html', '/favicon.svg']) {
      const res = await request(app).get(url).set('Accept-Encoding', 'gzip');
      expect(res.status, url).toBe(200);
      expect(res.headers['cache-control'], url).toBe('no-cache');
    }
    const shell = await request(app).get('/c/some-cellar/today').set('Accept-Encoding', 'gzip');
    expect(shell.headers['content-encoding']).toBe('gzip');
    expect(shell.text).toContain('<title>Cellarwright</title>');
  });
});
