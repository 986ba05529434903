// Mutation testing of the engine (`npm run mutation`; not part of `npm test`). Stryker changes the engine's
// code one small mutation at a time and runs the engine tests (tests/engine, vitest.mutation.config.ts); a
// mutant that no test notices "survives". The score is printed at the end (clear-text reporter) and written
// to reports/mutation/.
//
// By default it mutates every file of lib/engine: on a shared machine that takes hours, so run it in groups,
// naming the source files and narrowing the test files (see DEVELOPERS.md, "Mutation testing"), e.g.
//   DENUDATA_MUTATION_TESTS='tests/engine/blocks/net-change.test.ts,tests/engine/published-checks.test.ts' \
//   DENUDATA_MUTATION_REPORT=net-change nice -n 15 npm run mutation -- --mutate lib/engine/blocks/net-change.ts
// The words of a block type's documentation are left out by stryker-documentation-ignorer.mjs.
const report = process.env.DENUDATA_MUTATION_REPORT ?? 'mutation';

/** @type {import('@stryker-mutator/api/core').PartialStrykerOptions} */
const config = {
  testRunner: 'vitest',
  vitest: { configFile: 'vitest.mutation.config.ts' },
  plugins: ['@stryker-mutator/vitest-runner', './stryker-documentation-ignorer.mjs'],
  ignorers: ['denudata-documentation'],
  mutate: ['lib/engine/**/*.ts'],
  coverageAnalysis: 'perTest',
  // Mutants that act only while a module loads (input declarations, worked examples, module constants) need a
  // fresh module graph and every test per mutant (about 10 s each here); they are left out unless
  // DENUDATA_MUTATION_STATIC=1 (tests/support/mutation-setup.ts then reloads the engine for each of them).
  ignoreStatic: process.env.DENUDATA_MUTATION_STATIC !== '1',
  concurrency: Number(process.env.DENUDATA_MUTATION_CONCURRENCY ?? 1),
  timeoutMS: 30_000,
  // The first (unmutated) run of the engine tests can take minutes on a shared machine.
  dryRunTimeoutMinutes: 30,
  reporters: ['clear-text', 'progress-append-only', 'html', 'json'],
  htmlReporter: { fileName: `reports/mutation/${report}.html` },
  jsonReporter: { fileName: `reports/mutation/${report}.json` },
  incrementalFile: `reports/mutation/incremental-${report}.json`,
  thresholds: { high: 90, low: 85, break: null },
  tempDirName: '.stryker-tmp',
  ignorePatterns: ['.next*', '.denudata', '.worker-dist', 'reports', 'node_modules'],
};

export default config;
