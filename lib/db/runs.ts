import 'server-only';
import { randomUUID } from 'node:crypto';
import { QueryTypes, type Transaction } from 'sequelize';
import type { SheetDocument, SheetResults } from '@/lib/engine';
import { notFound } from '@/lib/errors';
import { db } from './index';

/** CONTRACT §6b: the states of a long run. */
export type RunStatus = 'queued' | 'running' | 'done' | 'failed' | 'cancelled';

export interface RunRecord {
  id: string;
  sheetId: string;
  requesterId: string;
  draftVersion: number | null;
  revisionNumber: number | null;
  documentHash: string;
  engineVersion: string;
  status: RunStatus;
  progress: number;
  error: string | null;
  createdAt: string;
  startedAt: string | null;
  finishedAt: string | null;
}

interface RunRow {
  id: string;
  sheet_id: string;
  requester_id: string;
  draft_version: number | null;
  revision_number: number | null;
  document_hash: string;
  engine_version: string;
  status: RunStatus;
  progress: number;
  error: string | null;
  created_at: Date;
  started_at: Date | null;
  finished_at: Date | null;
}

const COLUMNS =
  'id, sheet_id, requester_id, draft_version, revision_number, document_hash, engine_version, status, progress, error, created_at, started_at, finished_at';

function toRecord(row: RunRow): RunRecord {
  return {
    id: row.id,
    sheetId: row.sheet_id,
    requesterId: row.requester_id,
    draftVersion: row.draft_version,
    revisionNumber: row.revision_number,
    documentHash: row.document_hash,
    engineVersion: row.engine_version,
    status: row.status,
    progress: Number(row.progress),
    error: row.error,
    createdAt: row.created_at.toISOString(),
    startedAt: row.started_at?.toISOString() ?? null,
    finishedAt: row.finished_at?.toISOString() ?? null,
  };
}

/** The newest finished, reusable run of a document and engine that holds its results (the cache by hash). */
const CACHE_HOLDER = `WHERE document_hash = :documentHash AND engine_version = :engineVersion AND status = 'done'
  AND cacheable AND results IS NOT NULL ORDER BY finished_at DESC LIMIT 1`;

/**
 * The newest finished, reusable run of the same document and engine that holds its results (the cache by hash),
 * or null: only its id, so a cached run request never reads a results document (up to 16 MB) into the app.
 */
export async function findCachedRunId({ documentHash, engineVersion }: { documentHash: string; engineVersion: string }): Promise<string | null> {
  const rows = await db().query<{ id: string }>(
    `SELECT id FROM runs ${CACHE_HOLDER}`,
    { replacements: { documentHash, engineVersion }, type: QueryTypes.SELECT },
  );
  return rows[0]?.id ?? null;
}

/** The results of an earlier finished run of the same document and engine, or null. */
export async function findCachedRunResults({ documentHash, engineVersion }: { documentHash: string; engineVersion: string }): Promise<SheetResults | null> {
  const rows = await db().query<{ results: SheetResults }>(
    `SELECT results FROM runs ${CACHE_HOLDER}`,
    { replacements: { documentHash, engineVersion }, type: QueryTypes.SELECT },
  );
  return rows[0]?.results ?? null;
}

/**
 * A finished run of this sheet for the same target (draft version or revision), document and engine, if there is
 * one: a repeated request for it is answered with that run rather than a new row.
 */
export async function findFinishedRunFor({
  sheetId,
  draftVersion,
  revisionNumber,
  documentHash,
  engineVersion,
}: {
  sheetId: string;
  draftVersion: number | null;
  revisionNumber: number | null;
  documentHash: string;
  engineVersion: string;
}): Promise<RunRecord | null> {
  const rows = await db().query<RunRow>(
    `SELECT ${COLUMNS} FROM runs WHERE sheet_id = :sheetId AND draft_version IS NOT DISTINCT FROM :draftVersion
       AND revision_number IS NOT DISTINCT FROM :revisionNumber AND document_hash = :documentHash
       AND engine_version = :engineVersion AND status = 'done' AND cacheable ORDER BY finished_at DESC LIMIT 1`,
    { replacements: { sheetId, draftVersion, revisionNumber, documentHash, engineVersion }, type: QueryTypes.SELECT },
  );
  return rows[0] ? toRecord(rows[0]) : null;
}

/** Inserts a run: queued, or done at once referring to the cached run that holds the results (never a copy). */
export async function insertRun({
  sheetId,
  requesterId,
  draftVersion,
  revisionNumber,
  document,
  documentHash,
  engineVersion,
  cachedFrom,
}: {
  sheetId: string;
  requesterId: string;
  draftVersion: number | null;
  revisionNumber: number | null;
  document: SheetDocument;
  documentHash: string;
  engineVersion: string;
  /** The id of the finished run that holds the results (findCachedRunId), or null for a run to be queued. */
  cachedFrom: string | null;
}, transaction?: Transaction): Promise<RunRecord> {
  const done = cachedFrom !== null;
  const rows = await db().query<RunRow>(
    `INSERT INTO runs (id, sheet_id, requester_id, draft_version, revision_number, document, document_hash, engine_version,
                       status, progress, results_from, started_at, finished_at)
     VALUES (:id, :sheetId, :requesterId, :draftVersion, :revisionNumber, :document, :documentHash, :engineVersion,
             :status, :progress, :resultsFrom, ${done ? 'now()' : 'NULL'}, ${done ? 'now()' : 'NULL'})
     RETURNING ${COLUMNS}`,
    {
      replacements: {
        id: randomUUID(),
        sheetId,
        requesterId,
        draftVersion,
        revisionNumber,
        document: JSON.stringify(document),
        documentHash,
        engineVersion,
        status: done ? 'done' : 'queued',
        progress: done ? 1 : 0,
        resultsFrom: cachedFrom,
      },
      type: QueryTypes.SELECT,
      ...(transaction ? { transaction } : {}),
    },
  );
  return toRecord(rows[0]!);
}

/** One run (404 when there is none). */
export async function getRun({ runId }: { runId: string }): Promise<RunRecord> {
  const rows = await db().query<RunRow>(`SELECT ${COLUMNS} FROM runs WHERE id = :runId`, {
    replacements: { runId },
    type: QueryTypes.SELECT,
  });
  if (!rows[0]) throw notFound('Run');
  return toRecord(rows[0]);
}

/** A run's results as JSON text: its own, or those of the run it was answered from (insertRun with cachedFrom). */
const HELD_RESULTS_TEXT = `(SELECT COALESCE(r.results, h.results)::text FROM runs r LEFT JOIN runs h ON h.id = r.results_from WHERE r.id = :runId)`;

/** The stored results of a finished run, or null. */
export async function getRunResults({ runId }: { runId: string }): Promise<SheetResults | null> {
  const text = await getRunResultsText({ runId });
  return text === null ? null : (JSON.parse(text) as SheetResults);
}

/** The stored results of a finished run as JSON text (as PostgreSQL writes them, never parsed here), or null. */
export async function getRunResultsText({ runId }: { runId: string }): Promise<string | null> {
  const rows = await db().query<{ results: string | null }>(`SELECT ${HELD_RESULTS_TEXT} AS results`, {
    replacements: { runId },
    type: QueryTypes.SELECT,
  });
  return rows[0]?.results ?? null;
}

/** The document a run evaluates (for the job). */
export async function getRunDocument({ runId }: { runId: string }): Promise<SheetDocument | null> {
  const rows = await db().query<{ document: SheetDocument }>(`SELECT document FROM runs WHERE id = :runId`, {
    replacements: { runId },
    type: QueryTypes.SELECT,
  });
  return rows[0]?.document ?? null;
}

/** queued → running; false when the run is no longer queued (cancelled, or taken by another worker). */
export async function markRunStarted({ runId }: { runId: string }): Promise<boolean> {
  const [, count] = await db().query(
    `UPDATE runs SET status = 'running', started_at = now(), heartbeat_at = now(), progress = 0 WHERE id = :runId AND status = 'queued'`,
    { replacements: { runId }, type: QueryTypes.UPDATE },
  );
  return count === 1;
}

/** Records progress (and the heartbeat) of a running run; false when it is no longer running (it was cancelled). */
export async function recordRunProgress({ runId, progress }: { runId: string; progress: number }): Promise<boolean> {
  const [, count] = await db().query(
    `UPDATE runs SET progress = GREATEST(progress, :progress), heartbeat_at = now() WHERE id = :runId AND status = 'running'`,
    { replacements: { runId, progress: Math.min(1, Math.max(0, progress)) }, type: QueryTypes.UPDATE },
  );
  return count === 1;
}

/**
 * running → done with the results; a run of a revision also stores them on the revision, in the
 * same transaction (the revision stops showing "evaluating"). False when the run was cancelled.
 */
export async function finishRun({
  runId,
  results,
  cacheable = true,
}: {
  runId: string;
  results: SheetResults;
  /** False when some dataset the document refers to was not at hand (its results are not reused by hash). */
  cacheable?: boolean;
}): Promise<boolean> {
  return db().transaction(async (transaction) => {
    const rows = await db().query<{ sheet_id: string; revision_number: number | null }>(
      `UPDATE runs SET status = 'done', progress = 1, results = :results, finished_at = now(), cacheable = :cacheable
       WHERE id = :runId AND status = 'running' RETURNING sheet_id, revision_number`,
      { replacements: { runId, results: JSON.stringify(results), cacheable }, type: QueryTypes.SELECT, transaction },
    );
    const row = rows[0];
    if (!row) return false;
    if (row.revision_number !== null) {
      await db().query(
        `UPDATE sheet_revisions SET results = :results WHERE sheet_id = :sheetId AND number = :number AND results IS NULL`,
        {
          replacements: { results: JSON.stringify(results), sheetId: row.sheet_id, number: row.revision_number },
          type: QueryTypes.UPDATE,
          transaction,
        },
      );
    }
    return true;
  });
}

/** running or queued → failed with a message safe to show. */
export async function failRun({ runId, error }: { runId: string; error: string }): Promise<void> {
  await db().query(
    `UPDATE runs SET status = 'failed', error = :error, finished_at = now() WHERE id = :runId AND status IN ('queued', 'running')`,
    { replacements: { runId, error: error.slice(0, 1000) }, type: QueryTypes.UPDATE },
  );
}

/** queued or running → cancelled; the record as it is afterwards (a finished run stays as it was). */
export async function cancelRun({ runId }: { runId: string }): Promise<RunRecord> {
  await db().query(
    `UPDATE runs SET status = 'cancelled', finished_at = now() WHERE id = :runId AND status IN ('queued', 'running')`,
    { replacements: { runId }, type: QueryTypes.UPDATE },
  );
  return getRun({ runId });
}

/** The newest run of a sheet that is still going (queued or running), if any. */
export async function findActiveRunBySheet({ sheetId }: { sheetId: string }): Promise<RunRecord | null> {
  const rows = await db().query<RunRow>(
    `SELECT ${COLUMNS} FROM runs WHERE sheet_id = :sheetId AND status IN ('queued', 'running') ORDER BY created_at DESC LIMIT 1`,
    { replacements: { sheetId }, type: QueryTypes.SELECT },
  );
  return rows[0] ? toRecord(rows[0]) : null;
}

/** Runs of one requester still queued or running (each user may have a few at once). */
export async function countActiveRunsByRequester({ requesterId }: { requesterId: string }): Promise<number> {
  const rows = await db().query<{ count: string }>(
    `SELECT count(*) AS count FROM runs WHERE requester_id = :requesterId AND status IN ('queued', 'running')`,
    { replacements: { requesterId }, type: QueryTypes.SELECT },
  );
  return Number(rows[0]?.count ?? 0);
}

/**
 * A revision still without results takes those of a finished run (its own, or the run it refers to), copied
 * inside PostgreSQL; false when the revision already had results or the run has none.
 */
export async function storeRevisionResultsFromRun({ sheetId, number, runId }: { sheetId: string; number: number; runId: string }): Promise<boolean> {
  const [, count] = await db().query(
    `UPDATE sheet_revisions SET results = held.results::jsonb FROM (SELECT ${HELD_RESULTS_TEXT} AS results) held
      WHERE sheet_id = :sheetId AND number = :number AND sheet_revisions.results IS NULL AND held.results IS NOT NULL`,
    { replacements: { runId, sheetId, number }, type: QueryTypes.UPDATE },
  );
  return count === 1;
}

/** The newest run of each of the given revisions of a sheet (revisions without a run are absent). */
export async function latestRevisionRuns({ sheetId, numbers }: { sheetId: string; numbers: number[] }): Promise<Map<number, RunRecord>> {
  if (!numbers.length) return new Map();
  const rows = await db().query<RunRow>(
    `SELECT DISTINCT ON (revision_number) ${COLUMNS} FROM runs
      WHERE sheet_id = :sheetId AND revision_number IN (:numbers)
      ORDER BY revision_number, created_at DESC`,
    { replacements: { sheetId, numbers }, type: QueryTypes.SELECT },
  );
  return new Map(rows.map((row) => [row.revision_number!, toRecord(row)]));
}

/** The message of a run failed by the sweeper because its instance stopped writing its heartbeat. */
export const STALLED_RUN_MESSAGE = 'the evaluation stopped: the app instance running it ended before it finished; evaluate again';

/**
 * Runs marked running whose heartbeat is older than `staleSeconds` (their instance ended mid-run)
 * become failed with STALLED_RUN_MESSAGE; returns their ids.
 */
export async function failStalledRuns({ staleSeconds }: { staleSeconds: number }): Promise<string[]> {
  const rows = await db().query<{ id: string }>(
    `UPDATE runs SET status = 'failed', error = :error, finished_at = now()
     WHERE status = 'running' AND COALESCE(heartbeat_at, started_at) < now() - make_interval(secs => :staleSeconds)
     RETURNING id`,
    { replacements: { error: STALLED_RUN_MESSAGE, staleSeconds }, type: QueryTypes.SELECT },
  );
  return rows.map((row) => row.id);
}

/**
 * Runs still queued after `graceSeconds` with no job waiting or active for them on the queue (the
 * instance that saved them ended before it sent the job), oldest first, at most `limit`. Reads
 * pg-boss 10's job table (schema pgboss, `job`: name, data, state), read-only.
 */
export async function findOrphanedQueuedRuns({ queue, graceSeconds, limit }: { queue: string; graceSeconds: number; limit: number }): Promise<RunRecord[]> {
  const rows = await db().query<RunRow>(
    `SELECT ${COLUMNS} FROM runs r
     WHERE r.status = 'queued' AND r.created_at < now() - make_interval(secs => :graceSeconds)
       AND NOT EXISTS (
         SELECT 1 FROM pgboss.job j
         WHERE j.name = :queue AND j.data->>'runId' = r.id::text AND j.state IN ('created', 'retry', 'active')
       )
     ORDER BY r.created_at LIMIT :limit`,
    { replacements: { queue, graceSeconds, limit }, type: QueryTypes.SELECT },
  );
  return rows.map(toRecord);
}
