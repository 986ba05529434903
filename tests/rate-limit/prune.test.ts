// Pruning of ended rate-limit windows (lib/rate-limit pruneRateLimits, scheduled by lib/jobs/workers.ts):
// expired counters are deleted, live ones and their counts are kept, a pruned key counts afresh, and the
// queue holds the schedule and works its job. Real PostgreSQL and pg-boss on the test database.
import { QueryTypes } from 'sequelize';
import { afterAll, describe, expect, it } from 'vitest';
import { closeSequelize, getSequelize } from '@/lib/db/sequelize';
import { AppError } from '@/lib/errors';
import { jobQueue, QUEUES, RATE_LIMIT_PRUNE_CRON, stopJobQueue } from '@/lib/jobs/queue';
import { scheduleRateLimitPruning } from '@/lib/jobs/workers';
import { RATE_LIMIT_TABLE, RateLimit, pruneRateLimits } from '@/lib/rate-limit';
import { pollUntil, scheduledCron } from '../support/jobs';

afterAll(async () => {
  await stopJobQueue();
  await closeSequelize();
});

const unique = (label: string) => `prune-${label}-${Date.now()}-${Math.random().toString(36).slice(2)}`;

async function insertRow(key: string, points: number, expire: number | null): Promise<void> {
  await getSequelize().query(`INSERT INTO ${RATE_LIMIT_TABLE} (key, points, expire) VALUES ($1, $2, $3)`, { bind: [key, points, expire] });
}

async function rowsFor(keys: string[]): Promise<Map<string, number>> {
  const rows = await getSequelize().query<{ key: string; points: number }>(`SELECT key, points FROM ${RATE_LIMIT_TABLE} WHERE key = ANY($1)`, {
    bind: [keys],
    type: QueryTypes.SELECT,
  });
  return new Map(rows.map((r) => [r.key, r.points]));
}

describe('pruning the rate-limit table', () => {
  it('should delete the counters whose window has ended and keep live and open-ended ones', async () => {
    const now = Date.now();
    const ended = unique('ended');
    const endedJustNow = unique('ended-just-now');
    const live = unique('live');
    const forever = unique('forever');
    await insertRow(ended, 7, now - 60_000);
    await insertRow(endedJustNow, 3, now - 1);
    await insertRow(live, 4, now + 60_000);
    await insertRow(forever, 2, null);
    const deleted = await pruneRateLimits(getSequelize(), now);
    expect(deleted).toBeGreaterThanOrEqual(2);
    expect(Object.fromEntries(await rowsFor([ended, endedJustNow, live, forever]))).toEqual({ [live]: 4, [forever]: 2 });
    // Nothing left to prune at the same moment.
    expect(await pruneRateLimits(getSequelize(), now)).toBe(0);
  });

  it('should let a limit whose window ended and was pruned count afresh, and leave a live limit refusing', async () => {
    const limit = new RateLimit('signInAccount', getSequelize()); // 10 events per 15 minutes
    const ended = unique('account-ended');
    const live = unique('account-live');
    for (let i = 0; i < 10; i++) {
      await limit.consume(ended);
      await limit.consume(live);
    }
    // The first key's window ends (as if 15 minutes passed); the second's does not.
    await getSequelize().query(`UPDATE ${RATE_LIMIT_TABLE} SET expire = $1 WHERE key = $2`, { bind: [Date.now() - 1000, `signInAccount:${ended}`] });
    await pruneRateLimits();
    expect((await rowsFor([`signInAccount:${ended}`])).size).toBe(0);
    expect((await rowsFor([`signInAccount:${live}`])).get(`signInAccount:${live}`)).toBe(10);
    const refused = await limit.consume(live).then(() => null, (error: unknown) => error);
    expect(refused).toBeInstanceOf(AppError);
    expect((refused as AppError).status).toBe(429);
    await limit.consume(ended); // counts from zero again
    expect((await rowsFor([`signInAccount:${ended}`])).get(`signInAccount:${ended}`)).toBe(1);
  });

  it('should schedule the pruning job on the queue and prune when the job runs', async () => {
    const boss = await jobQueue();
    const stale = unique('stale');
    await insertRow(stale, 5, Date.now() - 1000);
    await boss.send(QUEUES.rateLimitPrune.name, {});
    await scheduleRateLimitPruning(boss);
    expect(await scheduledCron(QUEUES.rateLimitPrune.name)).toBe(RATE_LIMIT_PRUNE_CRON);
    await pollUntil(async () => (await rowsFor([stale])).size === 0);
    expect((await rowsFor([stale])).size).toBe(0);
  }, 40_000);
});
