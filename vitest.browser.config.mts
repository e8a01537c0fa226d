import path from 'node:path';
import { defineConfig } from 'vitest/config';

// Browser tests: playwright-core drives Debian's Chromium against the built app.
export default defineConfig({
  resolve: {
    alias: {
      '@': path.resolve(import.meta.dirname, '.'),
      'server-only': path.resolve(import.meta.dirname, 'tests/support/empty.ts'),
    },
  },
  test: {
    include: ['tests/browser/**/*.test.ts'],
    environment: 'node',
    globalSetup: ['tests/support/global-setup.ts'],
    testTimeout: 120_000,
    hookTimeout: 300_000,
    fileParallelism: false,
    // Pages answer slower on a loaded 2-core machine: poll for up to 15 s, not 1 s.
    expect: { poll: { timeout: 15_000, interval: 100 } },
  },
});
