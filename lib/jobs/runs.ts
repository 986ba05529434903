import 'server-only';
import { ENGINE_VERSION, EngineError, hashSheetDocument, type SheetDocument, type SheetResults } from '@/lib/engine';
import {
  cancelRun,
  failRun,
  findCachedRunId,
  findFinishedRunFor,
  finishRun,
  getRun,
  getRunDocument,
  insertRun,
  markRunStarted,
  recordRunProgress,
  storeRevisionResultsFromRun,
  type RunRecord,
} from '@/lib/db/runs';
import { createEvaluationPool } from '@/lib/evaluation/pool';
import { resolveDocumentDatasets } from '@/lib/db/datasets';
import { Sheet } from '@/models';
import { jobQueue, QUEUES } from './queue';

/**
 * Long runs (CONTRACT §6b): an evaluation too costly for a request runs as a job on the shared
 * PostgreSQL queue. Any app instance may take it; the run's row holds its status and progress
 * (written at least every second while it runs) and, when done, its results. Cancelling sets the
 * row's status; the instance running it sees that at its next progress write and stops the
 * evaluation thread. Results are cached by document hash and engine version: a run of a document
 * already evaluated is done at once.
 */
export const RUN_QUEUE = QUEUES.evaluationRun.name;
/** A long run's time limit, counted from when it starts running. */
export const RUN_TIME_LIMIT_MS = Number(process.env.DENUDATA_RUN_TIME_LIMIT_S ?? 600) * 1000;
/** How often a running run writes its progress (and checks for a cancel). */
export const PROGRESS_WRITE_MS = 500;
/** Runs evaluated at once by one app instance (each on its own thread, apart from the request pool). */
const RUN_THREADS = 1;

const globalForRuns = globalThis as unknown as {
  denudataRunWorker?: Promise<void>;
  denudataRunPool?: ReturnType<typeof createEvaluationPool>;
};

function runPool(): ReturnType<typeof createEvaluationPool> {
  globalForRuns.denudataRunPool ??= createEvaluationPool({ threads: RUN_THREADS, timeLimitMs: RUN_TIME_LIMIT_MS, heapLimitMb: 1024 });
  return globalForRuns.denudataRunPool;
}

/** Evaluates one run: queued → running → done, failed or cancelled. Exported for tests. */
export async function executeRun(runId: string): Promise<void> {
  if (!(await markRunStarted({ runId }))) return; // cancelled before it started, or taken elsewhere
  const document = await getRunDocument({ runId });
  if (!document) return;
  // Data inputs resolve from the sheet's team, as for a request (CONTRACT §7.6).
  const { sheetId } = await getRun({ runId });
  const sheet = await Sheet.findByPk(sheetId, { attributes: ['id', 'teamId'] });
  const resolved = sheet ? await resolveDocumentDatasets({ teamId: sheet.teamId, document }) : null;
  const datasets = resolved?.lookup ?? new Map();
  const cacheable = resolved !== null && resolved.missing.length === 0;
  const controller = new AbortController();
  let latest = 0;
  let writing: Promise<void> = Promise.resolve();
  const write = () => {
    writing = writing.then(async () => {
      const stillRunning = await recordRunProgress({ runId, progress: latest }).catch(() => true);
      if (!stillRunning) controller.abort();
    });
  };
  const timer = setInterval(write, PROGRESS_WRITE_MS);
  try {
    const results = await runPool().run<SheetResults>(
      { kind: 'evaluate', document, ...(datasets.size ? { datasets } : {}) },
      {
        onProgress: (fraction) => {
          latest = fraction;
        },
        signal: controller.signal,
      },
    );
    clearInterval(timer);
    await writing;
    await finishRun({ runId, results, cacheable });
  } catch (error) {
    clearInterval(timer);
    await writing;
    if (controller.signal.aborted) return; // cancelled: the row says so already
    const message = error instanceof EngineError ? error.message : 'the evaluation failed unexpectedly';
    if (!(error instanceof EngineError)) console.error('[denudata] run failed:', error instanceof Error ? error.message : error);
    await failRun({ runId, error: message });
  }
}

/** Starts this process's worker for the run queue (once per process; with the other job workers). */
export function startRunWorker(): Promise<void> {
  globalForRuns.denudataRunWorker ??= (async () => {
    const boss = await jobQueue();
    await boss.work<{ runId: string }>(RUN_QUEUE, { batchSize: 1, pollingIntervalSeconds: 1 }, async (jobs) => {
      for (const job of jobs) await executeRun(job.data.runId);
    });
  })().catch((error: unknown) => {
    globalForRuns.denudataRunWorker = undefined;
    throw error;
  });
  return globalForRuns.denudataRunWorker;
}

/** Stops the run worker's threads (tests, shutdown; the queue itself stops with stopJobQueue). */
export async function closeRunPool(): Promise<void> {
  const pool = globalForRuns.denudataRunPool;
  globalForRuns.denudataRunPool = undefined;
  globalForRuns.denudataRunWorker = undefined;
  if (pool) await pool.close();
}

/**
 * Creates a run of a validated document (for a draft version or a revision) and queues it; done at
 * once when the same document was evaluated by the same engine before.
 */
export async function requestRun({
  sheetId,
  requesterId,
  document,
  draftVersion = null,
  revisionNumber = null,
}: {
  sheetId: string;
  requesterId: string;
  document: SheetDocument;
  draftVersion?: number | null;
  revisionNumber?: number | null;
}): Promise<RunRecord> {
  const documentHash = hashSheetDocument(document);
  const cachedFrom = await findCachedRunId({ documentHash, engineVersion: ENGINE_VERSION });
  if (cachedFrom) {
    // The same request answered before (same sheet, target, document and engine): that run again, no new row.
    const again = await findFinishedRunFor({ sheetId, draftVersion, revisionNumber, documentHash, engineVersion: ENGINE_VERSION });
    if (again) return again;
  }
  const run = await insertRun({
    sheetId,
    requesterId,
    draftVersion,
    revisionNumber,
    document,
    documentHash,
    engineVersion: ENGINE_VERSION,
    cachedFrom,
  });
  if (run.status === 'done' && cachedFrom && revisionNumber !== null) {
    // Done at once from the cache: a revision still without results takes them now (copied in PostgreSQL).
    await storeRevisionResultsFromRun({ sheetId, number: revisionNumber, runId: cachedFrom });
  }
  await enqueueRun(run);
  return run;
}

/** Queues the job of a run inserted as queued (after its transaction committed); nothing for a finished run. */
export async function enqueueRun(run: RunRecord): Promise<void> {
  if (run.status !== 'queued') return;
  const boss = await jobQueue();
  await boss.send(RUN_QUEUE, { runId: run.id }, { retryLimit: 0, expireInSeconds: Math.ceil(RUN_TIME_LIMIT_MS / 1000) + 120 });
  void startRunWorker().catch((error: unknown) => console.error('[denudata] run worker:', error instanceof Error ? error.message : error));
}

/** Cancels a queued or running run (the caller has checked who may). */
export async function requestRunCancel({ runId }: { runId: string }): Promise<RunRecord> {
  return cancelRun({ runId });
}

export { getRun };
