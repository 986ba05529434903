import { afterAll, describe, expect, it } from 'vitest';
import { QueryTypes } from 'sequelize';
import { db } from '@/lib/db';
import { DEMO_ACCOUNTS, seedDemo } from '@/lib/db/seed';
import { verifyCredentials } from '@/lib/db/users';
import { closeSequelize } from '@/lib/db/sequelize';

const count = async (table: string) =>
  (await db().query<{ n: string }>(`SELECT count(*) AS n FROM ${table}`, { type: QueryTypes.SELECT }))[0]?.n;

describe('seedDemo', () => {
  afterAll(closeSequelize);

  it('should be idempotent: a second run adds nothing', async () => {
    await seedDemo();
    const before = await Promise.all(['users', 'teams', 'memberships', 'sheets'].map(count));
    await seedDemo();
    const after = await Promise.all(['users', 'teams', 'memberships', 'sheets'].map(count));
    expect(after).toEqual(before);
    expect(Number(before[0])).toBeGreaterThanOrEqual(DEMO_ACCOUNTS.length);
    expect(Number(before[3])).toBeGreaterThanOrEqual(4);
  });

  it('should give every demo account the demo password', async () => {
    for (const account of DEMO_ACCOUNTS) {
      expect(await verifyCredentials({ email: account.email, password: 'demo-password' })).toMatchObject({ email: account.email });
    }
    expect(await verifyCredentials({ email: 'owner@demo.test', password: 'wrong' })).toBeNull();
  });
});
