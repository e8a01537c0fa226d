import path from 'node:path';
import { defineConfig } from 'vitest/config';

const alias = {
  '@': path.resolve(import.meta.dirname, '.'),
  // Next enforces server-only at build time; under vitest it is a no-op.
  'server-only': path.resolve(import.meta.dirname, 'tests/support/empty.ts'),
};

/**
 * `npm test`: the unit project (engine, units, db, lib) and the api project,
 * which builds the app once and serves it on a throw-away database.
 * `npx vitest run --project unit` skips the build. Browser tests: vitest.browser.config.ts.
 */
export default defineConfig({
  resolve: { alias },
  test: {
    projects: [
      {
        resolve: { alias },
        test: {
          name: 'unit',
          include: ['tests/**/*.test.ts'],
          exclude: ['tests/api/**', 'tests/browser/**', 'node_modules/**'],
          environment: 'node',
          testTimeout: 60_000,
        },
      },
      {
        resolve: { alias },
        test: {
          name: 'api',
          include: ['tests/api/**/*.test.ts'],
          environment: 'node',
          globalSetup: ['tests/support/global-setup.ts'],
          testTimeout: 60_000,
          hookTimeout: 300_000,
        },
      },
    ],
  },
});
