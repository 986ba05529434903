import { requireSession } from '@/lib/auth/guard';
import { MAX_DATASET_BODY_BYTES, jsonText, notAllowed, parseJsonText, parseWith, readBodyText, route } from '@/lib/http';
import { badRequest } from '@/lib/errors';
import { AnswerCache } from '@/lib/evaluation/answer-cache';
import { runEvaluate } from '@/lib/evaluation/pool';
import { asEvaluationError, requireValidDocument } from '@/lib/sheet/evaluation.server';
import { checkCanonicalDataset } from '@/lib/datasets/canonical';
import { datasetReferences } from '@/lib/datasets/references';
import { BUNDLE_FORMAT, bundleSchema } from '@/lib/datasets/schema';
import { checkBundleDatasets } from '@/lib/db/dataset-bundles';
import { loadDatasetLookup } from '@/lib/db/datasets';
import type { DatasetCanonical } from '@/lib/engine/dataset';
import { consumeRateLimit } from '@/lib/rate-limit';
import { evaluateBodySchema } from './schema';

// Answers of bodies that depend on nothing else (lib/evaluation/answer-cache.ts), one cache per process.
const globalAnswers = globalThis as unknown as { __denudataEvaluateAnswers?: AnswerCache };
const answers = (globalAnswers.__denudataEvaluateAnswers ??= new AnswerCache());

/**
 * Full evaluation of a posted document; nothing is stored. Any signed-in user. A data input resolves
 * from the datasets in the body first, then from the user's current team (CONTRACT §7.6). A body seen
 * before whose answer depended on the body alone is answered from the answer cache (same text).
 */
export const POST = route(async (request) => {
  const { user, current: team } = await requireSession();
  await consumeRateLimit(['evaluationUser', user.id]);
  const text = await readBodyText(request, MAX_DATASET_BODY_BYTES);
  const key = answers.keyOf(text);
  const cached = answers.get(key);
  if (cached !== undefined) return jsonText(cached);
  const body = parseJsonText(text, evaluateBodySchema);
  const lookup = new Map<string, DatasetCanonical>();
  let raw: unknown;
  if ('document' in body && !('format' in body)) {
    raw = body.document;
    (body.datasets ?? []).forEach((entry, index) => {
      const checked = checkCanonicalDataset(entry);
      if (!checked.ok) throw badRequest(`datasets[${index}]: ${checked.message}`, `datasets[${index}]`);
      lookup.set(checked.sha256, checked.dataset);
    });
  } else if (body.format === BUNDLE_FORMAT) {
    const bundle = parseWith(bundleSchema, body);
    raw = bundle.document;
    for (const item of checkBundleDatasets(bundle.datasets)) lookup.set(item.sha256, item.dataset);
  } else {
    raw = body;
  }
  const document = requireValidDocument(raw, 'document');
  const missing = datasetReferences(document).filter((h) => !lookup.has(h));
  if (missing.length) {
    if (team) for (const [sha, dataset] of await loadDatasetLookup({ teamId: team.id, sha256s: missing })) lookup.set(sha, dataset);
  }
  let answer: string;
  try {
    answer = JSON.stringify(await runEvaluate(document, { userId: user.id }, lookup));
  } catch (error) {
    throw asEvaluationError(error);
  }
  // Kept only when no dataset came from the team: then the answer is a function of the body's text.
  if (missing.length === 0) answers.set(key, answer);
  return jsonText(answer);
});

export const { GET, PUT, PATCH, DELETE } = notAllowed('POST');
