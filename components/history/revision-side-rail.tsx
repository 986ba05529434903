'use client';

import { useState } from 'react';
import { CommentsPanel, OpenCommentCount, OpenCommentCounts } from '@/components/comments/comments-panel';
import { useSheetComments } from '@/components/comments/use-comments';
import { ForkDialog } from '@/components/history/fork-dialog';
import { Button } from '@/components/ui/button';

type Block = { id: string; name: string; type: string };

/**
 * For a stored revision: pick a block to see and write its comments (with open counts per block),
 * and fork the revision for a new site.
 */
export function RevisionSideRail({
  sheetId,
  sheetTitle,
  revision,
  blocks,
  userId,
  canComment,
  canFork,
}: {
  sheetId: string;
  sheetTitle: string;
  revision: number;
  blocks: Block[];
  userId: string;
  canComment: boolean;
  canFork: boolean;
}) {
  const [selected, setSelected] = useState<string>(blocks.find((b) => b.type !== 'note')?.id ?? blocks[0]?.id ?? '');
  const [forking, setForking] = useState(false);
  const block = blocks.find((b) => b.id === selected);
  const comments = useSheetComments(sheetId);
  return (
    <aside className="flex flex-col gap-3" aria-label="Revision tools">
      {canFork ? (
        <>
          <Button onClick={() => setForking(true)} className="self-start">Fork for a new site…</Button>
          <ForkDialog open={forking} onClose={() => setForking(false)} sheetId={sheetId} sourceTitle={sheetTitle} revision={revision} />
        </>
      ) : null}
      <OpenCommentCounts counts={comments.data?.openByBlock}>
      <div role="listbox" aria-label="Blocks" className="flex flex-col rounded-[4px] border border-rule bg-chalk text-[13px]">
        {blocks.map((b) => (
          // An option of the listbox, not an action: it keeps the list's row look.
          <button
            key={b.id}
            type="button"
            role="option"
            aria-selected={b.id === selected}
            onClick={() => setSelected(b.id)}
            className={`flex items-center gap-2 px-3 py-1.5 text-left hover:bg-wash ${b.id === selected ? 'bg-wash font-medium' : ''}`}
            data-rail-block={b.id}
          >
            <span className="num">{b.name}</span>
            <span className="ml-auto">
              <OpenCommentCount blockId={b.id} />
            </span>
          </button>
        ))}
      </div>
      </OpenCommentCounts>
      {block ? <CommentsPanel key={block.id} sheetId={sheetId} blockId={block.id} blockName={block.name} revision={revision} userId={userId} canComment={canComment} /> : null}
    </aside>
  );
}
