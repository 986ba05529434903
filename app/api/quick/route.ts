import { requireUser } from '@/lib/auth/guard';
import { createQuickCalculation, type QuickAnswer } from '@/lib/db/quick';
import { jsonText, notAllowed, readJson, route } from '@/lib/http';
import { AnswerCache } from '@/lib/evaluation/answer-cache';
import { runQuick } from '@/lib/evaluation/pool';
import { asEvaluationError } from '@/lib/sheet/evaluation.server';
import { consumeRateLimit } from '@/lib/rate-limit';
import { quickBodySchema } from './schema';

// Answers by expression text, one cache per process (lib/evaluation/answer-cache.ts): the palette previews an
// expression while it is typed and then computes the same text again when it is entered. 1,024 answers,
// 4 MB; every expression the body schema lets through (at most 2,000 characters) is keyed.
const globalAnswers = globalThis as unknown as { __denudataQuickAnswers?: AnswerCache };
const answers = (globalAnswers.__denudataQuickAnswers ??= new AnswerCache(1024, 4 * 1024 * 1024, 4096));

/** One expression → its value with units (stored in the user's recent list unless a preview). */
export const POST = route(async (request) => {
  const user = await requireUser();
  await consumeRateLimit(['evaluationUser', user.id]);
  const { expr, preview } = await readJson(request, quickBodySchema);
  const key = answers.keyOf(expr);
  let text = answers.get(key);
  if (text === undefined) {
    let result;
    try {
      result = await runQuick(expr, { userId: user.id });
    } catch (error) {
      throw asEvaluationError(error);
    }
    const { value, unit, si, siUnit, warnings } = result;
    text = JSON.stringify({ value, unit, si, siUnit, warnings });
    answers.set(key, text);
  }
  if (!preview) {
    const { value, unit, si, siUnit } = JSON.parse(text) as QuickAnswer;
    await createQuickCalculation({ userId: user.id, expression: expr, result: { value, unit, si, siUnit } });
  }
  return jsonText(text);
});

export const { GET, PUT, PATCH, DELETE } = notAllowed('POST');
