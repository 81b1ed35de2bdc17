import express, { type Router } from 'express';
import fs from 'node:fs';
import path from 'node:path';

/**
 * Files of the installable app that must never be kept by a browser's HTTP cache: the service
 * worker (a cached copy would hide a new version for as long as the cache lives; browsers check
 * it on every navigation only if it is not cached) and the manifest. Mounted before the static
 * files, which are cached for an hour.
 */
const UNCACHED_FILES: Record<string, string> = {
  '/sw.js': 'text/javascript; charset=utf-8',
  '/manifest.webmanifest': 'application/manifest+json; charset=utf-8',
};

export function appShellFiles(clientDir: string): Router {
  const router = express.Router();
  for (const [route, type] of Object.entries(UNCACHED_FILES)) {
    const file = path.join(clientDir, route);
    router.get(route, (_req, res, next) => {
      if (!fs.existsSync(file)) return next();
      res.set({ 'Cache-Control': 'no-cache', 'Content-Type': type, 'Service-Worker-Allowed': '/' });
      res.sendFile(file);
    });
  }
  return router;
}
