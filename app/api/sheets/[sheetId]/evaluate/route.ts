import { requireSheetRole, requireUser } from '@/lib/auth/guard';
import { resolveDocumentDatasets } from '@/lib/db/datasets';
import { getSheetDraft } from '@/lib/db/sheets';
import { checkJsonShape, json, notAllowed, parseWith, readBodyText, route } from '@/lib/http';
import { badRequest } from '@/lib/errors';
import { needsLongRun } from '@/lib/engine';
import { startSheetRun } from '@/lib/runs/service.server';
import { evaluateDraft, evaluateUnsaved, requireValidDocument } from '@/lib/sheet/evaluation.server';
import { consumeRateLimit } from '@/lib/rate-limit';
import { evaluateDraftSchema } from './schema';

type Context = { params: Promise<{ sheetId: string }> };

/**
 * Results of the stored draft (incremental on the server) with the draft version they belong to; or,
 * with `{document}`, of the user's unsaved edits (CONTRACT §6b): evaluated against the sheet's team's
 * datasets, never stored, and incremental against the user's last unsaved evaluation of the sheet.
 * Every role that reads the sheet may evaluate (CONTRACT §5); nothing is written either way.
 */
export const POST = route(async (request, { params }: Context) => {
  const user = await requireUser();
  const { sheetId } = await params;
  const { sheet } = await requireSheetRole({ userId: user.id, sheetId, action: 'read' });
  await consumeRateLimit(['evaluationUser', user.id]);
  // The same bound as a draft save (MAX_BODY_BYTES): the body carries at most one document.
  const text = await readBodyText(request);
  let unsaved: unknown;
  if (text.trim()) {
    let body: unknown;
    try {
      body = JSON.parse(text);
    } catch {
      throw badRequest('The request body is not valid JSON.');
    }
    checkJsonShape(body);
    unsaved = parseWith(evaluateDraftSchema, body).document;
  }
  const draft = await getSheetDraft({ sheetId });
  if (unsaved !== undefined) {
    const document = requireValidDocument(unsaved, 'document');
    // Too costly for a request: an unsaved document cannot become a run (runs evaluate stored
    // drafts and revisions), so nothing is evaluated now; saving starts the long run.
    const { lookup } = await resolveDocumentDatasets({ teamId: sheet.teamId, document });
    if (needsLongRun(document, { datasetRows: (sha256) => lookup.get(sha256)?.rows.length })) {
      return json({ draftVersion: draft.version, unsaved: true, run: null, longRun: true }, 202);
    }
    return json(await evaluateUnsaved({ sheetId, draftVersion: draft.version, document, userId: user.id, datasets: lookup }));
  }
  const document = requireValidDocument(draft.document, 'draft');
  // Data inputs resolve from the sheet's team; an unknown hash is a block error in a draft.
  const { lookup } = await resolveDocumentDatasets({ teamId: sheet.teamId, document });
  // Too costly for a request (CONTRACT §6b): evaluated as a long run instead → 202 {run}. The estimate
  // knows the row counts of the datasets (fits and grids from data scale with them).
  if (needsLongRun(document, { datasetRows: (sha256) => lookup.get(sha256)?.rows.length })) {
    const run = await startSheetRun({ sheetId, userId: user.id, draftVersion: draft.version });
    return json({ draftVersion: draft.version, run: { id: run.id, status: run.status, progress: run.progress } }, 202);
  }
  return json(await evaluateDraft({ sheetId, draftVersion: draft.version, document, userId: user.id, datasets: lookup }));
});

export const { GET, PUT, PATCH, DELETE } = notAllowed('POST');
