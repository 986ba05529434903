import { defineConfig } from 'vitest/config';
import path from 'node:path';

// The engine's own tests (no database, no browser) for mutation testing with Stryker (`npm run mutation`).
export default defineConfig({
  resolve: {
    alias: {
      '@': path.resolve(__dirname),
      'server-only': path.resolve(__dirname, 'tests/support/empty-module.ts'),
    },
  },
  test: {
    include: ['tests/engine/**/*.test.ts'],
    // calc.test.ts runs the command line in a child process (outside Stryker's reach); purity reads files.
    exclude: ['tests/engine/calc.test.ts', 'tests/engine/purity.test.ts', 'node_modules/**'],
    environment: 'node',
    testTimeout: 20_000,
  },
});
