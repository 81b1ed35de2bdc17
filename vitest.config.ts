import { defineConfig, mergeConfig } from 'vitest/config';
import viteConfig from './vite.config.ts';

/**
 * Three tiers: `unit` (pure code: shared/calc, helpers), `db` (API over HTTP against the
 * in-process app and a real PostgreSQL started by the global setup, plus Chromium end-to-end)
 * and `client` (Vue components and composables in happy-dom, the network faked at `fetch`).
 */
export default mergeConfig(
  viteConfig,
  defineConfig({
    // TypeORM entities use legacy decorators with metadata.
    oxc: { decorator: { legacy: true, emitDecoratorMetadata: true } },
    test: {
      projects: [
        {
          extends: true,
          test: { name: 'unit', include: ['tests/calc/**/*.test.ts', 'tests/unit/**/*.test.ts'], environment: 'node' },
        },
        {
          extends: true,
          test: {
            name: 'db',
            include: ['tests/api/**/*.test.ts', 'tests/e2e/**/*.test.ts'],
            environment: 'node',
            globalSetup: ['tests/setup/global-setup.ts'],
            testTimeout: 30_000,
            hookTimeout: 60_000,
          },
        },
        {
          extends: true,
          test: { name: 'client', include: ['tests/client/**/*.test.ts'], environment: 'happy-dom', setupFiles: ['tests/client/support/setup.ts'] },
        },
      ],
    },
  }),
);
