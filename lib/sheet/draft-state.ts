/**
 * The sheet draft on the client as a pure reducer (unit-tested in tests/sheet/draft-state.test.ts): the
 * working document and the server's document it started from, undo/redo, which blocks await evaluation,
 * the shown results, the save state, a conflict with a draft saved meanwhile and the page's notice.
 * No network, timers or storage here: `components/sheet/use-sheet-draft.ts` runs it with `useReducer`
 * and does the saving. Times come in with the actions, so the same actions always give the same state.
 */
import { changedBlockIds, dependentsOf } from './document-edits';
import { coalesceHistory, pushHistory, travelHistory, type DraftHistory } from './draft-history';
import { mergeSheets, sameJson } from './merge';
import type { SheetDocument, SheetResults } from './types';

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

/** Edits with the same coalesce key within this time form one undo step (typing into one field). */
export const COALESCE_MS = 1500;

export interface DraftState {
  editable: boolean;
  /** The working document (what the page shows). */
  doc: SheetDocument;
  /** The server's document the working document's edits are relative to (the last one saved or loaded). */
  base: SheetDocument;
  /** The server's draft version of `base`. */
  version: number;
  history: DraftHistory<SheetDocument>;
  /** Counts the working documents: every edit, undo, redo, restore or adoption gets the next number. */
  edit: number;
  /** The last edit's coalesce key and time. */
  coalesce: { key: string; at: number } | null;
  /** Blocks whose shown results do not belong to the working document. */
  stale: Set<string>;
  results: SheetResults | null;
  /** The edit whose results are shown; results of an older edit never replace them. */
  shownEdit: number;
  saveState: SaveState;
  conflict: Conflict | null;
  notice: string | null;
}

export type DraftAction =
  /** A local edit; `at` is the time in ms (for coalescing). */
  | { type: 'edit'; document: SheetDocument; coalesce?: string; at: number }
  | { type: 'undo' }
  | { type: 'redo' }
  /** Unsaved edits kept in this browser on the version the server still has. */
  | { type: 'restore'; document: SheetDocument }
  /** Unsaved edits kept in this browser on an older version: a conflict with the loaded one. */
  | { type: 'restore-conflict'; baseDocument: SheetDocument; document: SheetDocument }
  | { type: 'save-started' }
  /** Nothing to save: the working document is the server's. */
  | { type: 'save-unneeded' }
  /** The server stored `document` (the working document of `edit`) as `version`. */
  | { type: 'saved'; version: number; document: SheetDocument; edit: number }
  /** The server answered 409: someone saved `serverDocument` as `serverVersion` meanwhile. */
  | { type: 'save-conflict'; serverVersion: number; serverDocument: SheetDocument }
  | { type: 'save-refused'; message: string }
  | { type: 'save-retrying'; inSeconds: number; message: string }
  /** Re-apply my edits on the server's version (three-way merge). */
  | { type: 'reapply' }
  /** Drop my edits and take the server's version. */
  | { type: 'keep-theirs' }
  /** Results of the stored draft `draftVersion`, evaluated for `edit`. */
  | { type: 'results'; results: SheetResults; edit: number; draftVersion: number }
  /** Results of the unsaved working document of `edit`. */
  | { type: 'live-results'; results: SheetResults; edit: number }
  /** A long run of the stored draft finished. */
  | { type: 'run-results'; results: SheetResults; edit: number; draftVersion: number }
  | { type: 'notice'; notice: string | null };

export function initialDraftState({ document, version, editable }: { document: SheetDocument; version: number; editable: boolean }): DraftState {
  return {
    editable,
    doc: document,
    base: document,
    version,
    history: { past: [], future: [] },
    edit: 0,
    coalesce: null,
    stale: allBlocks(document),
    results: null,
    shownEdit: -1,
    saveState: editable ? { kind: 'saved' } : { kind: 'read-only' },
    conflict: null,
    notice: null,
  };
}

const allBlocks = (doc: SheetDocument) => new Set(doc.blocks.map((b) => b.id));

/** `stale` with the blocks changed from `before` to `after` and everything that depends on them. */
function withChanged(stale: Set<string>, before: SheetDocument, after: SheetDocument): Set<string> {
  const changed = changedBlockIds(before, after);
  if (changed.length === 0) return stale;
  return new Set([...stale, ...dependentsOf(after, changed)]);
}

/** `next` becomes the working document: what changed is stale and a save is pending. */
function adopt(state: DraftState, next: SheetDocument, history: DraftHistory<SheetDocument>, coalesce: DraftState['coalesce']): DraftState {
  return {
    ...state,
    doc: next,
    edit: state.edit + 1,
    history,
    coalesce,
    stale: withChanged(state.stale, state.doc, next),
    saveState: state.saveState.kind === 'conflict' ? state.saveState : { kind: 'pending' },
  };
}

const noStale = (stale: Set<string>) => (stale.size === 0 ? stale : new Set<string>());

export function reapplyNotice(version: number, clashes: { blockName: string; field: string }[]): string {
  return clashes.length
    ? `Your edits were re-applied on version ${version}. ${clashes.length} change(s) made on both sides kept your version: ${clashes
        .map((c) => `${c.blockName} ${c.field}`)
        .join(', ')}.`
    : `Your edits were re-applied on version ${version}.`;
}

export function draftReducer(state: DraftState, action: DraftAction): DraftState {
  switch (action.type) {
    case 'edit': {
      if (!state.editable || sameJson(state.doc, action.document)) return state;
      const key = action.coalesce;
      const joins = key !== undefined && state.coalesce?.key === key && action.at - state.coalesce.at < COALESCE_MS;
      const history = joins ? coalesceHistory(state.history) : pushHistory(state.history, state.doc);
      return adopt(state, action.document, history, key !== undefined ? { key, at: action.at } : null);
    }
    case 'undo':
    case 'redo': {
      if (!state.editable) return state;
      const step = travelHistory(state.history, action.type, state.doc);
      return step ? adopt(state, step.target, step.history, null) : state;
    }
    case 'restore':
      return {
        ...state,
        doc: action.document,
        edit: state.edit + 1,
        stale: allBlocks(action.document),
        notice: 'Unsaved edits from your last visit were restored from this browser and are being saved.',
      };
    case 'restore-conflict':
      return {
        ...state,
        base: action.baseDocument,
        doc: action.document,
        conflict: { serverVersion: state.version, serverDocument: state.base, restored: true },
        saveState: { kind: 'conflict' },
      };
    case 'save-started':
      return { ...state, saveState: { kind: 'saving' } };
    case 'save-unneeded':
      return { ...state, saveState: { kind: 'saved' } };
    case 'saved':
      return {
        ...state,
        version: action.version,
        base: action.document,
        // A later edit waits for its own save.
        saveState: action.edit === state.edit ? { kind: 'saved' } : state.saveState,
      };
    case 'save-conflict':
      return {
        ...state,
        conflict: { serverVersion: action.serverVersion, serverDocument: action.serverDocument, restored: false },
        saveState: { kind: 'conflict' },
      };
    case 'save-refused':
      return { ...state, saveState: { kind: 'invalid', message: action.message } };
    case 'save-retrying':
      return { ...state, saveState: { kind: 'retrying', inSeconds: action.inSeconds, message: action.message } };
    case 'reapply': {
      const conflict = state.conflict;
      if (!conflict) return state;
      const { document, clashes } = mergeSheets(state.base, state.doc, conflict.serverDocument);
      return {
        ...state,
        base: conflict.serverDocument,
        version: conflict.serverVersion,
        conflict: null,
        doc: document,
        edit: state.edit + 1,
        history: pushHistory(state.history, state.doc),
        coalesce: null,
        // Results on screen were for another document: every block is evaluated again.
        stale: new Set([...state.stale, ...allBlocks(document)]),
        notice: reapplyNotice(conflict.serverVersion, clashes),
        saveState: { kind: 'pending' },
      };
    }
    case 'keep-theirs': {
      const conflict = state.conflict;
      if (!conflict) return state;
      return {
        ...state,
        base: conflict.serverDocument,
        version: conflict.serverVersion,
        conflict: null,
        doc: conflict.serverDocument,
        edit: state.edit + 1,
        history: pushHistory(state.history, state.doc),
        coalesce: null,
        stale: allBlocks(conflict.serverDocument),
        saveState: { kind: 'saved' },
        notice: `Showing version ${conflict.serverVersion} from the server; your unsaved edits were dropped (Ctrl+Z brings them back as a new edit).`,
      };
    }
    case 'results': {
      if (action.edit < state.shownEdit) return state;
      const current = action.edit === state.edit && action.draftVersion === state.version;
      return { ...state, results: action.results, shownEdit: action.edit, stale: current ? noStale(state.stale) : state.stale };
    }
    case 'live-results':
      if (action.edit !== state.edit || action.edit < state.shownEdit) return state;
      return { ...state, results: action.results, shownEdit: action.edit, stale: noStale(state.stale) };
    case 'run-results': {
      const current = action.edit === state.edit && action.draftVersion === state.version;
      return { ...state, results: action.results, stale: current ? noStale(state.stale) : state.stale };
    }
    case 'notice':
      return state.notice === action.notice ? state : { ...state, notice: action.notice };
  }
}
