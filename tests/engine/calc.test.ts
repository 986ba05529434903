import { spawnSync } from 'node:child_process';
import { mkdtempSync, writeFileSync } from 'node:fs';
import { tmpdir } from 'node:os';
import path from 'node:path';
import { describe, expect, it } from 'vitest';
import { DEMO_SHEETS } from '@/lib/demo/sheets';

const ROOT = path.resolve(__dirname, '../..');
const dir = mkdtempSync(path.join(tmpdir(), 'denudata-calc-'));

function calc(file: string, cwd = dir) {
  const result = spawnSync(process.execPath, [path.join(ROOT, 'node_modules/tsx/dist/cli.mjs'), path.join(ROOT, 'scripts/calc.mts'), file], {
    cwd: ROOT,
    env: { ...process.env, INIT_CWD: cwd },
    encoding: 'utf8',
    timeout: 60_000,
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
  });
}, 120_000);
