import 'server-only';
import { AppError, badRequest } from '@/lib/errors';
import { parseSheetDocument, type EngineError, type SheetDocument, type SheetResults } from '@/lib/engine';
import type { DatasetLookup } from '@/lib/engine/dataset';
import { runEvaluate, runEvaluateIncremental } from '@/lib/evaluation/pool';
import { changedBlockIds } from './document-edits';
import { ResultsCache } from './results-cache.server';
import type { SheetDocument as ClientDocument } from './types';

/** A parsed document or a 400 naming the first fault (the contract's "invalid document"). */
export function requireValidDocument(input: unknown, prefix = 'document'): SheetDocument {
  const parsed = parseSheetDocument(input);
  if (!parsed.ok) {
    const field = parsed.path ? `${prefix}.${parsed.path}` : prefix;
    throw badRequest(`${field}: ${parsed.message}`, field);
  }
  return parsed.document;
}

/** Engine faults become a 400 with the engine's message; time limits and the rest pass through. */
export function asEvaluationError(error: unknown): Error {
  if (error instanceof AppError) return error;
  // By name: an error may come from another copy of the engine module (the worker bundle, a route chunk).
  if (error instanceof Error && (error.name === 'EngineError' || error.name === 'InputError')) {
    const engineError = error as EngineError;
    // The pool's time and memory limits are not faults of the document: 422 with the reason.
    if (engineError.code === 'limit_exceeded') return new AppError('limit_exceeded', error.message);
    const position = engineError.position;
    if (typeof position === 'number') return new AppError('validation', error.message, { detail: { position } });
    return badRequest(error.message);
  }
  return error instanceof Error ? error : new Error('evaluation failed');
}

const globalCache = globalThis as unknown as { __denudataResults?: ResultsCache<SheetDocument, SheetResults> };
const cache = (globalCache.__denudataResults ??= new ResultsCache<SheetDocument, SheetResults>(200));
/** The last unsaved evaluation of each (sheet, user): typing evaluates only what changed since. */
const globalUnsaved = globalThis as unknown as { __denudataUnsaved?: ResultsCache<SheetDocument, SheetResults> };
const unsavedCache = (globalUnsaved.__denudataUnsaved ??= new ResultsCache<SheetDocument, SheetResults>(200, 32 * 1024 * 1024));

/** Which of the document's datasets were available: results depend on it besides the draft version. */
const datasetKeyOf = (datasets: DatasetLookup | undefined) => (datasets ? [...datasets.keys()].sort().join(',') : '');

/** Recomputes only the blocks changed since `previous` (and what depends on them), or everything without one. */
async function evaluateFrom(
  previous: { document: SheetDocument; results: SheetResults } | undefined,
  document: SheetDocument,
  owner: { userId: string; key: string },
  datasets: DatasetLookup | undefined,
): Promise<{ results: SheetResults; evaluatedBlockIds: string[] }> {
  if (previous) {
    const changed = changedBlockIds(previous.document as ClientDocument, document as ClientDocument);
    return runEvaluateIncremental(document, previous.results, changed, owner, datasets);
  }
  const results = await runEvaluate(document, owner, datasets);
  return { results, evaluatedBlockIds: document.blocks.filter((b) => b.type !== 'note').map((b) => b.id) };
}

/**
 * Results of a sheet's stored draft, recomputing only what changed since the last evaluation of
 * that sheet in this process (by block id), or nothing when the draft version and the datasets it
 * could resolve are the same. `datasets` holds the team's datasets the document refers to.
 */
export async function evaluateDraft({
  sheetId,
  draftVersion,
  document,
  userId,
  datasets,
}: {
  sheetId: string;
  draftVersion: number;
  document: SheetDocument;
  /** Who asks (the pool's per-user limits; a newer evaluation of the sheet replaces a queued one). */
  userId: string;
  /** The team's datasets the document refers to. */
  datasets?: DatasetLookup;
}): Promise<{ draftVersion: number; results: SheetResults; evaluatedBlockIds: string[] }> {
  const previous = cache.get(sheetId);
  const datasetKey = datasetKeyOf(datasets);
  try {
    if (previous && previous.draftVersion === draftVersion && (previous.datasetKey ?? '') === datasetKey) {
      return { draftVersion, results: previous.results, evaluatedBlockIds: [] };
    }
    const { results, evaluatedBlockIds } = await evaluateFrom(previous, document, { userId, key: sheetId }, datasets);
    cache.set(sheetId, { draftVersion, document, results, datasetKey });
    return { draftVersion, results, evaluatedBlockIds };
  } catch (error) {
    throw asEvaluationError(error);
  }
}

/**
 * Results of a user's unsaved edits of a sheet (CONTRACT §6b): nothing is stored. Incremental against
 * the same user's last unsaved evaluation of the sheet, or else the stored draft's last results, when
 * the same datasets resolved; a full evaluation otherwise. Queued under a key of its own, so a newer
 * keystroke replaces a queued one but never the evaluation of the stored draft.
 */
export async function evaluateUnsaved({
  sheetId,
  draftVersion,
  document,
  userId,
  datasets,
}: {
  sheetId: string;
  /** The stored draft's version when the request came (for the answer only). */
  draftVersion: number;
  document: SheetDocument;
  userId: string;
  datasets?: DatasetLookup;
}): Promise<{ draftVersion: number; unsaved: true; results: SheetResults; evaluatedBlockIds: string[] }> {
  const slot = `${sheetId}|${userId}`;
  const datasetKey = datasetKeyOf(datasets);
  const candidates = [unsavedCache.get(slot), cache.get(sheetId)];
  const previous = candidates.find((entry) => entry && (entry.datasetKey ?? '') === datasetKey);
  const owner = { userId, key: `${sheetId}:unsaved` };
  try {
    const { results, evaluatedBlockIds } = await evaluateFrom(previous, document, owner, datasets);
    // Kept per user with version 0, so any stored draft's entry stays separate and authoritative.
    unsavedCache.set(slot, { draftVersion: 0, document, results, datasetKey });
    return { draftVersion, unsaved: true, results, evaluatedBlockIds };
  } catch (error) {
    throw asEvaluationError(error);
  }
}
