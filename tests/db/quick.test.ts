import { describe, expect, it } from 'vitest';
import { createQuickCalculation, listQuickCalculationsByUser } from '@/lib/db/quick';
import { createUserWithTeam } from '@/lib/db/users';

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

  it('should keep one user’s list apart from another’s', async () => {
    const { user } = await createUserWithTeam({ email: `quick-other-${Date.now()}@example.test`, password: 'long-enough-password', name: 'Other' });
    expect((await listQuickCalculationsByUser({ userId: user.id })).total).toBe(0);
  });
});
