'use client';

import { useEffect, type RefObject } from 'react';
import { isTypingTarget } from '@/components/palette/shortcuts';
import type { SheetDocument } from '@/lib/sheet/types';
import { focusBlock } from './use-block-actions';

/**
 * The sheet page's keys (listed in the shortcuts sheet): Ctrl+Enter evaluate, Ctrl+S save a revision,
 * Alt+↑/↓ move, Ctrl+Z / Ctrl+Shift+Z / Ctrl+Y undo and redo, j/k or arrows select, Enter into the fields,
 * F2 rename, Shift+D duplicate, Delete, N note, C comments, A add.
 */
export function useSheetKeyboard({
  canEdit,
  docRef,
  selectedRef,
  select,
  evaluateNow,
  undo,
  redo,
  openSave,
  move,
  duplicate,
  remove,
  addNote,
  startRename,
  showComments,
  openAdd,
}: {
  canEdit: boolean;
  docRef: RefObject<SheetDocument>;
  selectedRef: RefObject<string | null>;
  select: (id: string) => void;
  evaluateNow: () => void;
  undo: () => void;
  redo: () => void;
  openSave: () => void;
  move: (id: string, delta: number) => void;
  duplicate: (id: string) => void;
  remove: (id: string) => void;
  addNote: () => void;
  startRename: (id: string) => void;
  showComments: () => void;
  openAdd: () => void;
}): void {
  useEffect(() => {
    const onKey = (event: KeyboardEvent) => {
      if (event.defaultPrevented) return;
      const mod = event.ctrlKey || event.metaKey;
      const typing = isTypingTarget(event.target);
      const blocks = docRef.current.blocks;
      const selected = selectedRef.current;
      const index = blocks.findIndex((b) => b.id === selected);
      if (mod && event.key === 'Enter') {
        event.preventDefault();
        evaluateNow();
        return;
      }
      if (mod && !event.altKey && !event.shiftKey && event.key.toLowerCase() === 's' && canEdit) {
        event.preventDefault();
        openSave();
        return;
      }
      if (event.altKey && !mod && (event.key === 'ArrowUp' || event.key === 'ArrowDown') && canEdit && selected) {
        event.preventDefault();
        move(selected, event.key === 'ArrowUp' ? -1 : 1);
        return;
      }
      const inExpression = Boolean((event.target as Element | null)?.closest?.('.cm-editor'));
      // Expression fields share the sheet's undo history; plain text boxes keep their own.
      if (typing && !inExpression) return;
      if (mod && event.key.toLowerCase() === 'z' && canEdit) {
        event.preventDefault();
        if (event.shiftKey) redo();
        else undo();
        return;
      }
      if (mod && event.key.toLowerCase() === 'y' && canEdit) {
        event.preventDefault();
        redo();
        return;
      }
      if (typing) return;
      if (mod || event.altKey) return;
      const selectAt = (i: number) => {
        const block = blocks[Math.max(0, Math.min(blocks.length - 1, i))];
        if (block) {
          event.preventDefault();
          select(block.id);
          focusBlock(block.id);
        }
      };
      switch (event.key) {
        case 'j':
        case 'ArrowDown':
          selectAt(index < 0 ? 0 : index + 1);
          break;
        case 'k':
        case 'ArrowUp':
          selectAt(index < 0 ? 0 : index - 1);
          break;
        case 'Enter':
          if (selected && (event.target as Element)?.closest?.('[data-block-id]') === document.querySelector(`[data-block-id="${CSS.escape(selected)}"]`)) {
            event.preventDefault();
            focusBlock(selected, true);
          }
          break;
        case 'F2':
          if (canEdit && selected) {
            event.preventDefault();
            startRename(selected);
          }
          break;
        case 'D':
          if (canEdit && event.shiftKey && selected) {
            event.preventDefault();
            duplicate(selected);
          }
          break;
        case 'Delete':
          if (canEdit && selected) {
            event.preventDefault();
            remove(selected);
          }
          break;
        case 'n':
          if (canEdit) {
            event.preventDefault();
            addNote();
          }
          break;
        case 'c':
          if (selected) {
            event.preventDefault();
            showComments();
          }
          break;
        case 'a':
          if (canEdit) {
            event.preventDefault();
            openAdd();
          }
          break;
      }
    };
    window.addEventListener('keydown', onKey);
    return () => window.removeEventListener('keydown', onKey);
  }, [addNote, canEdit, docRef, duplicate, evaluateNow, move, openAdd, openSave, redo, remove, select, selectedRef, showComments, startRename, undo]);
}
