'use client';

import { useMutation, useQueryClient } from '@tanstack/react-query';
import { createContext, useContext, useState, type ReactNode } from 'react';
import { Button } from '@/components/ui/button';
import { ErrorText } from '@/components/ui/error-text';
import type { ApiRequest } from '@/lib/api-client';
import type { CommentThread as Thread } from '@/lib/db/comments';
import type { PublicUser as Person } from '@/lib/db/users';
import { CommentForm } from './comment-form';
import { CommentThreadItem } from './comment-thread';
import { callComments, commentsKey, useSheetComments, useSheetMembers } from './use-comments';

/**
 * Open comment counts by block id for the badges below it, from the one observer of the sheet's comments that
 * the page already holds (null until they arrive). One query observer per badge cost about 2 % of the sheet
 * page's server CPU (DEVELOPERS.md, "Fourth round"); the badges now only read this.
 */
const OpenCountsContext = createContext<Readonly<Record<string, number>> | null>(null);

export function OpenCommentCounts({ counts, children }: { counts: Readonly<Record<string, number>> | null | undefined; children: ReactNode }) {
  return <OpenCountsContext.Provider value={counts ?? null}>{children}</OpenCountsContext.Provider>;
}

/** The number of open threads on a block, for the badge on its card; a button when `onOpen` is given. Inside OpenCommentCounts. */
export function OpenCommentCount({ blockId, blockName, onOpen }: { blockId: string; blockName?: string; onOpen?: () => void }) {
  const counts = useContext(OpenCountsContext);
  const count = counts?.[blockId] ?? 0;
  if (!count) return null;
  const words = `${count} open ${count === 1 ? 'comment' : 'comments'}`;
  if (onOpen) {
    return (
      <Button
        variant="ghost"
        size="bare"
        onClick={onOpen}
        className="inline-flex h-7 items-center gap-1 rounded-[3px] px-1.5 text-[12px] text-ochre"
        data-open-comments={count}
        aria-label={`${words}${blockName ? ` on ${blockName}` : ''}: show them`}
        title="Show the comments"
      >
        <span aria-hidden="true">◆</span>
        {count}
      </Button>
    );
  }
  return (
    <span className="inline-flex items-center gap-1 text-[12px] text-ochre" data-open-comments={count}>
      <span aria-hidden="true">◆ {count}</span>
      <span className="sr-only">{words}</span>
    </span>
  );
}

/** Comments on the selected block: threads with replies, resolve and reopen, edit one's own. */
export function CommentsPanel({
  sheetId,
  blockId,
  blockName,
  revision,
  userId,
  canComment,
  teamId,
  members: givenMembers,
}: {
  /** The sheet's team (its members are the ones a comment can mention); looked up when not given. */
  teamId?: string;
  /** The team's members, when the page already has them. */
  members?: Person[];
  sheetId: string;
  blockId: string;
  blockName: string;
  /** The revision the new comment is about (the head; 0 while the sheet has none). */
  revision: number;
  userId: string;
  canComment: boolean;
}) {
  const queryClient = useQueryClient();
  const { data, isLoading } = useSheetComments(sheetId);
  const fetched = useSheetMembers(sheetId, teamId, !givenMembers);
  const members = givenMembers ?? fetched.data ?? [];
  const [error, setError] = useState<string | null>(null);
  const [showResolved, setShowResolved] = useState(false);
  const refresh = () => queryClient.invalidateQueries({ queryKey: commentsKey(sheetId) });
  const mutate = useMutation({
    mutationFn: ({ url, method, body }: { url: string; method: ApiRequest['method']; body: unknown }) => callComments<unknown>(url, method, body),
    onSuccess: () => {
      setError(null);
      return refresh();
    },
    onError: (e: Error) => setError(e.message),
  });

  const threads = (data?.items ?? []).filter((t) => t.blockId === blockId);
  const open = threads.filter((t) => !t.resolved);
  const resolved = threads.filter((t) => t.resolved);

  async function post(body: string, parentId?: string): Promise<boolean> {
    return mutate.mutateAsync({ url: `/api/sheets/${sheetId}/comments`, method: 'POST', body: { blockId, revision, body, ...(parentId ? { parentId } : {}) } }).then(
      () => true,
      () => false,
    );
  }
  const edit = async (id: string, body: string) => {
    await mutate.mutateAsync({ url: `/api/comments/${id}`, method: 'PATCH', body: { body } }).catch(() => undefined);
  };
  const setResolved = (id: string, value: boolean) => mutate.mutate({ url: `/api/comments/${id}`, method: 'PATCH', body: { resolved: value } });

  const renderThread = (thread: Thread) => (
    <CommentThreadItem
      key={thread.id}
      thread={thread}
      busy={mutate.isPending}
      onReply={post}
      onResolve={setResolved}
      members={members}
      userId={userId}
      canComment={canComment}
      onEdit={edit}
      revision={revision}
    />
  );

  return (
    <section aria-label={`Comments on ${blockName}`} className="flex flex-col gap-3 text-[13px]">
      <h2 className="text-[14px] font-semibold">
        Comments on <span className="num">{blockName}</span> <span className="font-normal text-slate">({open.length} open)</span>
      </h2>
      {isLoading ? <p className="text-slate">Loading…</p> : null}
      {data && data.total > data.listed ? (
        <p className="text-[12px] text-slate" data-testid="comments-left-out">
          The sheet has {data.total} comments; the newest {data.listed} are listed, with the start of their threads. Older ones are kept but not shown here.
        </p>
      ) : null}
      {canComment ? (
        <CommentForm
          members={members}
          label="New comment"
          placeholder="Comment on this block… (@ and a name to mention someone)"
          multiline
          submitLabel="Comment"
          busy={mutate.isPending}
          onSend={(body) => post(body)}
        />
      ) : (
        <p className="text-[12px] text-slate">Your role can read comments but not write them.</p>
      )}
      {error ? <ErrorText size="inherit">{error}</ErrorText> : null}
      {open.length === 0 && !isLoading ? <p className="text-slate">No open comments on this block.</p> : null}
      <ul className="flex flex-col gap-2">{open.map(renderThread)}</ul>
      {resolved.length ? (
        <div>
          <Button variant="link" size="inline" className="text-[12px]" aria-expanded={showResolved} onClick={() => setShowResolved((v) => !v)}>
            {showResolved ? 'Hide' : 'Show'} {resolved.length} resolved
          </Button>
          {showResolved ? <ul className="mt-2 flex flex-col gap-2">{resolved.map(renderThread)}</ul> : null}
        </div>
      ) : null}
    </section>
  );
}
