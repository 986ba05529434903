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
  // A suite that failed to load counts as a failure even when none of its tests ran.
  for (const suite of report.testResults ?? []) {
    if (suite.status === 'failed' && (suite.assertionResults ?? []).length === 0) failed += 1;
  }
}
console.log(`${passed} passed, ${failed} failed`);
process.exit(failed > 0 || passed === 0 ? 1 : 0);
