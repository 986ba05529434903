'use client';

import { useCallback, useLayoutEffect, useRef, useState, type RefObject } from 'react';
import type { SheetDocument } from '@/lib/sheet/types';
import { focusBlock } from './use-block-actions';

/**
 * Which block is selected, renamed or has its caption open, and the blocks added in this visit (their
 * empty required inputs read "needs input" until revealed). Callbacks are stable.
 */
export function useBlockSelection(docRef: RefObject<SheetDocument>, firstId: string | null) {
  const [selectedId, setSelectedId] = useState<string | null>(firstId);
  // The selection, for callbacks that run on user events (written before paint, never during render).
  const selectedRef = useRef(selectedId);
  useLayoutEffect(() => {
    selectedRef.current = selectedId;
  }, [selectedId]);
  const [renamingId, setRenamingId] = useState<string | null>(null);
  const [captionId, setCaptionId] = useState<string | null>(null);
  const [freshIds, setFreshIds] = useState<ReadonlySet<string>>(() => new Set());

  /** Marks a block as added in this visit. */
  const markFresh = useCallback((id: string) => setFreshIds((s) => new Set([...s, id])), []);
  /** Shows every block's missing inputs (before a save or an evaluation). */
  const revealAll = useCallback(() => setFreshIds((s) => (s.size ? new Set() : s)), []);
  const selectAdjacent = useCallback(
    (delta: number) => {
      const blocks = docRef.current.blocks;
      const index = blocks.findIndex((b) => b.id === selectedRef.current);
      const block = blocks[Math.max(0, Math.min(blocks.length - 1, index < 0 ? 0 : index + delta))];
      if (block) {
        setSelectedId(block.id);
        focusBlock(block.id);
      }
    },
    [docRef],
  );
  const goTo = useCallback((id: string) => {
    setSelectedId(id);
    focusBlock(id);
  }, []);
  const editFields = useCallback((id: string) => focusBlock(id, true), []);

  return {
    selectedId,
    setSelectedId,
    selectedRef,
    renamingId,
    setRenamingId,
    captionId,
    setCaptionId,
    freshIds,
    markFresh,
    revealAll,
    selectAdjacent,
    goTo,
    editFields,
  };
}
