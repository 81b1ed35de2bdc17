import type { RequestHandler } from 'express';
import expressStaticGzip from 'express-static-gzip';
import type { ServerResponse } from 'node:http';
import path from 'node:path';

/** Vite names everything under /assets by its content hash: a changed file gets a new name. */
const HASHED = /^assets\//;

/** A year, and never revalidated: the name changes when the content does. */
export const HASHED_CACHE = 'public, max-age=31536000, immutable';
/** Everything else (index.html, the service worker, its registration, the manifest): asked again on each use. */
export const UNHASHED_CACHE = 'no-cache';

/**
 * The built client (dist/): the brotli or gzip file the build made beside each asset when the
 * browser accepts it (Content-Encoding and Vary set), hashed files cached for good, the rest
 * revalidated every time so a new version is found at once.
 */
export function clientAssets(clientDir: string): RequestHandler {
  const root = path.resolve(clientDir);
  return expressStaticGzip(root, {
    enableBrotli: true,
    orderPreference: ['br', 'gzip'],
    index: false,
    serveStatic: {
      index: false,
      cacheControl: false,
      setHeaders: (res: ServerResponse, filePath: string) => {
        const url = path.relative(root, filePath).split(path.sep).join('/');
        res.setHeader('Cache-Control', HASHED.test(url) ? HASHED_CACHE : UNHASHED_CACHE);
      },
    },
  });
}

/** The app shell (index.html, compressed when it can be) for every client-side route. */
export function clientShell(clientDir: string): RequestHandler {
  const assets = clientAssets(clientDir);
  return (req, res, next) => {
    req.url = '/index.html';
    assets(req, res, next);
  };
}
