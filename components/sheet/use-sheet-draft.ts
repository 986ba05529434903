'use client';

import { useCallback, useEffect, useReducer, useRef } from 'react';
import { ApiError, apiFetch } from '@/lib/api-client';
import { draftReducer, initialDraftState, type DraftAction, type DraftState } from '@/lib/sheet/draft-state';
import { sameJson as same } from '@/lib/sheet/merge';
import type { SheetDocument } from '@/lib/sheet/types';
import { readPending, writePending } from './draft-storage';
import { messageOf, useDraftEvaluation } from './use-draft-evaluation';

export type { Conflict, SaveState } from '@/lib/sheet/draft-state';

const SAVE_DELAY_MS = 600;

type DraftAnswer = { version: number };
type SheetAnswer = { draft: { version: number; document: SheetDocument } };

/**
 * The sheet's draft on the client: the pure reducer of lib/sheet/draft-state.ts (edits, undo/redo,
 * adopting the server's version, the three-way merge after a 409) run with `useReducer`, and around it
 * the saving: to the server after a short pause, kept in localStorage until acknowledged, retried on
 * failure; evaluations are `useDraftEvaluation`'s. Every callback it returns is stable.
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
  const [state, dispatch] = useReducer(draftReducer, { document: initialDocument, version: initialVersion, editable: canEdit }, initialDraftState);
  /** The state after every action sent so far (callbacks and the save read it between renders). */
  const stateRef = useRef<DraftState>(state);
  const send = useCallback((action: DraftAction): DraftState => {
    stateRef.current = draftReducer(stateRef.current, action);
    dispatch(action);
    return stateRef.current;
  }, []);
  const { evaluate, scheduleLive, ...evaluation } = useDraftEvaluation({ sheetId, stateRef, send });

  const saving = useRef(false);
  const again = useRef(false);
  const timer = useRef<ReturnType<typeof setTimeout> | null>(null);
  const retryDelay = useRef(2);

  /** Keeps the working document in this browser until the server has it. */
  const keepPending = useCallback(() => {
    const { version, base, doc } = stateRef.current;
    writePending(sheetId, { baseVersion: version, baseDocument: base, document: doc, at: new Date().toISOString() });
  }, [sheetId]);

  const flush = useCallback(
    async function saveDraft(): Promise<void> {
      if (!canEdit || stateRef.current.conflict) return;
      if (saving.current) {
        again.current = true;
        return;
      }
      const { doc: document, base, version, edit: stamp } = stateRef.current;
      if (same(document, base)) {
        writePending(sheetId, null);
        send({ type: 'save-unneeded' });
        return;
      }
      saving.current = true;
      send({ type: 'save-started' });
      try {
        let saved: DraftAnswer | null = null;
        let refusal: ApiError | null = null;
        try {
          saved = await apiFetch<DraftAnswer>(`/api/sheets/${sheetId}/draft`, { method: 'PUT', body: { baseVersion: version, document } });
        } catch (error) {
          // A network failure (status 0) goes on to the retry below.
          if (!(error instanceof ApiError) || error.status === 0) throw error;
          refusal = error;
        }
        const status = refusal?.status ?? 200;
        if (saved) {
          retryDelay.current = 2;
          const after = send({ type: 'saved', version: saved.version, document, edit: stamp });
          if (stamp === after.edit) writePending(sheetId, null);
          else again.current = true;
          // The unsaved document of this very edit was evaluated already (live): no second evaluation.
          if (after.shownEdit !== stamp) evaluate(stamp);
        } else if (status === 409) {
          let current: SheetAnswer;
          try {
            current = await apiFetch<SheetAnswer>(`/api/sheets/${sheetId}`);
          } catch (error) {
            throw new Error(messageOf(error, 'Could not load the current version.'));
          }
          send({ type: 'save-conflict', serverVersion: current.draft.version, serverDocument: current.draft.document });
        } else if (status === 400 || status === 413) {
          send({ type: 'save-refused', message: messageOf(refusal, 'The server refused the draft.') });
        } else if (status === 401 || status === 403) {
          send({ type: 'save-refused', message: messageOf(refusal, 'You may not edit this sheet.') });
        } else {
          throw new Error(messageOf(refusal, `The server answered ${status}.`));
        }
      } catch (error) {
        const wait = retryDelay.current;
        retryDelay.current = Math.min(30, wait * 2);
        send({ type: 'save-retrying', inSeconds: wait, message: error instanceof Error ? error.message : 'network error' });
        if (timer.current) clearTimeout(timer.current);
        timer.current = setTimeout(() => void saveDraft(), wait * 1000);
      } finally {
        saving.current = false;
        if (again.current) {
          again.current = false;
          void saveDraft();
        }
      }
    },
    [canEdit, sheetId, send, evaluate],
  );

  /** Sends an edit, undo or redo; when it made a new working document, keeps it and schedules a save. */
  const change = useCallback(
    (action: DraftAction) => {
      const before = stateRef.current.edit;
      if (send(action).edit === before) return;
      keepPending();
      if (timer.current) clearTimeout(timer.current);
      timer.current = setTimeout(() => void flush(), SAVE_DELAY_MS);
      scheduleLive();
    },
    [send, keepPending, flush, scheduleLive],
  );

  /** Applies an edit; edits with the same coalesce key within 1.5 s form one undo step. */
  const apply = useCallback(
    (next: SheetDocument, options: { coalesce?: string } = {}) => change({ type: 'edit', document: next, coalesce: options.coalesce, at: Date.now() }),
    [change],
  );
  const undo = useCallback(() => change({ type: 'undo' }), [change]);
  const redo = useCallback(() => change({ type: 'redo' }), [change]);

  const evaluateNow = useCallback(() => {
    const { doc, base, edit } = stateRef.current;
    if (canEdit && !same(doc, base)) {
      if (timer.current) clearTimeout(timer.current);
      void flush();
    } else {
      evaluate(edit);
    }
  }, [canEdit, flush, evaluate]);

  /** Re-applies the local edits on the server's version (three-way merge) and saves. */
  const reapplyMine = useCallback(() => {
    if (!stateRef.current.conflict) return;
    send({ type: 'reapply' });
    keepPending();
    void flush();
  }, [send, keepPending, flush]);

  /** Drops the local edits and takes the server's version. */
  const keepTheirs = useCallback(() => {
    if (!stateRef.current.conflict) return;
    const after = send({ type: 'keep-theirs' });
    writePending(sheetId, null);
    evaluate(after.edit);
  }, [send, sheetId, evaluate]);

  const setNotice = useCallback((notice: string | null) => send({ type: 'notice', notice }), [send]);

  // First load: restore unsaved edits kept in this browser, then evaluate (once per mounted sheet).
  const loaded = useRef(false);
  useEffect(() => {
    if (loaded.current) return;
    loaded.current = true;
    const pending = canEdit ? readPending(sheetId) : null;
    if (pending && !same(pending.document, initialDocument)) {
      if (pending.baseVersion === initialVersion) {
        send({ type: 'restore', document: pending.document });
        void flush();
        return;
      }
      const after = send({ type: 'restore-conflict', baseDocument: pending.baseDocument, document: pending.document });
      evaluate(after.edit);
      return;
    }
    if (pending) writePending(sheetId, null);
    evaluate(stateRef.current.edit);
  }, [canEdit, sheetId, initialDocument, initialVersion, flush, send, evaluate]);

  // Try to save before the page goes away; the edits stay in localStorage either way.
  useEffect(() => {
    const onLeave = (event: BeforeUnloadEvent) => {
      if (canEdit && !same(stateRef.current.doc, stateRef.current.base)) {
        void flush();
        event.preventDefault();
      }
    };
    window.addEventListener('beforeunload', onLeave);
    return () => window.removeEventListener('beforeunload', onLeave);
  }, [canEdit, flush]);

  useEffect(
    () => () => {
      if (timer.current) clearTimeout(timer.current);
    },
    [],
  );

  return {
    doc: state.doc,
    version: state.version,
    results: state.results,
    stale: state.stale,
    saveState: state.saveState,
    conflict: state.conflict,
    notice: state.notice,
    canUndo: state.history.past.length > 0,
    canRedo: state.history.future.length > 0,
    ...evaluation,
    setNotice,
    apply,
    undo,
    redo,
    evaluateNow,
    reapplyMine,
    keepTheirs,
  };
}
