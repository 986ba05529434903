/**
 * scripts/test-summary.mjs: the one line CI reads ("N passed, N failed") and the exit status of `npm test`.
 * A suite whose beforeAll hook fails has every test skipped and none failed (vitest's JSON report); it must
 * still count as a failure, or a run that tested nothing of that suite ends green.
 */
import { execFileSync } from 'node:child_process';
import { mkdtempSync, rmSync, writeFileSync } from 'node:fs';
import { tmpdir } from 'node:os';
import path from 'node:path';
import { afterAll, describe, expect, it } from 'vitest';

const dir = mkdtempSync(path.join(tmpdir(), 'denudata-summary-'));
afterAll(() => rmSync(dir, { recursive: true, force: true }));

function summarise(reports: unknown[]): { out: string; status: number } {
  const files = reports.map((report, index) => {
    const file = path.join(dir, `report-${index}-${Math.random().toString(36).slice(2)}.json`);
    if (report !== null) writeFileSync(file, JSON.stringify(report));
    return file;
  });
  try {
    return { out: execFileSync('node', ['scripts/test-summary.mjs', ...files], { encoding: 'utf8' }), status: 0 };
  } catch (error) {
    const failure = error as { stdout: string; status: number };
    return { out: failure.stdout, status: failure.status };
  }
}
const suite = (name: string, status: string, tests: string[], message = '') => ({
  name,
  status,
  message,
  assertionResults: tests.map((s) => ({ status: s })),
});

describe('test summary', () => {
  it('sums passed and failed tests over reports and exits 0 only when nothing failed', () => {
    const good = summarise([
      { numPassedTests: 3, numFailedTests: 0, testResults: [suite('a', 'passed', ['passed', 'passed', 'passed'])] },
      { numPassedTests: 2, numFailedTests: 0, testResults: [suite('b', 'passed', ['passed', 'passed'])] },
    ]);
    expect(good).toEqual({ out: '5 passed, 0 failed\n', status: 0 });
    const bad = summarise([{ numPassedTests: 4, numFailedTests: 1, testResults: [suite('c', 'failed', ['passed', 'failed'])] }]);
    expect(bad.out.trim().split('\n').at(-1)).toBe('4 passed, 1 failed');
    expect(bad.status).toBe(1);
  });

  it('counts a suite whose beforeAll failed (every test skipped) as one failure, naming it', () => {
    const result = summarise([
      {
        numPassedTests: 7,
        numFailedTests: 0,
        testResults: [suite('/x/rate-limits.test.ts', 'failed', ['skipped', 'skipped'], 'Error: the app did not answer\n    at …'), suite('/x/ok.test.ts', 'passed', ['passed'])],
      },
    ]);
    expect(result.status).toBe(1);
    expect(result.out).toContain('/x/rate-limits.test.ts: the suite failed outside its tests (Error: the app did not answer)');
    expect(result.out.trim().split('\n').at(-1)).toBe('7 passed, 1 failed');
  });

  it('counts a missing report and a run with no passed test as failures', () => {
    const missing = summarise([null]);
    expect(missing.out).toContain('the suite did not run');
    expect(missing.out.trim().split('\n').at(-1)).toBe('0 passed, 1 failed');
    expect(missing.status).toBe(1);
    expect(summarise([{ numPassedTests: 0, numFailedTests: 0, testResults: [] }]).status).toBe(1);
  });
});
