// Mutation testing of the engine (`npm run mutation`; not part of `npm test`). Stryker changes the engine's
// code one small mutation at a time and runs the engine tests; a mutant that no test notices "survives".
// By default it mutates the twelve formula block types of the first release (quantities, formula and note
// hold no formula of their own); pass files to widen it:
//   npm run mutation -- --mutate 'lib/engine/**/*.ts'
// The score is printed at the end (clear-text reporter) and written to reports/mutation/.
/** @type {import('@stryker-mutator/api/core').PartialStrykerOptions} */
const config = {
  testRunner: 'vitest',
  vitest: { configFile: 'vitest.mutation.config.ts' },
  plugins: ['@stryker-mutator/vitest-runner'],
  mutate: [
    'lib/engine/blocks/{hillslope-diffusion,hilltop-erosion,scarp-forward,scarp-age,transport-capacity,net-change,peclet-number,advective-geotherm,stream-power,steady-state-channel,isostatic-response,denudation-conversion}.ts',
    // The tectonic and field-method types (CONTRACT §4b) and their numerical routines.
    'lib/engine/blocks/{radiogenic-geotherm,strength-envelope,orogen-flux-balance,plate-flexure,cosmogenic-denudation,closure-exhumation}.ts',
    'lib/engine/numerics.ts',
  ],
  coverageAnalysis: 'perTest',
  concurrency: 1,
  timeoutMS: 30_000,
  // The first (unmutated) run of the engine tests can take minutes on a shared machine.
  dryRunTimeoutMinutes: 30,
  reporters: ['clear-text', 'progress', 'html', 'json'],
  htmlReporter: { fileName: 'reports/mutation/index.html' },
  jsonReporter: { fileName: 'reports/mutation/mutation.json' },
  thresholds: { high: 90, low: 85, break: null },
  tempDirName: '.stryker-tmp',
  ignorePatterns: ['.next*', '.denudata', '.worker-dist', 'reports', 'node_modules'],
};

export default config;
