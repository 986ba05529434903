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
    include: ['tests/engine/blocks/*.test.ts', 'tests/engine/published-checks.test.ts', 'tests/engine/registry.test.ts', 'tests/engine/demo-sheets.test.ts', 'tests/engine/numerics.test.ts', 'tests/engine/tectonic-conventions.test.ts'],
    // The tests that exercise the block types; the uncertainty, expression and unit suites cover other files.
    // These start other processes (the command line, a second server process) that run the unmutated code
    // outside Stryker's reach, or read source files; the rest of tests/engine runs.
    exclude: ['tests/engine/calc.test.ts', 'tests/engine/purity.test.ts', 'tests/engine/reproducibility.test.ts', 'node_modules/**'],
    environment: 'node',
    testTimeout: 20_000,
  },
});
