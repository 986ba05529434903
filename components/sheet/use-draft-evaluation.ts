'use client';

import { useMutation } from '@tanstack/react-query';
import { useCallback, useEffect, useRef, useState, type RefObject } from 'react';
import { ApiError, apiResponse } from '@/lib/api-client';
import type { DraftAction, DraftState } from '@/lib/sheet/draft-state';
import type { SheetResults } from '@/lib/sheet/types';

/** Pause in typing after which the edited (unsaved) document is evaluated. */
const LIVE_DELAY_MS = 150;
/** Least time between two unsaved evaluations of one page. */
const LIVE_MIN_GAP_MS = 500;

function liveEvaluationOff(): boolean {
  try {
    return localStorage.getItem('denudata-live-evaluation') === 'off';
  } catch {
    return false;
  }
}

/** The answer of POST /api/sheets/{id}/evaluate. */
type EvaluateAnswer = { draftVersion: number; results: SheetResults; evaluatedBlockIds: string[] } | { run: { id: string }; draftVersion: number };

/** The contract's message of a failure, or `fallback` when the server gave none. */
export const messageOf = (error: unknown, fallback: string) =>
  error instanceof ApiError && error.code !== 'error' && error.status > 0 ? error.message : fallback;

/** A long run of the stored draft in progress (shown with its progress bar and cancel). */
export interface ActiveRun {
  id: string;
  draftVersion: number;
  /** The edit the run was started for. */
  stamp: number;
}

/**
 * The draft's evaluations: of the stored draft after a save (`evaluate(edit)`; a costly one starts a long
 * run), and of the unsaved working document as soon as typing pauses (`scheduleLive()`). Results go to the
 * draft reducer through `send`, which keeps older answers from replacing newer ones. Callbacks are stable.
 */
export function useDraftEvaluation({
  sheetId,
  stateRef,
  send,
}: {
  sheetId: string;
  stateRef: RefObject<DraftState>;
  send: (action: DraftAction) => void;
}) {
  const [activeRun, setActiveRunState] = useState<ActiveRun | null>(null);
  const activeRunRef = useRef<ActiveRun | null>(null);
  const setActiveRun = useCallback((run: ActiveRun | null) => {
    activeRunRef.current = run;
    setActiveRunState(run);
  }, []);

  const stored = useMutation({
    mutationFn: async (stamp: number) => {
      let answer: { status: number; body: EvaluateAnswer };
      try {
        answer = await apiResponse<EvaluateAnswer>(`/api/sheets/${sheetId}/evaluate`, { method: 'POST' });
      } catch (error) {
        throw new Error(error instanceof ApiError && error.status === 0 ? error.message : messageOf(error, `Evaluation failed (${error instanceof ApiError ? error.status : 0}).`));
      }
      const { status, body } = answer;
      // 202: too costly for a request, the server started a long run (CONTRACT §6b).
      if (status === 202 && 'run' in body && body.run?.id) return { kind: 'run' as const, run: { id: body.run.id, draftVersion: body.draftVersion, stamp } };
      if (status !== 200 || !('results' in body)) throw new Error(`Evaluation failed (${status}).`);
      return { kind: 'results' as const, ...body, stamp };
    },
    onSuccess: (data) => {
      if (data.kind === 'run') {
        setActiveRun(data.run);
        return;
      }
      setActiveRun(null);
      send({ type: 'results', results: data.results, edit: data.stamp, draftVersion: data.draftVersion });
    },
  });
  // `mutate` keeps its identity (TanStack Query), so `evaluate` is stable.
  const { mutate } = stored;
  /** Evaluates the stored draft for edit `stamp`. */
  const evaluate = useCallback((stamp: number) => mutate(stamp), [mutate]);

  /**
   * The edited document evaluated as soon as typing pauses (LIVE_DELAY_MS), independently of saving: the
   * unsaved document goes to POST /api/sheets/{id}/evaluate {document} (CONTRACT §6b), nothing is stored.
   * A newer edit aborts the request in flight; only results for the current edit are shown. Anything
   * else (too costly now, replaced, limited, refused) is left to the evaluation after the save.
   */
  const liveTimer = useRef<ReturnType<typeof setTimeout> | null>(null);
  const lastLiveStart = useRef(0);
  const liveAbort = useRef<AbortController | null>(null);
  const [liveEvaluating, setLiveEvaluating] = useState(false);
  const evaluateLive = useCallback(async () => {
    const { edit: stamp, doc: document } = stateRef.current;
    liveAbort.current?.abort();
    const controller = new AbortController();
    liveAbort.current = controller;
    setLiveEvaluating(true);
    try {
      const { status, body } = await apiResponse<{ results?: SheetResults }>(`/api/sheets/${sheetId}/evaluate`, {
        method: 'POST',
        body: { document },
        signal: controller.signal,
      });
      if (controller.signal.aborted || status !== 200 || !body.results) return;
      send({ type: 'live-results', results: body.results, edit: stamp });
    } catch {
      // aborted by a newer edit, or offline: the save path evaluates again
    } finally {
      if (liveAbort.current === controller) {
        liveAbort.current = null;
        setLiveEvaluating(false);
      }
    }
  }, [sheetId, stateRef, send]);
  const scheduleLive = useCallback(() => {
    if (liveTimer.current) clearTimeout(liveTimer.current);
    // The browser benchmark's baseline switches it off for one page (scripts/bench-live-edit.mts).
    if (liveEvaluationOff()) return;
    // At most one unsaved evaluation every LIVE_MIN_GAP_MS: the evaluation rate limit (120 per minute) is
    // shared with saves and quick calculations.
    const wait = Math.max(LIVE_DELAY_MS, lastLiveStart.current + LIVE_MIN_GAP_MS - Date.now());
    liveTimer.current = setTimeout(() => {
      lastLiveStart.current = Date.now();
      void evaluateLive();
    }, wait);
  }, [evaluateLive]);

  useEffect(
    () => () => {
      if (liveTimer.current) clearTimeout(liveTimer.current);
      liveAbort.current?.abort();
    },
    [],
  );

  /** The long run finished: its results replace the shown ones. */
  const runFinished = useCallback(
    (results: SheetResults) => {
      const run = activeRunRef.current;
      setActiveRun(null);
      send({ type: 'run-results', results, edit: run?.stamp ?? -1, draftVersion: run?.draftVersion ?? -1 });
    },
    [send, setActiveRun],
  );
  /** The long run failed or was cancelled: the previous results stay, marked stale. */
  const runEnded = useCallback(() => setActiveRun(null), [setActiveRun]);

  return {
    evaluate,
    scheduleLive,
    evaluating: stored.isPending || liveEvaluating,
    evaluateError: stored.error?.message ?? null,
    activeRun,
    runFinished,
    runEnded,
  };
}
