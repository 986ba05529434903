import { requireUser } from '@/lib/auth/guard';
import { createQuickCalculation } from '@/lib/db/quick';
import { json, notAllowed, readJson, route } from '@/lib/http';
import { runQuick } from '@/lib/evaluation/pool';
import { asEvaluationError } from '@/lib/sheet/evaluation.server';
import { consumeRateLimit } from '@/lib/rate-limit';
import { quickBodySchema } from './schema';

/** One expression → its value with units (stored in the user's recent list unless a preview). */
export const POST = route(async (request) => {
  const user = await requireUser();
  await consumeRateLimit(['evaluationUser', user.id]);
  const { expr, preview } = await readJson(request, quickBodySchema);
  let result;
  try {
    result = await runQuick(expr, { userId: user.id });
  } catch (error) {
    throw asEvaluationError(error);
  }
  const answer = { value: result.value, unit: result.unit, si: result.si, siUnit: result.siUnit };
  if (!preview) await createQuickCalculation({ userId: user.id, expression: expr, result: answer });
  return json({ ...answer, warnings: result.warnings });
});

export const { GET, PUT, PATCH, DELETE } = notAllowed('POST');
