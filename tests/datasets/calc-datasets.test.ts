import { spawnSync } from 'node:child_process';
import { mkdirSync, mkdtempSync, readFileSync, writeFileSync } from 'node:fs';
import { tmpdir } from 'node:os';
import path from 'node:path';
import { describe, expect, it } from 'vitest';
import { parseDatasetFile } from '@/lib/datasets/parse';
import cases from '../fixtures/datasets/cases.json';

// The runner's dataset inputs (CONTRACT §6 additions: a bundle, or --datasets DIR of <sha256>.json canonical
// files; a file whose hash does not match is an invalid input, exit 2). Data: the public case P40 file
// (RFC 4180, RFC 8785, FIPS 180-4), copied into tests/fixtures/datasets.
const ROOT = path.resolve(__dirname, '../..');
const dir = mkdtempSync(path.join(tmpdir(), 'denudata-calc-datasets-'));
const p40 = parseDatasetFile(readFileSync(path.join(__dirname, '../fixtures/datasets/p40-hollin-moor-a.csv')), 'slope_profile');
if (!p40.ok) throw new Error('fixture');

function calc(...args: string[]) {
  const result = spawnSync(process.execPath, [path.join(ROOT, 'node_modules/tsx/dist/cli.mjs'), path.join(ROOT, 'scripts/calc.mts'), ...args], {
    cwd: ROOT,
    env: { ...process.env, INIT_CWD: dir },
    encoding: 'utf8',
    timeout: 60_000,
  });
  return { code: result.status, stdout: result.stdout, stderr: result.stderr };
}

const document = {
  format: 'denudata-sheet@1',
  title: 'Runner with data',
  blocks: [{ id: 'q', name: 'q', type: 'quantities', inputs: { a: '1 m' } }, { id: 'f', name: 'f', type: 'formula', inputs: { expr: `dataset("${p40.sha256}")` } }],
};

describe('calc runner with datasets', () => {
  it('should read a bundle, recompute its hashes, and refuse a tampered one with exit 2', () => {
    const bundle = { format: 'denudata-bundle@1', document, datasets: [{ sha256: p40.sha256, name: 'P40', description: '', kind: 'slope_profile', canonical: p40.dataset }] };
    writeFileSync(path.join(dir, 'bundle.json'), JSON.stringify(bundle));
    const ok = calc('bundle.json');
    // The formula cannot use a dataset (a block error, exit 1), but the bundle itself was accepted.
    expect(ok.code).toBe(1);
    expect(JSON.parse(ok.stdout).blocks.q.status).toBe('ok');
    const tampered = structuredClone(bundle);
    tampered.datasets[0]!.canonical.rows[0]![1] = 99;
    writeFileSync(path.join(dir, 'tampered.json'), JSON.stringify(tampered));
    const refused = calc('tampered.json');
    expect(refused.code).toBe(2);
    expect(refused.stderr).toMatch(/datasets\[0\].*hashes to/);
  }, 240_000);

  it('should read --datasets DIR by hash, and exit 2 for a file whose content does not hash to its name', () => {
    writeFileSync(path.join(dir, 'sheet.json'), JSON.stringify(document));
    mkdirSync(path.join(dir, 'good'), { recursive: true });
    writeFileSync(path.join(dir, 'good', `${p40.sha256}.json`), p40.canonicalJson);
    expect(calc('sheet.json', '--datasets', 'good').code).toBe(1);
    mkdirSync(path.join(dir, 'bad'), { recursive: true });
    writeFileSync(path.join(dir, 'bad', `${p40.sha256}.json`), p40.canonicalJson.replace('10.2', '10.3'));
    const bad = calc('sheet.json', '--datasets', 'bad');
    expect(bad.code).toBe(2);
    expect(bad.stderr).toMatch(/invalid dataset/);
    expect(calc('sheet.json', '--datasets').code).toBe(2);
  }, 360_000);

  // Reference case P46 (Beaumont, Fullsack & Hamilton 1992; Kooi & Beaumont 1994; P10 as a dataset).
  it('should evaluate P46 from a --datasets folder to an outgoing flux of 1.4111328125 m^2/yr (exit 0)', () => {
    const p46 = cases.cases.find((c) => c.id === 'P46')!;
    const csv = readFileSync(path.join(__dirname, '../fixtures/datasets/p46-p10-long-profile.csv'));
    const parsed = parseDatasetFile(csv, 'long_profile');
    if (!parsed.ok) throw new Error(parsed.message);
    mkdirSync(path.join(dir, 'p46'), { recursive: true });
    writeFileSync(path.join(dir, 'p46', `${parsed.sha256}.json`), parsed.canonicalJson);
    writeFileSync(path.join(dir, 'p46.json'), JSON.stringify(p46.sheet));
    const run = calc('p46.json', '--datasets', 'p46');
    expect(run.code).toBe(0);
    const flux = JSON.parse(run.stdout).blocks.march.outputs.outgoing_flux.value as number;
    expect(Math.abs(flux - 1.4111328125)).toBeLessThanOrEqual(1e-9 * 1.4111328125);
  }, 240_000);
});
