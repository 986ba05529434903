/**
 * Evaluations run in a pool of worker threads with a time limit and a heap limit, so that a
 * hostile or runaway expression cannot stall or exhaust the server. In front of the pool, a fair
 * scheduler (scheduler.ts) bounds what each user may have in flight.
 *
 * The time limit counts from when the task starts running: the worker says so over a message
 * port as its first act, and only then does the clock start (time spent waiting for a thread,
 * or for a new thread to load the engine, is not counted).
 */
import 'server-only';
import { existsSync } from 'node:fs';
import { availableParallelism } from 'node:os';
import path from 'node:path';
import { pathToFileURL } from 'node:url';
import { MessageChannel } from 'node:worker_threads';
import { Piscina } from 'piscina';
import { EngineError } from '../engine/errors';
import type { QuickResult, SheetDocument, SheetResults } from '../engine';
import { FairScheduler, type EvaluationOwner } from './scheduler';
import type { DatasetLookup } from '../engine/dataset';
import type { EvaluationReply, EvaluationTask, WorkerMessage } from './worker';

export type { EvaluationOwner } from './scheduler';

export const EVALUATION_TIME_LIMIT_MS = 5000;
export const WORKER_HEAP_LIMIT_MB = 256;
/** CONTRACT §3: evaluations one user may have queued or running. */
export const PER_USER_IN_FLIGHT = 2;
/** Evaluations waiting for a thread, over all users (beyond: 429). */
export const MAX_QUEUED_EVALUATIONS = 64;
/** Threads: at least 2, so that one user (who may run fewer than all) never holds every thread. */
export const EVALUATION_THREADS = Math.max(2, Math.min(4, availableParallelism()));
/** How long a task may wait for its worker to start before it is given up (a stuck pool). */
const START_GRACE_MS = 60_000;

/** The bundled worker, found from the repository root (the app runs from there). */
export const WORKER_FILE = path.join(process.cwd(), '.worker-dist', 'evaluate-worker.mjs');

export const TIMEOUT_MESSAGE = `evaluation took longer than ${EVALUATION_TIME_LIMIT_MS / 1000} s and was stopped`;
export const MEMORY_MESSAGE = 'evaluation needed too much memory and was stopped';

/** A pool of evaluation threads with its own time limit (the app's, or the long runs'). */
export interface PoolOptions {
  threads: number;
  timeLimitMs: number;
  heapLimitMb: number;
}

function createPool(options: PoolOptions): Piscina {
  if (!existsSync(WORKER_FILE)) {
    throw new Error(`The evaluation worker is not built (${WORKER_FILE}); run: node scripts/build-worker.mjs`);
  }
  return new Piscina({
    filename: pathToFileURL(WORKER_FILE).href,
    // Every thread is kept warm: a thread that loads the engine on demand would delay the task
    // that needs it (the time limit only starts once the task runs, but the user still waits).
    minThreads: options.threads,
    maxThreads: options.threads,
    idleTimeout: 60_000,
    resourceLimits: { maxOldGenerationSizeMb: options.heapLimitMb, maxYoungGenerationSizeMb: 32, stackSizeMb: 4 },
  });
}

/**
 * Runs one task on the pool: the time limit starts when the worker reports that it has started.
 * `onProgress` receives the fraction done (0..1) as the worker reports it. `signal` cancels.
 */
export async function runOnPool<T>(
  pool: Piscina,
  task: EvaluationTask,
  timeLimitMs: number,
  { onProgress, signal }: { onProgress?: (fraction: number) => void; signal?: AbortSignal } = {},
): Promise<T> {
  const { port1, port2 } = new MessageChannel();
  const controller = new AbortController();
  let stoppedBy: 'time' | 'cancel' | null = null;
  let limitTimer: NodeJS.Timeout | undefined;
  const stop = (why: 'time' | 'cancel') => {
    if (stoppedBy) return;
    stoppedBy = why;
    controller.abort();
  };
  port1.on('message', (message: WorkerMessage) => {
    if (message.type === 'started' && !limitTimer) limitTimer = setTimeout(() => stop('time'), timeLimitMs);
    else if (message.type === 'progress') onProgress?.(message.fraction);
  });
  const startGuard = setTimeout(() => {
    if (!limitTimer) stop('time');
  }, timeLimitMs + START_GRACE_MS);
  const onCancel = () => stop('cancel');
  if (signal?.aborted) onCancel();
  signal?.addEventListener('abort', onCancel);
  let reply: EvaluationReply;
  try {
    reply = (await pool.run({ ...task, port: port2 }, { transferList: [port2], signal: controller.signal })) as EvaluationReply;
  } catch (error) {
    // Piscina terminates the worker thread running an aborted task.
    if (stoppedBy === 'time') throw new EngineError(`evaluation took longer than ${timeLimitMs / 1000} s and was stopped`, { code: 'limit_exceeded' });
    if (stoppedBy === 'cancel') throw new EngineError('evaluation was cancelled', { code: 'cancelled' });
    const code = (error as { code?: string } | null)?.code;
    if (code === 'ERR_WORKER_OUT_OF_MEMORY') throw new EngineError(MEMORY_MESSAGE, { code: 'limit_exceeded' });
    if (error instanceof Error && /out of memory/i.test(error.message)) throw new EngineError(MEMORY_MESSAGE, { code: 'limit_exceeded' });
    throw error;
  } finally {
    clearTimeout(limitTimer);
    clearTimeout(startGuard);
    signal?.removeEventListener('abort', onCancel);
    port1.close();
  }
  if (!reply.ok) throw new EngineError(reply.message, { code: reply.code ?? 'invalid', ...(reply.position === undefined ? {} : { position: reply.position }) });
  return reply.value as T;
}

interface PoolState {
  pool: Piscina;
  scheduler: FairScheduler<unknown>;
}

const globalForPool = globalThis as unknown as { denudataEvaluationPool?: PoolState };

function getPoolState(): PoolState {
  if (!globalForPool.denudataEvaluationPool) {
    globalForPool.denudataEvaluationPool = {
      pool: createPool({ threads: EVALUATION_THREADS, timeLimitMs: EVALUATION_TIME_LIMIT_MS, heapLimitMb: WORKER_HEAP_LIMIT_MB }),
      scheduler: new FairScheduler<unknown>({
        slots: EVALUATION_THREADS,
        perUserInFlight: PER_USER_IN_FLIGHT,
        perUserRunning: Math.max(1, EVALUATION_THREADS - 1),
        maxQueued: MAX_QUEUED_EVALUATIONS,
        retryAfterSeconds: Math.ceil(EVALUATION_TIME_LIMIT_MS / 1000),
      }),
    };
  }
  return globalForPool.denudataEvaluationPool;
}

/** Evaluations on behalf of no user (seeding, maintenance) share this owner. */
export const SYSTEM_OWNER: EvaluationOwner = { userId: 'system' };

function runTask<T>(task: EvaluationTask, owner: EvaluationOwner): Promise<T> {
  const state = getPoolState();
  return state.scheduler.submit(owner, () => runOnPool<unknown>(state.pool, task, EVALUATION_TIME_LIMIT_MS)) as Promise<T>;
}

/** Full evaluation of a sheet in a worker (throws EngineError on timeout or an invalid document). */
export function runEvaluate(document: SheetDocument, owner: EvaluationOwner = SYSTEM_OWNER, datasets?: DatasetLookup): Promise<SheetResults> {
  return runTask<SheetResults>({ kind: 'evaluate', document, ...(datasets?.size ? { datasets } : {}) }, owner);
}

/** Incremental evaluation in a worker. */
export function runEvaluateIncremental(
  document: SheetDocument,
  previous: SheetResults | null,
  changedBlockIds: string[],
  owner: EvaluationOwner = SYSTEM_OWNER,
  datasets?: DatasetLookup,
): Promise<{ results: SheetResults; evaluatedBlockIds: string[] }> {
  return runTask({ kind: 'incremental', document, previous, changedBlockIds, ...(datasets?.size ? { datasets } : {}) }, owner);
}

/** A quick calculation in a worker (throws EngineError with a user-safe message). */
export function runQuick(expr: string, owner: EvaluationOwner = SYSTEM_OWNER): Promise<QuickResult> {
  return runTask<QuickResult>({ kind: 'quick', expr }, owner);
}

/** Counts of the scheduler (tests and diagnostics). */
export function evaluationPoolStats(): { running: number; queued: number; users: number } {
  return globalForPool.denudataEvaluationPool?.scheduler.stats() ?? { running: 0, queued: 0, users: 0 };
}

/** A separate pool with its own limits (long runs use one, so they never take the app's threads). */
export function createEvaluationPool(options: PoolOptions): {
  run<T>(task: EvaluationTask, options?: { onProgress?: (fraction: number) => void; signal?: AbortSignal }): Promise<T>;
  close(): Promise<void>;
} {
  const pool = createPool(options);
  return {
    run: <T>(task: EvaluationTask, runOptions: { onProgress?: (fraction: number) => void; signal?: AbortSignal } = {}) =>
      runOnPool<T>(pool, task, options.timeLimitMs, runOptions),
    close: () => pool.destroy(),
  };
}

/** Stops the pool's threads (tests, shutdown). */
export async function closeEvaluationPool(): Promise<void> {
  const state = globalForPool.denudataEvaluationPool;
  globalForPool.denudataEvaluationPool = undefined;
  if (state) await state.pool.destroy();
}
