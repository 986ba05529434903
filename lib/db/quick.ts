import 'server-only';
import { QuickCalculation } from '@/models';
import { db } from './index';

/**
 * How many quick calculations are kept per user: the list the palette shows (CONTRACT: "the user's last 50").
 * Older ones are deleted when a new one is stored, so a user within the rate limit (120 a minute) cannot
 * grow the table without bound.
 */
export const MAX_QUICK_HISTORY = 50;

export type QuickAnswer = { value: number | string; unit: string; si: number | string; siUnit: string };
export type QuickRecord = { id: string; expression: string; result: QuickAnswer; createdAt: string };

const toRecord = (row: QuickCalculation): QuickRecord => ({
  id: String(row.id),
  expression: row.expression,
  result: row.result as QuickAnswer,
  createdAt: row.createdAt.toISOString(),
});

/** Stores one successful quick calculation of a user, keeping only their newest MAX_QUICK_HISTORY. */
export async function createQuickCalculation({
  userId,
  expression,
  result,
}: {
  userId: string;
  expression: string;
  result: QuickAnswer;
}): Promise<QuickRecord> {
  const sequelize = db();
  const row = await sequelize.transaction(async (transaction) => {
    const created = await QuickCalculation.create({ userId, expression, result }, { transaction });
    // Everything of this user's but the newest MAX_QUICK_HISTORY (the order the list uses).
    await sequelize.query(
      `DELETE FROM quick_calculations WHERE user_id = $1 AND id NOT IN (
         SELECT id FROM quick_calculations WHERE user_id = $1 ORDER BY created_at DESC, id DESC LIMIT $2)`,
      { bind: [userId, MAX_QUICK_HISTORY], transaction },
    );
    return created;
  });
  return toRecord(row);
}

/** A user's latest quick calculations, newest first. */
export async function listQuickCalculationsByUser({ userId, limit = MAX_QUICK_HISTORY }: { userId: string; limit?: number }): Promise<{ items: QuickRecord[]; total: number }> {
  db();
  const rows = await QuickCalculation.findAll({ where: { userId }, order: [['createdAt', 'DESC'], ['id', 'DESC']], limit });
  const items = rows.map(toRecord);
  return { items, total: items.length };
}
