/*
 * Imported by the service worker (pwa/pwa-plugins.ts, workbox importScripts). Requests these
 * routes match never wake the worker's script, which on a phone shares the CPU with the page:
 * - hashed client files never change: straight from the precache (a file not in it goes to the
 *   network);
 * - the session's requests (/api/auth/…) are never kept for offline use (pwa/runtime-caching.ts),
 *   so the worker had nothing to add to them: straight to the network.
 * Browsers without static routing ignore this and the worker's own routes serve them as before.
 */
self.addEventListener('install', (event) => {
  if (typeof event.addRoutes !== 'function' || typeof URLPattern !== 'function') return;
  event.waitUntil(
    event
      .addRoutes([
        { condition: { urlPattern: new URLPattern({ pathname: '/assets/*' }) }, source: 'cache' },
        { condition: { urlPattern: new URLPattern({ pathname: '/api/auth/*' }) }, source: 'network' },
      ])
      .catch(() => undefined),
  );
});
