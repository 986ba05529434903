import { describe, expect, it } from 'vitest';
import { QueryTypes } from 'sequelize';
import { MAX_QUICK_HISTORY, createQuickCalculation, listQuickCalculationsByUser } from '@/lib/db/quick';
import { db } from '@/lib/db';
import { createUserWithTeam } from '@/lib/db/users';

/** Rows stored for a user, whatever the list shows. */
async function storedExpressions(userId: string): Promise<string[]> {
  const rows = await db().query<{ expression: string }>('SELECT expression FROM quick_calculations WHERE user_id = $1', {
    bind: [userId],
    type: QueryTypes.SELECT,
  });
  return rows.map((r) => r.expression).sort();
}

describe('quick calculations (lib/db/quick)', () => {
  it('should store a user’s quick calculations and list the latest 50, newest first', async () => {
    const { user } = await createUserWithTeam({ email: `quick-${Date.now()}@example.test`, password: 'long-enough-password', name: 'Quick' });
    for (let i = 0; i < 52; i++) {
      await createQuickCalculation({ userId: user.id, expression: `${i} m`, result: { value: i, unit: 'm', si: i, siUnit: 'm' } });
    }
    const { items, total } = await listQuickCalculationsByUser({ userId: user.id });
    expect(total).toBe(50);
    expect(items[0]!.expression).toBe('51 m');
    expect(items[49]!.expression).toBe('2 m');
    expect(items[0]!.result).toEqual({ value: 51, unit: 'm', si: 51, siUnit: 'm' });
  });

  it('should keep only the newest 50 of a user in the table, leaving other users’ rows alone', async () => {
    const stamp = Date.now();
    const { user } = await createUserWithTeam({ email: `quick-bound-${stamp}@example.test`, password: 'long-enough-password', name: 'Bound' });
    const { user: other } = await createUserWithTeam({ email: `quick-bound-other-${stamp}@example.test`, password: 'long-enough-password', name: 'Other' });
    await createQuickCalculation({ userId: other.id, expression: 'kept m', result: { value: 1, unit: 'm', si: 1, siUnit: 'm' } });
    expect(MAX_QUICK_HISTORY).toBe(50); // CONTRACT: "the user's last 50 quick calculations"
    for (let i = 0; i < 53; i++) {
      await createQuickCalculation({ userId: user.id, expression: `${i} m`, result: { value: i, unit: 'm', si: i, siUnit: 'm' } });
    }
    const stored = await storedExpressions(user.id);
    expect(stored).toHaveLength(50);
    // The three oldest are gone, the newest 50 are the ones the list shows.
    for (const gone of ['0 m', '1 m', '2 m']) expect(stored).not.toContain(gone);
    expect(stored).toEqual((await listQuickCalculationsByUser({ userId: user.id })).items.map((i) => i.expression).sort());
    expect(await storedExpressions(other.id)).toEqual(['kept m']);
  });

  it('should keep one user’s list apart from another’s', async () => {
    const { user } = await createUserWithTeam({ email: `quick-other-${Date.now()}@example.test`, password: 'long-enough-password', name: 'Other' });
    expect((await listQuickCalculationsByUser({ userId: user.id })).total).toBe(0);
  });
});
