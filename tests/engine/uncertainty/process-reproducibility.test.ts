import { execFileSync } from 'node:child_process';
import { mkdtempSync, writeFileSync } from 'node:fs';
import { tmpdir } from 'node:os';
import path from 'node:path';
import { describe, expect, it } from 'vitest';
import { evaluateSheet } from '@/lib/engine';
import { caseSheet } from './cases';

// Starts a second Node.js process (the command-line runner), so it runs the unmutated engine: left out of
// mutation runs (vitest.mutation.config.ts), as tests/engine/calc.test.ts and reproducibility.test.ts are.
describe('reproducibility (CONTRACT §8.6)', () => {
  it('should give bit-identical results in another server process (the command-line runner)', () => {
    const dir = mkdtempSync(path.join(tmpdir(), 'denudata-unc-'));
    const file = path.join(dir, 'p48.json');
    writeFileSync(file, JSON.stringify(caseSheet('P48')));
    const output = execFileSync(path.resolve('node_modules/.bin/tsx'), ['--conditions=react-server', 'scripts/calc.mts', file], {
      encoding: 'utf8',
      env: { ...process.env, INIT_CWD: dir },
    });
    expect(JSON.stringify(JSON.parse(output))).toBe(JSON.stringify(evaluateSheet(caseSheet('P48'))));
  }, 120_000); // a second Node.js process starting tsx and the engine: slow on a loaded machine
});
