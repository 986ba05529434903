import { defineConfig } from 'vitest/config';
import path from 'node:path';

// API and browser suites: they talk to the built app, served by tests/support/server-setup.ts
// on its own port with the test database.
export default defineConfig({
  resolve: {
    alias: {
      '@': path.resolve(__dirname),
      'server-only': path.resolve(__dirname, 'tests/support/empty-module.ts'),
    },
  },
  test: {
    include: ['tests/api/**/*.test.ts', 'tests/e2e/**/*.test.ts'],
    environment: 'node',
    fileParallelism: false,
    testTimeout: 60_000,
    hookTimeout: 180_000,
    globalSetup: ['tests/support/server-setup.ts'],
    env: { DENUDATA_DB: process.env.DENUDATA_DB ?? 'denudata_test' },
  },
});
