'use client';

import { Button } from '@/components/ui/button';
import { useEffect, useRef, useState } from 'react';
import type { SheetBlock } from '@/lib/sheet/types';
import { NoteMarkdown } from './note-markdown';

/** The caption editor of a calculation block (its markdown `note`). */
export function CaptionEditor({ block, onChange, onDone }: { block: SheetBlock; onChange: (text: string) => void; onDone: () => void }) {
  const ref = useRef<HTMLTextAreaElement>(null);
  const [text, setText] = useState(block.note ?? '');
  useEffect(() => {
    ref.current?.focus();
  }, []);
  const id = `caption-${block.id}`;
  return (
    <div className="mt-1 flex flex-col gap-1">
      <label htmlFor={id} className="text-[12px] text-slate">
        Caption of {block.name} (markdown; shown above its inputs and kept in revisions)
      </label>
      <textarea
        ref={ref}
        id={id}
        value={text}
        rows={Math.min(8, Math.max(2, text.split('\n').length + 1))}
        onChange={(e) => {
          setText(e.target.value);
          onChange(e.target.value);
        }}
        onKeyDown={(e) => {
          if (e.key === 'Escape') {
            e.preventDefault();
            e.stopPropagation();
            onDone();
          }
        }}
        className="w-full rounded-[3px] border border-rule bg-chalk p-2 text-[13px]"
      />
      <div>
        <Button size="sm" onClick={onDone}>
          Done
        </Button>
      </div>
    </div>
  );
}

/** A note block: its markdown, and the editor for it. */
export function NoteBody({ block, canEdit, onChange }: { block: SheetBlock; canEdit: boolean; onChange: (text: string) => void }) {
  const text = block.note ?? '';
  // An empty note opens its text box (a new note gets focus there); a written one shows its markdown.
  const [editing, setEditing] = useState(() => canEdit && text === '');
  return (
    <div className="mt-1">
      {editing && canEdit ? (
        <div className="flex flex-col gap-1">
          <label htmlFor={`note-${block.id}`} className="text-[12px] text-slate">
            Note text (markdown: # heading, **bold**, *italic*, `code`, - lists, [link](https://…))
          </label>
          <textarea
            id={`note-${block.id}`}
            value={text}
            rows={Math.min(16, Math.max(4, text.split('\n').length + 1))}
            onChange={(e) => onChange(e.target.value)}
            onKeyDown={(e) => {
              if (e.key === 'Escape') {
                e.stopPropagation();
                setEditing(false);
              }
            }}
            className="w-full rounded-[3px] border border-rule bg-chalk p-2 text-[14px]"
          />
          <div>
            <Button size="sm" onClick={() => setEditing(false)}>
              Done
            </Button>
          </div>
        </div>
      ) : (
        <div className="prose-note">
          {text ? <NoteMarkdown text={text} /> : <p className="text-slate">An empty note.</p>}
          {canEdit ? (
            <Button variant="outline" size="sm" onClick={() => setEditing(true)} className="mt-1">
              Edit note
            </Button>
          ) : null}
        </div>
      )}
    </div>
  );
}
