import { execFileSync } from 'node:child_process';
import { existsSync } from 'node:fs';
import path from 'node:path';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { DEMO_SHEETS } from '@/lib/demo/sheets';
import { EngineError } from '@/lib/engine/errors';
import { closeEvaluationPool, runEvaluate, runEvaluateIncremental, runQuick, WORKER_FILE } from '@/lib/evaluation/pool';

describe('evaluation pool', () => {
  beforeAll(() => {
    if (!existsSync(WORKER_FILE)) {
      execFileSync(process.execPath, [path.resolve(__dirname, '../../scripts/build-worker.mjs')], { cwd: path.resolve(__dirname, '../..') });
    }
  });

  afterAll(async () => {
    await closeEvaluationPool();
  });

  it('should evaluate a sheet in a worker', async () => {
    const results = await runEvaluate(DEMO_SHEETS[0]!.document);
    expect(results.format).toBe('denudata-results@1');
    expect(Object.values(results.blocks).every((b) => b.status === 'ok')).toBe(true);
  });

  it('should evaluate incrementally in a worker', async () => {
    const doc = DEMO_SHEETS[2]!.document;
    const previous = await runEvaluate(doc);
    const { evaluatedBlockIds } = await runEvaluateIncremental(doc, previous, ['sr-bed-upper']);
    expect(evaluatedBlockIds).toEqual(['sr-bed-upper']);
  });

  it('should answer quick calculations and pass engine messages through', async () => {
    // Pe for 1 mm/yr, 30 km, 1e-6 m^2/s: reference case P12 (Turcotte & Schubert 2002).
    const quick = await runQuick('peclet_number(1 mm/yr, 30 km, 1e-6 m^2/s)');
    expect(quick.value).toBeCloseTo(0.9506, 3);
    await expect(runQuick('evaluate("1")')).rejects.toThrow(/not available/);
    await expect(runQuick('evaluate("1")')).rejects.toBeInstanceOf(EngineError);
    // The kind of failure travels as a code from the worker, so no caller reads the message to classify it.
    await expect(runQuick('evaluate("1")')).rejects.toMatchObject({ code: 'invalid' });
  });

  it('should stop an evaluation that takes longer than 5 s and stay usable', async () => {
    // A legal but slow expression: twelve series of about twenty products of 316×316 matrices. One series takes
    // about 4 s on the project machine when quiet; twelve stay far over 5 s on a machine several times faster.
    const slow = Array.from({ length: 12 }, () => 'sum(ones(316, 316)^1000000)').join(' + ');
    const started = Date.now();
    await expect(runQuick(slow)).rejects.toMatchObject({ code: 'limit_exceeded', message: 'evaluation took longer than 5 s and was stopped' });
    expect(Date.now() - started).toBeLessThan(9000);
    const again = await runQuick('2 m + 3 m');
    expect(again.value).toBe(5);
  }, 30_000);
});
