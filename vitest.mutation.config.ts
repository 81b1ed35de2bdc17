import { fileURLToPath, URL } from 'node:url';
import { defineConfig } from 'vitest/config';

/**
 * The database-free tests alone (shared/calc and the pure unit tier), for the mutation run
 * (`npm run test:mutation`): no PostgreSQL, no browser, no Vue plugins.
 */
export default defineConfig({
  // The unit tier loads server modules whose TypeORM entities use legacy decorators.
  oxc: { decorator: { legacy: true, emitDecoratorMetadata: true } },
  resolve: {
    alias: { '@shared': fileURLToPath(new URL('./shared', import.meta.url)) },
  },
  test: {
    include: ['tests/calc/**/*.test.ts', 'tests/unit/**/*.test.ts'],
    environment: 'node',
  },
});
