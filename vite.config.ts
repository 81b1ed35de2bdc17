import { fileURLToPath, URL } from 'node:url';
import { defineConfig } from 'vite';
import vue from '@vitejs/plugin-vue';
import { quasar, transformAssetUrls } from '@quasar/vite-plugin';
import { pwaPlugins } from './pwa/pwa-plugins';
import { compression } from 'vite-plugin-compression2';
import { firstLoad } from './pwa/first-load';

const apiTarget = process.env.API_URL ?? 'http://127.0.0.1:8460';

// The client is built into dist/ and served by the Express app; `npm run dev:client`
// proxies /api to a server started with `npm run dev:server`.
export default defineConfig({
  plugins: [
    vue({ template: { transformAssetUrls } }),
    // No Sass: Quasar's prebuilt CSS is imported in src/main.ts.
    quasar({ sassVariables: false }),
    // The first page's session, record and code are asked for while the entry loads (pwa/first-load.ts).
    firstLoad(),
    // Installable app: manifest, icons, service worker (pwa/).
    ...pwaPlugins(),
    // Brotli and gzip copies beside each file, served by server/http/client-assets.ts.
    // Small files too (a page loads dozens of chunks under 1 kB); a copy that is not smaller is skipped.
    compression({ algorithms: ['brotliCompress', 'gzip'], threshold: 0, exclude: [/\.(png|jpe?g|webp|woff2?)$/] }),
  ],
  resolve: {
    alias: {
      '@': fileURLToPath(new URL('./src', import.meta.url)),
      '@shared': fileURLToPath(new URL('./shared', import.meta.url)),
    },
  },
  server: {
    host: '127.0.0.1',
    proxy: { '/api': apiTarget, '/s/': apiTarget },
  },
  build: {
    outDir: 'dist',
    chunkSizeWarningLimit: 900,
    rolldownOptions: {
      output: {
        // Everything the entry imports statically is loaded on every first visit anyway: one file
        // compresses better than the dozen small shared chunks it was split into (Today: ~5 kB less).
        codeSplitting: { groups: [{ name: 'index', tags: ['$initial'] }] },
      },
    },
  },
});
