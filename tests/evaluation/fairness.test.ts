import { execFileSync } from 'node:child_process';
import { existsSync } from 'node:fs';
import path from 'node:path';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { AppError } from '@/lib/errors';
import { closeEvaluationPool, evaluationPoolStats, runQuick, WORKER_FILE } from '@/lib/evaluation/pool';

// A legal but slow expression: twelve series of about twenty products of 316×316 matrices, each under the
// 100,000-element cap, together far over the 5 s limit even on a much faster machine (so each one ends by the
// time limit).
const ABUSIVE = Array.from({ length: 12 }, () => 'sum(ones(316, 316)^1000000)').join(' + ');

describe('evaluation fairness (CONTRACT §3 Limits)', () => {
  beforeAll(async () => {
    if (!existsSync(WORKER_FILE)) {
      execFileSync(process.execPath, [path.resolve(__dirname, '../../scripts/build-worker.mjs')], { cwd: path.resolve(__dirname, '../..') });
    }
    // Warm both threads so that thread start-up does not decide the order.
    await Promise.all([runQuick('1 + 1', { userId: 'warm-1' }), runQuick('1 + 1', { userId: 'warm-2' })]);
  }, 120_000);

  afterAll(async () => {
    await closeEvaluationPool();
  });

  it('should complete another user\'s ordinary evaluation before any of 8 abusive ones in flight', async () => {
    const order: string[] = [];
    const abusive = Array.from({ length: 8 }, (_, i) =>
      runQuick(ABUSIVE, { userId: 'abuser' }).then(
        () => order.push(`abusive ${i} done`),
        (error: unknown) => {
          order.push(error instanceof AppError && error.status === 429 ? `abusive ${i} refused` : `abusive ${i} stopped`);
          return error;
        },
      ),
    );
    const ordinary = runQuick('peclet_number(1 mm/yr, 30 km, 1e-6 m^2/s)', { userId: 'ordinary' }).then((result) => {
      order.push('ordinary done');
      return result;
    });
    // Reference case P12 (Turcotte & Schubert 2002): Pe ≈ 0.9506.
    expect((await ordinary).value).toBeCloseTo(0.9506, 3);
    const errors = await Promise.all(abusive);
    // Two of the abuser's evaluations are admitted (one runs, one waits); six are refused at once with 429.
    const refused = order.filter((entry) => entry.endsWith('refused'));
    expect(refused).toHaveLength(6);
    for (const error of errors.filter((e) => e instanceof AppError)) expect((error as AppError).retryAfter).toBeGreaterThan(0);
    const firstAbusiveEnd = order.findIndex((entry) => /^abusive \d+ (stopped|done)$/.test(entry));
    expect(order.indexOf('ordinary done')).toBeLessThan(firstAbusiveEnd);
    // The admitted abusive evaluations end by the time limit, with the contract's message.
    expect(order.filter((entry) => entry.endsWith('stopped'))).toHaveLength(2);
    expect(evaluationPoolStats()).toEqual({ running: 0, queued: 0, users: 0 });
  }, 120_000);

  it('should stop an over-cap value at once as a clear error, not by the time limit', async () => {
    await expect(runQuick('sum((ones(1000,1)*ones(1,1000))*(ones(1000,1)*ones(1,1000)))', { userId: 'probe' })).rejects.toThrow(
      /multiply: the result would hold 1000000 elements, over the limit of 100000 elements in a matrix value/,
    );
  });
});
