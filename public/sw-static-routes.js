/*
 * Imported by the service worker (pwa/pwa-plugins.ts, workbox importScripts). Hashed client files
 * never change, so the browser takes them straight from the precache without waking the worker's
 * script for each of the dozens a page loads; a file not in the cache goes to the network.
 * Browsers without static routing ignore this and the worker's own precache route serves them.
 */
self.addEventListener('install', (event) => {
  if (typeof event.addRoutes !== 'function' || typeof URLPattern !== 'function') return;
  event.waitUntil(
    event.addRoutes([{ condition: { urlPattern: new URLPattern({ pathname: '/assets/*' }) }, source: 'cache' }]).catch(() => undefined),
  );
});
