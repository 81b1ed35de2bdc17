import type { RuntimeCaching } from 'workbox-build';
import { RECORDS_CACHE } from '../src/offline/cache-names';
/** How long a page waits for the network before it shows the record last seen. */
const NETWORK_TIMEOUT_SECONDS = 4;
const DAY_SECONDS = 86_400;

/**
 * What the service worker keeps at run time. Only GETs of a cellar's records (Today, vessels,
 * batches and their pages, racks, lots, cases, tasks, settings) and label look-ups: never
 * sign-in or session answers, never a write, never photos or downloads. Network first, so a
 * phone with signal always sees the server's answer.
 */
export const runtimeCaching: RuntimeCaching[] = [
  {
    urlPattern: /^https?:\/\/[^/]+\/api\/cellars\/[^/]+\/(?:today|vessels|batches|racks|lots|cases|tasks|settings)(?![^?]*\/photos)(?:[/?]|$)/,
    method: 'GET',
    handler: 'NetworkFirst',
    options: {
      cacheName: RECORDS_CACHE,
      networkTimeoutSeconds: NETWORK_TIMEOUT_SECONDS,
      expiration: { maxEntries: 400, maxAgeSeconds: 30 * DAY_SECONDS },
      cacheableResponse: { statuses: [200] },
    },
  },
  {
    urlPattern: /^https?:\/\/[^/]+\/api\/scan\/[^/?]+$/,
    method: 'GET',
    handler: 'NetworkFirst',
    options: {
      cacheName: RECORDS_CACHE,
      networkTimeoutSeconds: NETWORK_TIMEOUT_SECONDS,
      expiration: { maxEntries: 400, maxAgeSeconds: 30 * DAY_SECONDS },
      cacheableResponse: { statuses: [200] },
    },
  },
  {
    // A label URL opened without signal: the app shell, which finds the record in what it kept.
    urlPattern: ({ request, url }) => request.mode === 'navigate' && url.pathname.startsWith('/s/'),
    handler: 'NetworkOnly',
    options: { precacheFallback: { fallbackURL: 'index.html' } },
  },
];
