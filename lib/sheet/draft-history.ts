/**
 * The draft's undo/redo history as pure functions over plain data (unit-tested in
 * tests/sheet/draft-history.test.ts): an edit pushes the document before it, undo and redo move between
 * the two stacks. The history keeps at most HISTORY_LIMIT steps.
 */
export interface DraftHistory<T> {
  past: T[];
  future: T[];
}

export const HISTORY_LIMIT = 200;

/** A new edit: the document before it becomes the last undo step and the redo stack empties. */
export function pushHistory<T>(history: DraftHistory<T>, before: T): DraftHistory<T> {
  return { past: [...history.past, before].slice(-HISTORY_LIMIT), future: [] };
}

/** An edit that joins the previous undo step (typing into the same field): only the redo stack empties. */
export function coalesceHistory<T>(history: DraftHistory<T>): DraftHistory<T> {
  return { past: history.past, future: [] };
}

/**
 * One step back (undo) or forward (redo) from `current`: the document to show and the history after the
 * step, or null when there is nothing to undo or redo.
 */
export function travelHistory<T>(history: DraftHistory<T>, direction: 'undo' | 'redo', current: T): { target: T; history: DraftHistory<T> } | null {
  const from = direction === 'undo' ? history.past : history.future;
  const target = from[from.length - 1];
  if (from.length === 0 || target === undefined) return null;
  return {
    target,
    history:
      direction === 'undo'
        ? { past: history.past.slice(0, -1), future: [...history.future, current] }
        : { past: [...history.past, current], future: history.future.slice(0, -1) },
  };
}
