import { spawnSync } from 'node:child_process';
import { mkdtempSync, writeFileSync } from 'node:fs';
import { tmpdir } from 'node:os';
import path from 'node:path';
import { describe, expect, it } from 'vitest';
import { DEMO_SHEETS } from '@/lib/demo/sheets';

const ROOT = path.resolve(__dirname, '../..');
const dir = mkdtempSync(path.join(tmpdir(), 'denudata-calc-'));

function calc(file: string, cwd = dir, extra: string[] = [], env: Record<string, string> = {}) {
  const result = spawnSync(process.execPath, [path.join(ROOT, 'node_modules/tsx/dist/cli.mjs'), path.join(ROOT, 'scripts/calc.mts'), file, ...extra], {
    cwd: ROOT,
    env: { ...process.env, INIT_CWD: cwd, ...env },
    encoding: 'utf8',
    timeout: 90_000,
  });
  return { code: result.status, stdout: result.stdout, stderr: result.stderr };
}

function write(name: string, content: string): string {
  writeFileSync(path.join(dir, name), content);
  return name;
}

describe('calc runner', () => {
  it('should exit 0 and print results when every block is ok, resolving the path against INIT_CWD', () => {
    const { code, stdout } = calc(write('ok.json', JSON.stringify(DEMO_SHEETS[0]!.document)));
    expect(code).toBe(0);
    expect(JSON.parse(stdout).format).toBe('denudata-results@1');
  });

  it('should exit 1 when a block has an error or is blocked', () => {
    const doc = { format: 'denudata-sheet@1', title: 'Bad', blocks: [{ id: '1', name: 'x', type: 'formula', inputs: { expr: '1 m + 1 s' } }] };
    const { code, stdout } = calc(write('error.json', JSON.stringify(doc)));
    expect(code).toBe(1);
    expect(JSON.parse(stdout).blocks.x.status).toBe('error');
  });

  it('should exit 2 with a reason for an invalid, unreadable or non-JSON document', () => {
    const invalid = calc(write('invalid.json', JSON.stringify({ format: 'denudata-sheet@1', title: 'x', blocks: [{ id: '1', name: 'km', type: 'formula', inputs: {} }] })));
    expect(invalid.code).toBe(2);
    expect(invalid.stderr).toContain('blocks[0].name');
    const notJson = calc(write('broken.json', '{ not json'));
    expect(notJson.code).toBe(2);
    expect(notJson.stderr).toContain('not JSON');
    const missing = calc('does-not-exist.json');
    expect(missing.code).toBe(2);
    expect(missing.stderr).toContain('cannot read');
    const badLimit = calc(write('ok2.json', JSON.stringify(DEMO_SHEETS[0]!.document)), dir, ['--time-limit', '0']);
    expect(badLimit.code).toBe(2);
    expect(badLimit.stderr).toContain('--time-limit');
  });

  it('should exit 3 with the reason on stderr when the run is stopped by --time-limit', () => {
    // About twenty products of 316×316 matrices: legal under every size cap, far over 1 s.
    const doc = { format: 'denudata-sheet@1', title: 'Slow', blocks: [{ id: '1', name: 'slow', type: 'formula', inputs: { expr: 'sum(ones(316, 316)^1000000)' } }] };
    const { code, stdout, stderr } = calc(write('slow.json', JSON.stringify(doc)), dir, ['--time-limit', '1']);
    expect(code).toBe(3);
    expect(stdout).toBe('');
    expect(stderr).toContain('time limit of 1 s');
  });

  it('should end size-cap violations as block errors (exit 1), never as a stopped run', () => {
    // The amplification sheets of issue 8: string doubling and an outer product of two 1000-vectors.
    const blocks = [
      { id: 's0', name: 's0', type: 'quantities', inputs: { t: '"abcdefghijklmnopqrstuvwxyz0123456789abcdefghijklmnopqrstuvwxyz0123456789"' } },
      ...Array.from({ length: 12 }, (_, i) => ({ id: `s${i + 1}`, name: `s${i + 1}`, type: 'quantities', inputs: { t: `concat(s${i}.t, s${i}.t)` } })),
      { id: 'o', name: 'outer', type: 'formula', inputs: { expr: 'sum(ones(1000, 1) * ones(1, 1000))' } },
    ];
    const doc = { format: 'denudata-sheet@1', title: 'Amplification', blocks };
    const { code, stdout } = calc(write('amplify.json', JSON.stringify(doc)), dir, ['--time-limit', '60']);
    expect(code).toBe(1);
    const results = JSON.parse(stdout);
    // 72 characters doubled: s3 holds 576, s4 would hold 1152 (> 1000) and is an error; the rest wait on it.
    expect(results.blocks.s3.status).toBe('ok');
    expect(results.blocks.s4.status).toBe('error');
    expect(results.blocks.s4.error).toMatch(/1152 characters long, over the limit of 1000 characters/);
    expect(results.blocks.s5.status).toBe('blocked');
    expect(results.blocks.outer.error).toMatch(/multiply: the result would hold 1000000 elements, over the limit of 100000/);
    expect(stdout.length).toBeLessThan(100_000);
  });
}, 300_000);
