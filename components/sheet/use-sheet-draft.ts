'use client';

import { useMutation } from '@tanstack/react-query';
import { useCallback, useEffect, useRef, useState } from 'react';
import { ApiError, apiFetch, apiResponse } from '@/lib/api-client';
import { changedBlockIds, dependentsOf } from '@/lib/sheet/document-edits';
import { mergeSheets, sameJson as same } from '@/lib/sheet/merge';
import type { SheetDocument, SheetResults } from '@/lib/sheet/types';
import { coalesceHistory, pushHistory, travelHistory, type DraftHistory } from './draft-history';
import { readPending, writePending } from './draft-storage';

export type SaveState =
  | { kind: 'saved' }
  | { kind: 'pending' }
  | { kind: 'saving' }
  | { kind: 'retrying'; inSeconds: number; message: string }
  | { kind: 'invalid'; message: string }
  | { kind: 'conflict' }
  | { kind: 'read-only' };

export interface Conflict {
  serverVersion: number;
  serverDocument: SheetDocument;
  /** True when the unsaved edits came from an earlier visit (restored from this browser). */
  restored: boolean;
}

const SAVE_DELAY_MS = 600;
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

/** The answers of the routes this hook calls. */
type EvaluateAnswer = { draftVersion: number; results: SheetResults; evaluatedBlockIds: string[] } | { run: { id: string }; draftVersion: number };
type DraftAnswer = { version: number };
type SheetAnswer = { draft: { version: number; document: SheetDocument } };

/** The contract's message of a failure, or `fallback` when the server gave none. */
const messageOf = (error: unknown, fallback: string) => (error instanceof ApiError && error.code !== 'error' && error.status > 0 ? error.message : fallback);

/**
 * The sheet's draft on the client: local edits with undo/redo, saved to the server after a short
 * pause (kept in localStorage until acknowledged, retried on failure), re-evaluated on the server,
 * and merged block by block when someone else saved first.
 */
export function useSheetDraft({
  sheetId,
  initialVersion,
  initialDocument,
  canEdit,
}: {
  sheetId: string;
  initialVersion: number;
  initialDocument: SheetDocument;
  canEdit: boolean;
}) {
  const [doc, setDoc] = useState(initialDocument);
  const [version, setVersion] = useState(initialVersion);
  const [results, setResults] = useState<SheetResults | null>(null);
  const [stale, setStale] = useState<Set<string>>(() => new Set(initialDocument.blocks.map((b) => b.id)));
  /** A long run of the draft in progress (shown with its progress bar and cancel). */
  const [activeRun, setActiveRun] = useState<{ id: string; draftVersion: number; stamp: number } | null>(null);
  const [saveState, setSaveState] = useState<SaveState>(canEdit ? { kind: 'saved' } : { kind: 'read-only' });
  const [conflict, setConflict] = useState<Conflict | null>(null);
  const [notice, setNotice] = useState<string | null>(null);
  const [history, setHistoryState] = useState<DraftHistory<SheetDocument>>({ past: [], future: [] });
  const historyRef = useRef(history);
  const setHistory = useCallback((change: (h: DraftHistory<SheetDocument>) => DraftHistory<SheetDocument>) => {
    historyRef.current = change(historyRef.current);
    setHistoryState(historyRef.current);
  }, []);

  const docRef = useRef(doc);
  const versionRef = useRef(version);
  const baseDocRef = useRef(initialDocument);
  const editCounter = useRef(0);
  const saving = useRef(false);
  const again = useRef(false);
  const timer = useRef<ReturnType<typeof setTimeout> | null>(null);
  const retryDelay = useRef(2);
  const lastCoalesce = useRef<{ key: string; at: number } | null>(null);
  const conflictRef = useRef<Conflict | null>(null);
  /** The edit (counter value) whose results are shown; older answers never replace newer ones. */
  const appliedStamp = useRef(-1);
  conflictRef.current = conflict;

  const evaluate = useMutation({
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
      // Results of the unsaved document of a later edit are already shown: older ones never replace them.
      if (data.stamp < appliedStamp.current) return;
      appliedStamp.current = data.stamp;
      setResults(data.results);
      if (data.stamp === editCounter.current && data.draftVersion === versionRef.current) setStale(new Set());
    },
  });
  const evaluateRef = useRef(evaluate.mutate);
  evaluateRef.current = evaluate.mutate;

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
    const stamp = editCounter.current;
    const document = docRef.current;
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
      if (controller.signal.aborted || status !== 200 || !body.results || stamp !== editCounter.current || stamp < appliedStamp.current) return;
      appliedStamp.current = stamp;
      setResults(body.results as SheetResults);
      setStale(new Set());
    } catch {
      // aborted by a newer edit, or offline: the save path evaluates again
    } finally {
      if (liveAbort.current === controller) {
        liveAbort.current = null;
        setLiveEvaluating(false);
      }
    }
  }, [sheetId]);
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

  const flush = useCallback(async function saveDraft(): Promise<void> {
    if (!canEdit || conflictRef.current) return;
    if (saving.current) {
      again.current = true;
      return;
    }
    const document = docRef.current;
    if (same(document, baseDocRef.current)) {
      writePending(sheetId, null);
      setSaveState({ kind: 'saved' });
      return;
    }
    saving.current = true;
    const stamp = editCounter.current;
    setSaveState({ kind: 'saving' });
    try {
      let saved: DraftAnswer | null = null;
      let refusal: ApiError | null = null;
      try {
        saved = await apiFetch<DraftAnswer>(`/api/sheets/${sheetId}/draft`, { method: 'PUT', body: { baseVersion: versionRef.current, document } });
      } catch (error) {
        // A network failure (status 0) goes on to the retry below.
        if (!(error instanceof ApiError) || error.status === 0) throw error;
        refusal = error;
      }
      const status = refusal?.status ?? 200;
      if (saved) {
        retryDelay.current = 2;
        versionRef.current = saved.version;
        setVersion(saved.version);
        baseDocRef.current = document;
        if (stamp === editCounter.current) {
          writePending(sheetId, null);
          setSaveState({ kind: 'saved' });
        } else {
          again.current = true;
        }
        // The unsaved document of this very edit was evaluated already (live): no second evaluation.
        if (appliedStamp.current !== stamp) evaluateRef.current(stamp);
      } else if (status === 409) {
        let current: SheetAnswer;
        try {
          current = await apiFetch<SheetAnswer>(`/api/sheets/${sheetId}`);
        } catch (error) {
          throw new Error(messageOf(error, 'Could not load the current version.'));
        }
        const next: Conflict = { serverVersion: current.draft.version, serverDocument: current.draft.document, restored: false };
        conflictRef.current = next;
        setConflict(next);
        setSaveState({ kind: 'conflict' });
      } else if (status === 400 || status === 413) {
        setSaveState({ kind: 'invalid', message: messageOf(refusal, 'The server refused the draft.') });
      } else if (status === 401 || status === 403) {
        setSaveState({ kind: 'invalid', message: messageOf(refusal, 'You may not edit this sheet.') });
      } else {
        throw new Error(messageOf(refusal, `The server answered ${status}.`));
      }
    } catch (error) {
      const wait = retryDelay.current;
      retryDelay.current = Math.min(30, wait * 2);
      setSaveState({ kind: 'retrying', inSeconds: wait, message: error instanceof Error ? error.message : 'network error' });
      if (timer.current) clearTimeout(timer.current);
      timer.current = setTimeout(() => void saveDraft(), wait * 1000);
    } finally {
      saving.current = false;
      if (again.current) {
        again.current = false;
        void saveDraft();
      }
    }
  }, [canEdit, sheetId]);

  const schedule = useCallback(() => {
    if (timer.current) clearTimeout(timer.current);
    timer.current = setTimeout(() => void flush(), SAVE_DELAY_MS);
  }, [flush]);

  const markChanged = useCallback((before: SheetDocument, after: SheetDocument) => {
    const changed = changedBlockIds(before, after);
    if (changed.length === 0) return;
    const affected = dependentsOf(after, changed);
    setStale((s) => new Set([...s, ...affected]));
  }, []);

  /** Makes `next` the working document: marks what changed stale, keeps it locally and schedules a save. */
  const adopt = useCallback(
    (before: SheetDocument, next: SheetDocument) => {
      docRef.current = next;
      editCounter.current += 1;
      setDoc(next);
      markChanged(before, next);
      writePending(sheetId, { baseVersion: versionRef.current, baseDocument: baseDocRef.current, document: next, at: new Date().toISOString() });
      setSaveState((s) => (s.kind === 'conflict' ? s : { kind: 'pending' }));
      schedule();
      scheduleLive();
    },
    [markChanged, schedule, scheduleLive, sheetId],
  );

  /** Applies an edit; edits with the same coalesce key within 1.5 s form one undo step. */
  const apply = useCallback(
    (next: SheetDocument, options: { coalesce?: string } = {}) => {
      if (!canEdit) return;
      const before = docRef.current;
      if (same(before, next)) return;
      const now = Date.now();
      const coalesce = options.coalesce && lastCoalesce.current?.key === options.coalesce && now - lastCoalesce.current.at < 1500;
      lastCoalesce.current = options.coalesce ? { key: options.coalesce, at: now } : null;
      if (!coalesce) setHistory((h) => pushHistory(h, before));
      else setHistory(coalesceHistory);
      adopt(before, next);
    },
    [adopt, canEdit, setHistory],
  );

  const travel = useCallback(
    (direction: 'undo' | 'redo') => {
      if (!canEdit) return;
      const current = docRef.current;
      const step = travelHistory(historyRef.current, direction, current);
      if (!step) return;
      setHistory(() => step.history);
      lastCoalesce.current = null;
      adopt(current, step.target);
    },
    [adopt, canEdit, setHistory],
  );

  const undo = useCallback(() => travel('undo'), [travel]);
  const redo = useCallback(() => travel('redo'), [travel]);

  const evaluateNow = useCallback(() => {
    if (canEdit && !same(docRef.current, baseDocRef.current)) {
      if (timer.current) clearTimeout(timer.current);
      void flush();
    } else {
      evaluateRef.current(editCounter.current);
    }
  }, [canEdit, flush]);

  /** Re-applies the local edits on the server's version (block-level three-way merge) and saves. */
  const reapplyMine = useCallback(() => {
    const current = conflictRef.current;
    if (!current) return;
    const { document, clashes } = mergeSheets(baseDocRef.current, docRef.current, current.serverDocument);
    baseDocRef.current = current.serverDocument;
    versionRef.current = current.serverVersion;
    setVersion(current.serverVersion);
    conflictRef.current = null;
    setConflict(null);
    const before = docRef.current;
    docRef.current = document;
    editCounter.current += 1;
    setDoc(document);
    setHistory((h) => pushHistory(h, before));
    markChanged(current.serverDocument, document);
    setStale((s) => new Set([...s, ...document.blocks.map((b) => b.id)]));
    setNotice(
      clashes.length
        ? `Your edits were re-applied on version ${current.serverVersion}. ${clashes.length} change(s) made on both sides kept your version: ${clashes
            .map((c) => `${c.blockName} ${c.field}`)
            .join(', ')}.`
        : `Your edits were re-applied on version ${current.serverVersion}.`,
    );
    writePending(sheetId, { baseVersion: current.serverVersion, baseDocument: current.serverDocument, document, at: new Date().toISOString() });
    setSaveState({ kind: 'pending' });
    void flush();
  }, [flush, markChanged, sheetId, setHistory]);

  /** Drops the local edits and takes the server's version. */
  const keepTheirs = useCallback(() => {
    const current = conflictRef.current;
    if (!current) return;
    baseDocRef.current = current.serverDocument;
    versionRef.current = current.serverVersion;
    setVersion(current.serverVersion);
    conflictRef.current = null;
    setConflict(null);
    const before = docRef.current;
    docRef.current = current.serverDocument;
    editCounter.current += 1;
    setDoc(current.serverDocument);
    setHistory((h) => pushHistory(h, before));
    setStale(new Set(current.serverDocument.blocks.map((b) => b.id)));
    writePending(sheetId, null);
    setSaveState({ kind: 'saved' });
    setNotice(`Showing version ${current.serverVersion} from the server; your unsaved edits were dropped (Ctrl+Z brings them back as a new edit).`);
    evaluateRef.current(editCounter.current);
  }, [sheetId, setHistory]);

  // First load: restore unsaved edits kept in this browser, then evaluate (once per mounted sheet).
  const loaded = useRef(false);
  useEffect(() => {
    if (loaded.current) return;
    loaded.current = true;
    const pending = canEdit ? readPending(sheetId) : null;
    if (pending && !same(pending.document, initialDocument)) {
      if (pending.baseVersion === initialVersion) {
        docRef.current = pending.document;
        editCounter.current += 1;
        setDoc(pending.document);
        setStale(new Set(pending.document.blocks.map((b) => b.id)));
        setNotice('Unsaved edits from your last visit were restored from this browser and are being saved.');
        void flush();
        return;
      }
      baseDocRef.current = pending.baseDocument;
      docRef.current = pending.document;
      setDoc(pending.document);
      const next: Conflict = { serverVersion: initialVersion, serverDocument: initialDocument, restored: true };
      conflictRef.current = next;
      setConflict(next);
      setSaveState({ kind: 'conflict' });
      evaluateRef.current(editCounter.current);
      return;
    }
    if (pending) writePending(sheetId, null);
    evaluateRef.current(editCounter.current);
  }, [canEdit, sheetId, initialDocument, initialVersion, flush]);

  // Try to save before the page goes away; the edits stay in localStorage either way.
  useEffect(() => {
    const onLeave = (event: BeforeUnloadEvent) => {
      if (canEdit && !same(docRef.current, baseDocRef.current)) {
        void flush();
        event.preventDefault();
      }
    };
    window.addEventListener('beforeunload', onLeave);
    return () => window.removeEventListener('beforeunload', onLeave);
  }, [canEdit, flush]);

  useEffect(() => () => {
    if (timer.current) clearTimeout(timer.current);
    if (liveTimer.current) clearTimeout(liveTimer.current);
    liveAbort.current?.abort();
  }, []);

  return {
    doc,
    version,
    results,
    stale,
    evaluating: evaluate.isPending || liveEvaluating,
    activeRun,
    /** The long run finished: its results replace the shown ones. */
    runFinished: (runResults: SheetResults) => {
      const run = activeRun;
      setActiveRun(null);
      setResults(runResults);
      if (run && run.stamp === editCounter.current && run.draftVersion === versionRef.current) setStale(new Set());
    },
    /** The long run failed or was cancelled: the previous results stay, marked stale. */
    runEnded: () => setActiveRun(null),
    evaluateError: evaluate.error?.message ?? null,
    saveState,
    conflict,
    notice,
    setNotice,
    canUndo: history.past.length > 0,
    canRedo: history.future.length > 0,
    apply,
    undo,
    redo,
    evaluateNow,
    reapplyMine,
    keepTheirs,
  };
}
