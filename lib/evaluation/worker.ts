/**
 * The evaluation worker (run by piscina in a worker thread with a time and memory limit).
 * Bundled to plain JavaScript by scripts/build-worker.mjs: Node 20 workers cannot load TypeScript.
 */
import { EngineError, evaluateQuick, evaluateSheet, evaluateSheetIncremental } from '../engine';
import type { SheetDocument, SheetResults } from '../engine';

export type EvaluationTask =
  | { kind: 'evaluate'; document: SheetDocument }
  | { kind: 'incremental'; document: SheetDocument; previous: SheetResults | null; changedBlockIds: string[] }
  | { kind: 'quick'; expr: string };

export type EvaluationReply = { ok: true; value: unknown } | { ok: false; message: string; position?: number };

export default function runEvaluationTask(task: EvaluationTask): EvaluationReply {
  try {
    switch (task.kind) {
      case 'evaluate':
        return { ok: true, value: evaluateSheet(task.document) };
      case 'incremental':
        return { ok: true, value: evaluateSheetIncremental(task.document, task.previous, task.changedBlockIds) };
      case 'quick':
        return { ok: true, value: evaluateQuick(task.expr) };
      default:
        return { ok: false, message: 'unknown evaluation task' };
    }
  } catch (error) {
    if (!(error instanceof EngineError)) return { ok: false, message: 'the evaluation failed unexpectedly' };
    return error.position === undefined ? { ok: false, message: error.message } : { ok: false, message: error.message, position: error.position };
  }
}
