import type { PluginOption } from 'vite';
import { VitePWA, type ManifestOptions } from 'vite-plugin-pwa';
import { brandColours } from '../shared/palette';
import { APP_ICONS, appIcons } from './app-icons';
import { runtimeCaching } from './runtime-caching';

/** The page background of src/css/app.css: what shows while the installed app starts. */
const PARCHMENT = '#f5f2ec';

const manifest: Partial<ManifestOptions> = {
  id: '/',
  name: 'Cellarwright',
  short_name: 'Cellarwright',
  description: 'Cellar inventory and ageing planner for mead, wine and cider makers',
  lang: 'en',
  start_url: '/',
  scope: '/',
  display: 'standalone',
  orientation: 'any',
  theme_color: brandColours.primary,
  background_color: PARCHMENT,
  icons: APP_ICONS,
};

/**
 * The installable app: the manifest, our icons (drawn at build, pwa/app-icons.ts) and a
 * service worker that precaches the app shell and keeps the cellar records last seen
 * (pwa/runtime-caching.ts). The worker waits for the person to accept a new version
 * (src/offline/app-update.ts shows the prompt); the first one takes the page at once.
 * Off under Vitest, whose client tests import no service worker.
 */
export function pwaPlugins(): PluginOption[] {
  return [
    appIcons(),
    VitePWA({
      disable: Boolean(process.env.VITEST),
      registerType: 'prompt',
      injectRegister: false,
      includeManifestIcons: false,
      manifest,
      workbox: {
        globPatterns: ['**/*.{js,css,html,svg,png,woff2}'],
        // Big chunks (the chart, the scanner) are precached too: the cellar has no signal.
        maximumFileSizeToCacheInBytes: 4 * 1024 * 1024,
        navigateFallback: '/index.html',
        // Server pages and downloads are never answered by the app shell.
        navigateFallbackDenylist: [/^\/api\//, /^\/s\//, /^\/calendar\//],
        clientsClaim: true,
        cleanupOutdatedCaches: true,
        runtimeCaching,
        // Hashed files straight from the precache, without the worker's script (public/sw-static-routes.js);
        // a Vessel or Batch page's record asked for as the worker serves the page (public/sw-early-record.js).
        importScripts: ['sw-static-routes.js', 'sw-early-record.js'],
      },
    }),
  ];
}
