import 'server-only';
import { QuickCalculation } from '@/models';
import { db } from './index';

export type QuickAnswer = { value: number | string; unit: string; si: number | string; siUnit: string };
export type QuickRecord = { id: string; expression: string; result: QuickAnswer; createdAt: string };

const toRecord = (row: QuickCalculation): QuickRecord => ({
  id: String(row.id),
  expression: row.expression,
  result: row.result as QuickAnswer,
  createdAt: row.createdAt.toISOString(),
});

/** Stores one successful quick calculation of a user. */
export async function createQuickCalculation({
  userId,
  expression,
  result,
}: {
  userId: string;
  expression: string;
  result: QuickAnswer;
}): Promise<QuickRecord> {
  db();
  const row = await QuickCalculation.create({ userId, expression, result });
  return toRecord(row);
}

/** A user's latest quick calculations, newest first. */
export async function listQuickCalculationsByUser({ userId, limit = 50 }: { userId: string; limit?: number }): Promise<{ items: QuickRecord[]; total: number }> {
  db();
  const rows = await QuickCalculation.findAll({ where: { userId }, order: [['createdAt', 'DESC'], ['id', 'DESC']], limit });
  const items = rows.map(toRecord);
  return { items, total: items.length };
}
