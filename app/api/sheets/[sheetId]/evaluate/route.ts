import { requireSheetRole, requireUser } from '@/lib/auth/guard';
import { resolveDocumentDatasets } from '@/lib/db/datasets';
import { getSheetDraft } from '@/lib/db/sheets';
import { checkJsonShape, json, notAllowed, parseWith, readBodyText, route } from '@/lib/http';
import { badRequest } from '@/lib/errors';
import { needsLongRun } from '@/lib/engine';
import { startSheetRun } from '@/lib/runs/service.server';
import { evaluateDraft, requireValidDocument } from '@/lib/sheet/evaluation.server';
import { consumeRateLimit } from '@/lib/rate-limit';
import { evaluateDraftSchema } from './schema';

type Context = { params: Promise<{ sheetId: string }> };

/** Results of the stored draft (incremental on the server) with the draft version they belong to. */
export const POST = route(async (request, { params }: Context) => {
  const user = await requireUser();
  const { sheetId } = await params;
  const { sheet } = await requireSheetRole({ userId: user.id, sheetId, action: 'read' });
  await consumeRateLimit(['evaluationUser', user.id]);
  const text = await readBodyText(request);
  if (text.trim()) {
    let body: unknown;
    try {
      body = JSON.parse(text);
    } catch {
      throw badRequest('The request body is not valid JSON.');
    }
    checkJsonShape(body);
    parseWith(evaluateDraftSchema, body);
  }
  const draft = await getSheetDraft({ sheetId });
  const document = requireValidDocument(draft.document, 'draft');
  // Too costly for a request (CONTRACT §6b): evaluated as a long run instead → 202 {run}.
  if (needsLongRun(document)) {
    const run = await startSheetRun({ sheetId, userId: user.id, draftVersion: draft.version });
    return json({ draftVersion: draft.version, run: { id: run.id, status: run.status, progress: run.progress } }, 202);
  }
  // Data inputs resolve from the sheet's team; an unknown hash is a block error in a draft.
  const { lookup } = await resolveDocumentDatasets({ teamId: sheet.teamId, document });
  return json(await evaluateDraft({ sheetId, draftVersion: draft.version, document, userId: user.id, datasets: lookup }));
});

export const { GET, PUT, PATCH, DELETE } = notAllowed('POST');
