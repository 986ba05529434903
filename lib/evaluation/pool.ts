/**
 * Evaluations run in a pool of worker threads with a time limit and a heap limit, so that a
 * hostile or runaway expression cannot stall or exhaust the server.
 */
import 'server-only';
import { existsSync } from 'node:fs';
import { availableParallelism } from 'node:os';
import path from 'node:path';
import { pathToFileURL } from 'node:url';
import { Piscina } from 'piscina';
import { EngineError } from '../engine/errors';
import type { QuickResult, SheetDocument, SheetResults } from '../engine';
import type { EvaluationReply, EvaluationTask } from './worker';

export const EVALUATION_TIME_LIMIT_MS = 5000;
export const WORKER_HEAP_LIMIT_MB = 256;
/** The bundled worker, found from the repository root (the app runs from there). */
export const WORKER_FILE = path.join(process.cwd(), '.worker-dist', 'evaluate-worker.mjs');

const TIMEOUT_MESSAGE = `evaluation took longer than ${EVALUATION_TIME_LIMIT_MS / 1000} s and was stopped`;

const globalForPool = globalThis as unknown as { denudataEvaluationPool?: Piscina };

function getPool(): Piscina {
  if (!globalForPool.denudataEvaluationPool) {
    if (!existsSync(WORKER_FILE)) {
      throw new Error(`The evaluation worker is not built (${WORKER_FILE}); run: node scripts/build-worker.mjs`);
    }
    globalForPool.denudataEvaluationPool = new Piscina({
      filename: pathToFileURL(WORKER_FILE).href,
      minThreads: 1,
      maxThreads: Math.max(1, Math.min(4, availableParallelism())),
      idleTimeout: 60_000,
      resourceLimits: { maxOldGenerationSizeMb: WORKER_HEAP_LIMIT_MB, maxYoungGenerationSizeMb: 32, stackSizeMb: 4 },
    });
  }
  return globalForPool.denudataEvaluationPool;
}

async function runTask<T>(task: EvaluationTask): Promise<T> {
  const signal = AbortSignal.timeout(EVALUATION_TIME_LIMIT_MS);
  let reply: EvaluationReply;
  try {
    reply = (await getPool().run(task, { signal })) as EvaluationReply;
  } catch (error) {
    // Piscina terminates the worker thread running an aborted task.
    if (signal.aborted) throw new EngineError(TIMEOUT_MESSAGE);
    const code = (error as { code?: string } | null)?.code;
    if (code === 'ERR_WORKER_OUT_OF_MEMORY') throw new EngineError('evaluation needed too much memory and was stopped');
    if (error instanceof Error && /out of memory/i.test(error.message)) {
      throw new EngineError('evaluation needed too much memory and was stopped');
    }
    throw error;
  }
  if (!reply.ok) throw new EngineError(reply.message, reply.position === undefined ? {} : { position: reply.position });
  return reply.value as T;
}

/** Full evaluation of a sheet in a worker (throws EngineError on timeout or an invalid document). */
export function runEvaluate(document: SheetDocument): Promise<SheetResults> {
  return runTask<SheetResults>({ kind: 'evaluate', document });
}

/** Incremental evaluation in a worker. */
export function runEvaluateIncremental(
  document: SheetDocument,
  previous: SheetResults | null,
  changedBlockIds: string[],
): Promise<{ results: SheetResults; evaluatedBlockIds: string[] }> {
  return runTask({ kind: 'incremental', document, previous, changedBlockIds });
}

/** A quick calculation in a worker (throws EngineError with a user-safe message). */
export function runQuick(expr: string): Promise<QuickResult> {
  return runTask<QuickResult>({ kind: 'quick', expr });
}

/** Stops the pool's threads (tests, shutdown). */
export async function closeEvaluationPool(): Promise<void> {
  const pool = globalForPool.denudataEvaluationPool;
  globalForPool.denudataEvaluationPool = undefined;
  if (pool) await pool.destroy();
}
