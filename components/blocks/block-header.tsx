'use client';

import { Button } from '@/components/ui/button';
import { useEffect, useRef, useState, type DragEvent } from 'react';
import { OpenCommentCount } from '@/components/comments/comments-panel';
import { BlockStatusBadge, type BlockState } from '@/components/sheet/block-status';
import { ErrorText } from '@/components/ui/error-text';
import type { CatalogType, SheetBlock } from '@/lib/sheet/types';
import type { BlockCardActions } from './block-actions';

/** A block card's top row: drag handle, name (or the rename form), type, open comments, state and the edit buttons. */
export function BlockHeader({
  block,
  type,
  state,
  headingId,
  renaming,
  editingCaption,
  canEdit,
  commentsSheetId,
  index,
  count,
  actions,
}: {
  block: SheetBlock;
  type: CatalogType | undefined;
  state: BlockState | null;
  headingId: string;
  renaming: boolean;
  editingCaption: boolean;
  canEdit: boolean;
  commentsSheetId?: string;
  index: number;
  count: number;
  actions: BlockCardActions;
}) {
  const isNote = block.type === 'note';
  const onDragStart = (event: DragEvent) => {
    event.dataTransfer.setData('application/x-denudata-block', block.id);
    event.dataTransfer.effectAllowed = 'move';
  };
  return (
    <div className="flex flex-wrap items-center gap-x-2 gap-y-1">
      {canEdit ? (
        <Button
          variant="tool"
          size="icon"
          draggable
          onDragStart={onDragStart}
          aria-label={`Move ${block.name}: drag, or Alt+Up / Alt+Down`}
          title="Drag to reorder (Alt+↑ / Alt+↓)"
          className="cursor-grab"
          onKeyDown={(e) => {
            if (e.key === 'ArrowUp' || e.key === 'ArrowDown') {
              e.preventDefault();
              actions.move(block.id, e.key === 'ArrowUp' ? -1 : 1);
            }
          }}
        >
          <span aria-hidden="true">⠿</span>
        </Button>
      ) : null}
      {renaming ? (
        <RenameForm block={block} onCancel={() => actions.setRenaming(null)} onRename={(name) => actions.rename(block.id, name)} />
      ) : (
        <h2 id={headingId} className="num text-[14px] font-semibold">
          {canEdit ? (
            <Button variant="text" size="inline" onClick={() => actions.setRenaming(block.id)} title="Rename (F2)">
              {block.name}
              <span className="sr-only"> (rename)</span>
            </Button>
          ) : (
            block.name
          )}
        </h2>
      )}
      <span className="text-[12px] text-slate">{type?.title ?? block.type}</span>
      <span className="ml-auto flex items-center gap-1">
        {commentsSheetId ? (
          <OpenCommentCount blockId={block.id} blockName={block.name} onOpen={() => actions.showComments(block.id)} />
        ) : null}
        {state ? <BlockStatusBadge state={state} /> : null}
        {canEdit ? (
          <>
            {!isNote ? (
              <Button
                variant="tool"
                size="icon"
                aria-label={block.note ? `Edit the caption of ${block.name}` : `Add a caption to ${block.name}`}
                title={block.note ? 'Edit the caption' : 'Add a caption'}
                aria-pressed={editingCaption}
                onClick={() => actions.setCaptionEditing(editingCaption ? null : block.id)}
              >
                <span aria-hidden="true">¶</span>
              </Button>
            ) : null}
            <Button variant="tool" size="icon" aria-label={`Move ${block.name} up`} disabled={index === 0} onClick={() => actions.move(block.id, -1)}>
              <span aria-hidden="true">↑</span>
            </Button>
            <Button variant="tool" size="icon" aria-label={`Move ${block.name} down`} disabled={index === count - 1} onClick={() => actions.move(block.id, 1)}>
              <span aria-hidden="true">↓</span>
            </Button>
            <Button variant="tool" size="icon" aria-label={`Duplicate ${block.name}`} title="Duplicate (Shift+D)" onClick={() => actions.duplicate(block.id)}>
              <svg aria-hidden="true" width="14" height="14" viewBox="0 0 16 16" fill="none" stroke="currentColor" strokeWidth="1.5">
                <rect x="5" y="5" width="9" height="9" rx="1" />
                <path d="M11 5V3a1 1 0 0 0-1-1H3a1 1 0 0 0-1 1v7a1 1 0 0 0 1 1h2" />
              </svg>
            </Button>
            <Button variant="tool-danger" size="icon" aria-label={`Delete ${block.name}`} title="Delete (Delete; undo with Ctrl+Z)" onClick={() => actions.remove(block.id)}>
              <span aria-hidden="true">✕</span>
            </Button>
          </>
        ) : null}
      </span>
    </div>
  );
}

function RenameForm({ block, onCancel, onRename }: { block: SheetBlock; onCancel: () => void; onRename: (name: string) => Promise<string | null> }) {
  const [value, setValue] = useState(block.name);
  const [error, setError] = useState<string | null>(null);
  const [busy, setBusy] = useState(false);
  const ref = useRef<HTMLInputElement>(null);
  useEffect(() => {
    ref.current?.focus();
    ref.current?.select();
  }, []);
  const submit = async () => {
    if (value === block.name) return onCancel();
    setBusy(true);
    const message = await onRename(value.trim());
    setBusy(false);
    if (message) setError(message);
  };
  const errorId = `rename-${block.id}-error`;
  return (
    <form
      className="flex flex-wrap items-center gap-1"
      onSubmit={(e) => {
        e.preventDefault();
        void submit();
      }}
    >
      <label htmlFor={`rename-${block.id}`} className="sr-only">
        New name for {block.name}
      </label>
      <input
        ref={ref}
        id={`rename-${block.id}`}
        value={value}
        onChange={(e) => {
          setValue(e.target.value);
          setError(null);
        }}
        onKeyDown={(e) => {
          if (e.key === 'Escape') {
            e.preventDefault();
            e.stopPropagation();
            onCancel();
          }
        }}
        aria-invalid={error ? true : undefined}
        aria-describedby={error ? errorId : undefined}
        className="num h-7 w-56 rounded-[3px] border border-rule bg-chalk px-2 text-[13px]"
      />
      <Button type="submit" variant="primary" size="sm" disabled={busy}>
        Rename
      </Button>
      <Button size="sm" onClick={onCancel}>
        Cancel
      </Button>
      {error ? (
        <ErrorText id={errorId} size="sm" className="w-full">
          {error}
        </ErrorText>
      ) : null}
    </form>
  );
}
