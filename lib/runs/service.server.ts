import 'server-only';
import { requireSheetRole } from '@/lib/auth/guard';
import { countActiveRunsByRequester, getRun, getRunResults, getRunResultsText, type RunRecord } from '@/lib/db/runs';
import { getSheetDraft } from '@/lib/db/sheets';
import { readRevision } from '@/lib/db/revisions';
import { appendRawMembers } from '@/lib/http/json-text';
import { conflict, forbidden, rateLimited } from '@/lib/errors';
import { requestRun, requestRunCancel } from '@/lib/jobs/runs';
import { requireValidDocument } from '@/lib/sheet/evaluation.server';
import type { SheetResults } from '@/lib/engine';

/** Runs one user may have queued or running at once (beyond: 429). */
export const MAX_ACTIVE_RUNS_PER_USER = 3;

/** The run as the API shows it (CONTRACT §6b). */
export function toRunBody(run: RunRecord) {
  return {
    id: run.id,
    sheetId: run.sheetId,
    status: run.status,
    progress: run.progress,
    draftVersion: run.draftVersion,
    revision: run.revisionNumber,
    startedAt: run.startedAt,
    finishedAt: run.finishedAt,
    ...(run.error ? { error: run.error } : {}),
  };
}

/** Starts a run of the stored draft (which must still be at `draftVersion`) or of a revision. */
export async function startSheetRun({
  sheetId,
  userId,
  draftVersion,
  revision,
}: {
  sheetId: string;
  userId: string;
  draftVersion?: number;
  revision?: number;
}): Promise<RunRecord> {
  if ((await countActiveRunsByRequester({ requesterId: userId })) >= MAX_ACTIVE_RUNS_PER_USER) {
    throw rateLimited(`You have ${MAX_ACTIVE_RUNS_PER_USER} runs queued or running, the most allowed at once.`, 10);
  }
  if (revision !== undefined) {
    const stored = await readRevision({ sheetId, number: revision });
    const document = requireValidDocument(stored.document);
    return requestRun({ sheetId, requesterId: userId, document, revisionNumber: revision });
  }
  const draft = await getSheetDraft({ sheetId });
  if (draft.version !== draftVersion) {
    throw conflict(`The draft is at version ${draft.version}, not ${draftVersion}.`, { current: { version: draft.version } });
  }
  const document = requireValidDocument(draft.document, 'draft');
  return requestRun({ sheetId, requesterId: userId, document, draftVersion: draft.version });
}

/** A run with its results when done; 404 unless the user may read its sheet. */
export async function readSheetRun({ runId, userId }: { runId: string; userId: string }): Promise<{ run: ReturnType<typeof toRunBody>; results?: SheetResults }> {
  const run = await getRun({ runId });
  await requireSheetRole({ userId, sheetId: run.sheetId, action: 'read' });
  if (run.status !== 'done') return { run: toRunBody(run) };
  const results = await getRunResults({ runId });
  return { run: toRunBody(run), ...(results ? { results } : {}) };
}

/**
 * `readSheetRun`'s answer as JSON text, for the API: the results are spliced in as PostgreSQL writes them (see
 * readRevisionJson for why); the same values and keys as `JSON.stringify(await readSheetRun(…))`.
 */
export async function readSheetRunJson({ runId, userId }: { runId: string; userId: string }): Promise<string> {
  const run = await getRun({ runId });
  await requireSheetRole({ userId, sheetId: run.sheetId, action: 'read' });
  const body = { run: toRunBody(run) };
  if (run.status !== 'done') return JSON.stringify(body);
  const results = await getRunResultsText({ runId });
  return appendRawMembers(body, results === null ? [] : [['results', results]]);
}

/** Cancels a run: its requester or an owner; others 403, non-members 404; a finished run 409. */
export async function cancelSheetRun({ runId, userId }: { runId: string; userId: string }): Promise<{ run: ReturnType<typeof toRunBody> }> {
  const run = await getRun({ runId });
  const { role } = await requireSheetRole({ userId, sheetId: run.sheetId, action: 'read' });
  if (run.requesterId !== userId && role !== 'owner') throw forbidden('Only who started a run, or an owner, may cancel it.');
  if (run.status !== 'queued' && run.status !== 'running') {
    throw conflict(`The run has already ended (${run.status}).`, { run: toRunBody(run) });
  }
  const after = await requestRunCancel({ runId });
  if (after.status !== 'cancelled') {
    throw conflict(`The run has already ended (${after.status}).`, { run: toRunBody(after) });
  }
  return { run: toRunBody(after) };
}
