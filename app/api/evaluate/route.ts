import { requireUser } from '@/lib/auth/guard';
import { json, readJson, route } from '@/lib/http';
import { runEvaluate } from '@/lib/evaluation/pool';
import { asEvaluationError, requireValidDocument } from '@/lib/sheet/evaluation.server';
import { evaluateBodySchema } from './schema';

/** Full evaluation of a posted document; nothing is stored. Any signed-in user. */
export const POST = route(async (request) => {
  const user = await requireUser();
  const body = await readJson(request, evaluateBodySchema);
  const isEnvelope = 'document' in body && !('format' in body);
  const document = isEnvelope ? requireValidDocument(body.document, 'document') : requireValidDocument(body, 'document');
  try {
    return json(await runEvaluate(document, { userId: user.id }));
  } catch (error) {
    throw asEvaluationError(error);
  }
});
