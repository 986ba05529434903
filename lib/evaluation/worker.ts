/**
 * The evaluation worker (run by piscina in a worker thread with a time and memory limit).
 * Bundled to plain JavaScript by scripts/build-worker.mjs: Node 20 workers cannot load TypeScript.
 *
 * Each task carries a message port: the worker says "started" on it first (the pool's time limit
 * starts then) and reports progress on it at most every PROGRESS_INTERVAL_MS.
 */
import type { MessagePort } from 'node:worker_threads';
import { EngineError, evaluateQuick, evaluateSheet, evaluateSheetIncremental } from '../engine';
import type { EngineErrorCode, SheetDocument, SheetResults } from '../engine';
import type { DatasetLookup } from '../engine/dataset';

// `datasets` crosses to the worker thread by structured clone (a Map of plain canonical objects).
export type EvaluationTask =
  | { kind: 'evaluate'; document: SheetDocument; datasets?: DatasetLookup }
  | { kind: 'incremental'; document: SheetDocument; previous: SheetResults | null; changedBlockIds: string[]; datasets?: DatasetLookup }
  | { kind: 'quick'; expr: string };

export type EvaluationReply = { ok: true; value: unknown } | { ok: false; message: string; code?: EngineErrorCode; position?: number };

export type WorkerMessage = { type: 'started' } | { type: 'progress'; fraction: number };

const PROGRESS_INTERVAL_MS = 200;

export default function runEvaluationTask(task: EvaluationTask & { port?: MessagePort }): EvaluationReply {
  const port = task.port;
  port?.postMessage({ type: 'started' } satisfies WorkerMessage);
  let last = 0;
  const onProgress = port
    ? (fraction: number) => {
        const now = Date.now();
        if (now - last < PROGRESS_INTERVAL_MS && fraction < 1) return;
        last = now;
        port.postMessage({ type: 'progress', fraction } satisfies WorkerMessage);
      }
    : undefined;
  try {
    switch (task.kind) {
      case 'evaluate':
        return { ok: true, value: evaluateSheet(task.document, { onProgress, datasets: task.datasets }) };
      case 'incremental':
        return { ok: true, value: evaluateSheetIncremental(task.document, task.previous, task.changedBlockIds, { onProgress, datasets: task.datasets }) };
      case 'quick':
        return { ok: true, value: evaluateQuick(task.expr) };
      default:
        return { ok: false, message: 'unknown evaluation task' };
    }
  } catch (error) {
    if (!(error instanceof EngineError)) return { ok: false, message: 'the evaluation failed unexpectedly' };
    return error.position === undefined
      ? { ok: false, message: error.message, code: error.code }
      : { ok: false, message: error.message, code: error.code, position: error.position };
  }
}
