import { defineConfig } from 'vitest/config';
import path from 'node:path';

// The engine's own tests (no database, no browser) for mutation testing with Stryker (`npm run mutation`).
// DENUDATA_MUTATION_TESTS narrows the test files (a comma-separated list of globs) for a run over a few
// source files; by default every engine test runs except those that start other processes (the command line)
// or read source files (purity, reproducibility): those run the unmutated code outside Stryker's reach.
const narrowed = process.env.DENUDATA_MUTATION_TESTS?.split(',').map((glob) => glob.trim()).filter(Boolean);

export default defineConfig({
  resolve: {
    alias: {
      '@': path.resolve(__dirname),
      'server-only': path.resolve(__dirname, 'tests/support/empty-module.ts'),
    },
  },
  test: {
    include: narrowed && narrowed.length > 0 ? narrowed : ['tests/engine/**/*.test.ts'],
    exclude: ['tests/engine/calc.test.ts', 'tests/engine/purity.test.ts', 'tests/engine/collection-time.test.ts', 'tests/engine/reproducibility.test.ts', 'tests/engine/uncertainty/process-reproducibility.test.ts', 'node_modules/**'],
    environment: 'node',
    // Test files share one module graph (mathjs and the engine load once, not once per file and per mutant):
    // Stryker switches mutants at run time, and `ignoreStatic` in stryker.config.mjs leaves out the mutants
    // that only act while a module loads (they would need a fresh module graph per mutant).
    isolate: false,
    setupFiles: ['tests/support/mutation-setup.ts'],
    // Instrumented loops run tens of times slower than plain ones (the data blocks' fits and solvers).
    testTimeout: 120_000,
  },
});
