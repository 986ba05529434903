// Sums vitest JSON reports into the one closing line CI reads: "N passed, N failed".
import { existsSync, readFileSync } from 'node:fs';

let passed = 0;
let failed = 0;
for (const file of process.argv.slice(2)) {
  if (!existsSync(file)) {
    console.log(`test: no report at ${file} (the suite did not run)`);
    failed += 1;
    continue;
  }
  const report = JSON.parse(readFileSync(file, 'utf8'));
  passed += report.numPassedTests ?? 0;
  failed += report.numFailedTests ?? 0;
  // A suite that failed without a failed test counts as one failure: it failed to load, or a hook failed
  // (a failing beforeAll marks every test of the file skipped, so no test of it counts as failed).
  for (const suite of report.testResults ?? []) {
    const failedTests = (suite.assertionResults ?? []).filter((test) => test.status === 'failed').length;
    if (suite.status === 'failed' && failedTests === 0) {
      failed += 1;
      console.log(`test: ${suite.name}: the suite failed outside its tests (${String(suite.message ?? '').split('\n')[0].slice(0, 200)})`);
    }
  }
}
console.log(`${passed} passed, ${failed} failed`);
process.exit(failed > 0 || passed === 0 ? 1 : 0);
