// How many times a signed-in request reads the users table, counted by PostgreSQL itself
// (pg_stat_user_tables: one scan per query that reads the table). GET /api/teams answers from the session
// look-up: one query per request, which reads the user with their memberships (it made two before: the session
// look-up, then the same user and memberships again). PostgreSQL publishes another connection's counts when
// that connection has been idle for about 10 s, so the test waits for them; a few reads by other work in the
// window (a job worker) are tolerated, a second read per request is not.
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { QueryTypes } from 'sequelize';
import { closeSequelize, getSequelize } from '@/lib/db/sequelize';
import { type ApiClient, signedInAs } from '../support/http';

const REQUESTS = 25;
const sleep = (ms: number) => new Promise((resolve) => setTimeout(resolve, ms));

async function usersScans(): Promise<number> {
  const [row] = await getSequelize().query<{ n: string }>(
    "SELECT seq_scan + coalesce(idx_scan, 0) AS n FROM pg_stat_user_tables WHERE relname = 'users'",
    { type: QueryTypes.SELECT },
  );
  return Number(row!.n);
}

let owner: ApiClient;

beforeAll(async () => {
  owner = await signedInAs('owner');
});

afterAll(async () => {
  await closeSequelize();
});

describe('queries of a signed-in request', () => {
  it('should read the users table once per GET /api/teams', { timeout: 90_000 }, async () => {
    await sleep(11_000); // the sign-in's own reads are published
    const before = await usersScans();
    for (let i = 0; i < REQUESTS; i++) expect((await owner.get('/api/teams')).status).toBe(200);
    let delta = 0;
    for (let waited = 0; waited < 30_000 && delta < REQUESTS; waited += 1000) {
      await sleep(1000);
      delta = (await usersScans()) - before;
    }
    await sleep(2000);
    delta = (await usersScans()) - before;
    expect(delta).toBeGreaterThanOrEqual(REQUESTS);
    expect(delta).toBeLessThan(2 * REQUESTS);
  });
});
