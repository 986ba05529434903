import { describe, expect, it } from 'vitest';
import { AppError } from '@/lib/errors';
import { FairScheduler } from '@/lib/evaluation/scheduler';

/** A task the test finishes by hand, recording when it started. */
function controllable(label: string, log: string[]) {
  let finish!: (value: string) => void;
  const done = new Promise<string>((resolve) => {
    finish = resolve;
  });
  return {
    start: () => {
      log.push(`start ${label}`);
      return done;
    },
    finish: () => finish(label),
  };
}

const limits = { slots: 2, perUserInFlight: 2, perUserRunning: 1, maxQueued: 4, retryAfterSeconds: 5 };

async function settled<T>(promise: Promise<T>): Promise<{ ok: true; value: T } | { ok: false; error: unknown }> {
  try {
    return { ok: true, value: await promise };
  } catch (error) {
    return { ok: false, error };
  }
}

describe('fair scheduler (CONTRACT §3 Limits)', () => {
  it('should refuse a third evaluation in flight for one user with 429 and Retry-After', async () => {
    const scheduler = new FairScheduler<string>(limits);
    const log: string[] = [];
    const a = controllable('a', log);
    const b = controllable('b', log);
    const first = scheduler.submit({ userId: 'u1' }, a.start);
    const second = scheduler.submit({ userId: 'u1' }, b.start);
    const third = await settled(scheduler.submit({ userId: 'u1' }, controllable('c', log).start));
    expect(third.ok).toBe(false);
    const error = (third as { error: AppError }).error;
    expect(error).toBeInstanceOf(AppError);
    expect(error.status).toBe(429);
    expect(error.code).toBe('rate_limited');
    expect(error.retryAfter).toBe(5);
    // One user runs at most perUserRunning at once: b waits although a slot is free.
    expect(log).toEqual(['start a']);
    a.finish();
    expect(await first).toBe('a');
    expect(log).toEqual(['start a', 'start b']);
    b.finish();
    expect(await second).toBe('b');
    expect(scheduler.stats()).toEqual({ running: 0, queued: 0, users: 0 });
  });

  it('should let a newer evaluation of the same sheet replace the queued one (409 superseded), not the running one', async () => {
    const scheduler = new FairScheduler<string>(limits);
    const log: string[] = [];
    const running = controllable('running', log);
    const queued = controllable('queued', log);
    const newer = controllable('newer', log);
    const first = scheduler.submit({ userId: 'u1', key: 'sheet-1' }, running.start);
    const second = settled(scheduler.submit({ userId: 'u1', key: 'sheet-1' }, queued.start));
    const third = scheduler.submit({ userId: 'u1', key: 'sheet-1' }, newer.start);
    const replaced = await second;
    expect(replaced.ok).toBe(false);
    expect((replaced as { error: AppError }).error.status).toBe(409);
    expect((replaced as { error: AppError }).error.toBody()).toMatchObject({ superseded: true });
    running.finish();
    expect(await first).toBe('running');
    newer.finish();
    expect(await third).toBe('newer');
    expect(log).toEqual(['start running', 'start newer']);
  });

  it('should not replace a queued evaluation of another sheet', async () => {
    const scheduler = new FairScheduler<string>(limits);
    const log: string[] = [];
    const a = controllable('a', log);
    const b = controllable('b', log);
    const first = scheduler.submit({ userId: 'u1', key: 'sheet-1' }, a.start);
    const second = scheduler.submit({ userId: 'u1', key: 'sheet-2' }, b.start);
    const third = await settled(scheduler.submit({ userId: 'u1', key: 'sheet-3' }, controllable('c', log).start));
    expect((third as { error: AppError }).error.status).toBe(429);
    a.finish();
    b.finish();
    expect([await first, await second]).toEqual(['a', 'b']);
  });

  it('should bound the global queue with 429', async () => {
    const scheduler = new FairScheduler<string>({ ...limits, maxQueued: 2 });
    const log: string[] = [];
    const tasks = Array.from({ length: 6 }, (_, i) => controllable(`t${i}`, log));
    // Six users, one evaluation each: 2 run, 2 wait, the fifth and sixth are refused.
    const outcomes = tasks.map((task, i) => settled(scheduler.submit({ userId: `user${i}` }, task.start)));
    expect(scheduler.stats()).toMatchObject({ running: 2, queued: 2 });
    for (const task of tasks) task.finish();
    const results = await Promise.all(outcomes);
    expect(results.map((r) => r.ok)).toEqual([true, true, true, true, false, false]);
    expect(((results[5] as { error: AppError }).error).status).toBe(429);
  });

  it('should serve users in turn: a newcomer starts before a busy user\'s queued work', async () => {
    const scheduler = new FairScheduler<string>({ ...limits, slots: 1, perUserRunning: 1 });
    const log: string[] = [];
    const a1 = controllable('a1', log);
    const a2 = controllable('a2', log);
    const b1 = controllable('b1', log);
    const p1 = scheduler.submit({ userId: 'a' }, a1.start);
    const p2 = scheduler.submit({ userId: 'a' }, a2.start);
    const p3 = scheduler.submit({ userId: 'b' }, b1.start);
    a1.finish();
    await p1;
    b1.finish();
    await p3;
    a2.finish();
    await p2;
    expect(log).toEqual(['start a1', 'start b1', 'start a2']);
  });
});
