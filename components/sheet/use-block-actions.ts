'use client';

import { useCallback, useMemo, type Dispatch, type RefObject, type SetStateAction } from 'react';
import type { BlockCardActions } from '@/components/blocks/block-actions';
import { ApiError, apiFetch } from '@/lib/api-client';
import {
  addParameter,
  createBlock,
  duplicateBlock,
  insertBlock,
  moveBlock,
  precheckBlockName,
  removeBlock,
  removeParameter,
  renameBlock,
  renameParameter,
  setDisplayUnit,
  setInput,
  setNote,
} from '@/lib/sheet/document-edits';
import type { CatalogType, SheetDocument } from '@/lib/sheet/types';

type Setter<T> = Dispatch<SetStateAction<T>>;

/** Moves keyboard focus to a block card (or its first field), waiting for it to be drawn. */
export function focusBlock(id: string, field = false): void {
  let tries = 0;
  const attempt = () => {
    const section = document.querySelector<HTMLElement>(`[data-block-id="${CSS.escape(id)}"]`);
    // The first input's expression field (CodeMirror loads after the card), or a note's text box; never a
    // display-unit box of the outputs, which is drawn first.
    const target = field ? section?.querySelector<HTMLElement>('[data-inputs] .cm-content[contenteditable="true"], [data-inputs] input, textarea') : section;
    if (target) target.focus();
    else if (tries++ < 20) setTimeout(attempt, 100);
    else section?.focus();
  };
  setTimeout(attempt, 0);
}

/**
 * The sheet's block edits (add, move, delete, duplicate, rename) and the one stable actions object the block
 * cards share. Everything reads the current document and selection through refs, so the callbacks keep
 * their identity across edits and memo(BlockCard) holds.
 */
export function useBlockActions({
  apply,
  setNotice,
  docRef,
  selectedRef,
  setSelectedId,
  setRenamingId,
  setCaptionId,
  setRailTab,
}: {
  apply: (next: SheetDocument, options?: { coalesce?: string }) => void;
  setNotice: (notice: string | null) => void;
  docRef: RefObject<SheetDocument>;
  selectedRef: RefObject<string | null>;
  setSelectedId: Setter<string | null>;
  setRenamingId: Setter<string | null>;
  setCaptionId: Setter<string | null>;
  setRailTab: Setter<string>;
}) {
  const addBlock = useCallback(
    (type: CatalogType | { id: 'note' }, init: { inputs?: Record<string, string> } = {}) => {
      const current = docRef.current;
      const block = createBlock(current, type, init);
      const at = selectedRef.current ? current.blocks.findIndex((b) => b.id === selectedRef.current) + 1 : current.blocks.length;
      apply(insertBlock(current, block, at > 0 ? at : current.blocks.length));
      setSelectedId(block.id);
      focusBlock(block.id, true);
      return block;
    },
    [apply, docRef, selectedRef, setSelectedId],
  );

  const move = useCallback(
    (id: string, delta: number) => {
      const current = docRef.current;
      const index = current.blocks.findIndex((b) => b.id === id);
      if (index < 0) return;
      apply(moveBlock(current, id, index + delta));
      setSelectedId(id);
    },
    [apply, docRef, setSelectedId],
  );

  const remove = useCallback(
    (id: string) => {
      const current = docRef.current;
      const index = current.blocks.findIndex((b) => b.id === id);
      const block = current.blocks[index];
      if (!block) return;
      apply(removeBlock(current, id));
      const next = current.blocks[index + 1] ?? current.blocks[index - 1];
      setSelectedId(next?.id ?? null);
      setNotice(`Deleted block ${block.name}. Undo with Ctrl+Z.`);
      if (next) focusBlock(next.id);
    },
    [apply, docRef, setNotice, setSelectedId],
  );

  const duplicate = useCallback(
    (id: string) => {
      const { doc: next, copy } = duplicateBlock(docRef.current, id);
      if (!copy) return;
      apply(next);
      setSelectedId(copy.id);
      focusBlock(copy.id);
    },
    [apply, docRef, setSelectedId],
  );

  const rename = useCallback(
    async (id: string, name: string): Promise<string | null> => {
      const local = precheckBlockName(docRef.current, name, id);
      if (local) return local;
      try {
        const body = await apiFetch<{ message?: string | null } | null>('/api/block-name', { body: { name } });
        if (body?.message) return body.message;
      } catch (error) {
        if (!(error instanceof ApiError) || error.status === 0) return 'The name could not be checked (network). Try again.';
        return error.code === 'error' ? 'The name could not be checked.' : error.message;
      }
      apply(renameBlock(docRef.current, id, name));
      setRenamingId(null);
      focusBlock(id);
      return null;
    },
    [apply, docRef, setRenamingId],
  );

  const actions = useMemo<BlockCardActions>(
    () => ({
      select: (id) => setSelectedId(id),
      setInput: (id, input, value) => apply(setInput(docRef.current, id, input, value), { coalesce: `input:${id}:${input}` }),
      setDisplay: (id, output, unit) => apply(setDisplayUnit(docRef.current, id, output, unit)),
      setNote: (id, note) => apply(setNote(docRef.current, id, note), { coalesce: `note:${id}` }),
      rename,
      move,
      dropOn: (dragged, target) => {
        const index = docRef.current.blocks.findIndex((b) => b.id === target);
        if (index >= 0) {
          apply(moveBlock(docRef.current, dragged, index));
          setSelectedId(dragged);
        }
      },
      duplicate,
      remove,
      addParameter: (id) => apply(addParameter(docRef.current, id)),
      renameParameter: (id, from, to) => {
        const { doc: next, error } = renameParameter(docRef.current, id, from, to);
        if (!error) apply(next);
        return error;
      },
      removeParameter: (id, key) => apply(removeParameter(docRef.current, id, key)),
      setRenaming: (id) => setRenamingId(id),
      showComments: (id) => {
        setSelectedId(id);
        setRailTab('comments');
      },
      setCaptionEditing: (id) => {
        setCaptionId(id);
        if (id) setSelectedId(id);
      },
    }),
    [apply, docRef, duplicate, move, remove, rename, setCaptionId, setRailTab, setRenamingId, setSelectedId],
  );

  return { addBlock, move, remove, duplicate, rename, actions };
}
