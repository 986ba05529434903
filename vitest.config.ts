import { defineConfig } from 'vitest/config';
import path from 'node:path';

// Unit and integration tests. Integration tests share one real PostgreSQL
// database, so files run one after another.
export default defineConfig({
  resolve: {
    alias: {
      '@': path.resolve(__dirname),
      'server-only': path.resolve(__dirname, 'tests/support/empty-module.ts'),
    },
  },
  test: {
    include: ['tests/**/*.test.ts'],
    exclude: ['tests/e2e/**', 'tests/api/**', 'node_modules/**'],
    environment: 'node',
    fileParallelism: false,
    testTimeout: 20_000,
    hookTimeout: 60_000,
    globalSetup: ['tests/support/global-setup.ts'],
    env: { DENUDATA_DB: process.env.DENUDATA_DB ?? 'denudata_test' },
  },
});
