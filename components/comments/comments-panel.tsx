'use client';

import { useMutation, useQuery, useQueryClient } from '@tanstack/react-query';
import { useState, type FormEvent } from 'react';
import { Button } from '@/components/ui/button';
import { ErrorText } from '@/components/ui/error-text';
import dynamic from 'next/dynamic';
import type { MentionPerson } from '@/lib/comments/mentions';
import type { CommentItem, CommentThread, listCommentsBySheet } from '@/lib/db/comments';
import { apiFetch, failureOf, type ApiRequest } from '@/lib/api-client';
import { formatMinute } from '@/lib/format/dates';

// The mention picker and highlighting load with the comments panel's first use, not with the sheet page.
const MentionBox = dynamic(() => import('./mention-box').then((m) => m.MentionBox), {
  ssr: false,
  loading: () => <div className="h-8 flex-1 rounded-[3px] border border-rule bg-wash" aria-hidden="true" />,
});
const MentionText = dynamic(() => import('./mention-box').then((m) => m.MentionText), { ssr: false });

type Comment = CommentItem;
type Thread = CommentThread;
type Listing = Awaited<ReturnType<typeof listCommentsBySheet>>;

export const commentsKey = (sheetId: string) => ['comments', sheetId] as const;

/** One comment route through the typed client; a failure keeps the server's message (or a general one). */
async function call<T>(url: string, method: ApiRequest['method'], body?: unknown): Promise<T> {
  try {
    return await apiFetch<T>(url, { method, body: body ?? undefined });
  } catch (error) {
    throw new Error(failureOf(error, 'That did not work. Try again.').message);
  }
}

/** How often the sheet page asks for other people's comments while the tab is visible. */
export const COMMENTS_REFRESH_MS = 20_000;

/**
 * Every comment of a sheet (one query shared by the panel and the per-block counts). The one observer
 * with `poll` (the sheet page) refreshes it every 20 s while the tab is visible and when the window
 * regains focus, so counts follow other people's comments; the cards only read the shared data.
 */
export function useSheetComments(sheetId: string, { poll = false }: { poll?: boolean } = {}) {
  return useQuery<Listing>({
    queryKey: commentsKey(sheetId),
    queryFn: () => call<Listing>(`/api/sheets/${sheetId}/comments`, 'GET'),
    ...(poll ? { refetchInterval: COMMENTS_REFRESH_MS, refetchIntervalInBackground: false, refetchOnWindowFocus: true, staleTime: 5_000 } : {}),
  });
}

/** The number of open threads on a block, for the badge on its card; a button when `onOpen` is given. */
export function OpenCommentCount({ sheetId, blockId, blockName, onOpen }: { sheetId: string; blockId: string; blockName?: string; onOpen?: () => void }) {
  const { data } = useSheetComments(sheetId);
  const count = data?.openByBlock[blockId] ?? 0;
  if (!count) return null;
  const words = `${count} open ${count === 1 ? 'comment' : 'comments'}`;
  if (onOpen) {
    return (
      <button
        type="button"
        onClick={onOpen}
        className="inline-flex h-7 items-center gap-1 rounded-[3px] px-1.5 text-[12px] text-ochre hover:bg-wash"
        data-open-comments={count}
        aria-label={`${words}${blockName ? ` on ${blockName}` : ''}: show them`}
        title="Show the comments"
      >
        <span aria-hidden="true">◆</span>
        {count}
      </button>
    );
  }
  return (
    <span className="inline-flex items-center gap-1 text-[12px] text-ochre" data-open-comments={count}>
      <span aria-hidden="true">◆ {count}</span>
      <span className="sr-only">{words}</span>
    </span>
  );
}

/** The members of the sheet's team, for the mention picker (every member may read them). */
export function useSheetMembers(sheetId: string, teamId?: string, enabled = true) {
  return useQuery<MentionPerson[]>({
    enabled,
    queryKey: ['sheet-members', sheetId, teamId ?? null],
    queryFn: async () => {
      const team = teamId ?? (await call<{ sheet: { teamId: string } }>(`/api/sheets/${sheetId}`, 'GET')).sheet.teamId;
      const listing = await call<{ items: { user: MentionPerson }[] }>(`/api/teams/${team}/members`, 'GET');
      return (listing.items as { user: MentionPerson }[]).map((item) => item.user);
    },
    staleTime: 60_000,
  });
}

/** The warning shown before a comment whose mentions reach nobody is sent. */
async function mentionWarning(body: string, members: MentionPerson[]): Promise<string | null> {
  const { unresolvedMentions } = await import('@/lib/comments/mentions');
  const unknown = unresolvedMentions(body, members);
  if (unknown.length === 0) return null;
  const words = unknown.map((u) => `@${u.handle} ${u.reason === 'nobody' ? 'matches nobody in the team' : 'matches more than one person'}`);
  return `${words.join('; ')}, so no one will be notified for it. Pick a name from the list after typing @, or send anyway.`;
}

/** A comment form: the mention box, the warning about unknown mentions, and the send button. */
function CommentForm({
  members,
  label,
  placeholder,
  multiline,
  submitLabel,
  busy,
  onSend,
}: {
  members: MentionPerson[];
  label: string;
  placeholder: string;
  multiline?: boolean;
  submitLabel: string;
  busy: boolean;
  onSend: (body: string) => Promise<boolean>;
}) {
  const [text, setText] = useState('');
  const [warned, setWarned] = useState<{ body: string; warning: string } | null>(null);
  const submit = async (event: FormEvent<HTMLFormElement>) => {
    event.preventDefault();
    const body = text.trim();
    if (!body) return;
    // The first send of a body whose mentions reach nobody only warns; sending it again ("Send anyway") posts it.
    if (warned?.body !== body) {
      const warning = await mentionWarning(body, members);
      if (warning) {
        setWarned({ body, warning });
        return;
      }
    }
    if (await onSend(body)) {
      setText('');
      setWarned(null);
    }
  };
  const warning = warned !== null && warned.body === text.trim() ? warned.warning : null;
  return (
    <form onSubmit={(e) => void submit(e)} className="flex flex-col gap-1">
      <div className={multiline ? 'flex flex-col gap-1' : 'flex gap-1'}>
        <MentionBox
          name="body"
          label={label}
          placeholder={placeholder}
          members={members}
          multiline={multiline}
          value={text}
          onValueChange={setText}
          className={multiline ? 'rounded-[3px] border border-rule bg-chalk px-2 py-1' : 'h-8 rounded-[3px] border border-rule bg-chalk px-2 text-[13px]'}
        />
        {!warning ? (
          <Button type="submit" variant={multiline ? 'primary' : undefined} disabled={busy} className={multiline ? 'self-end' : undefined}>
            {submitLabel}
          </Button>
        ) : null}
      </div>
      {warning ? (
        <div role="alert" className="flex flex-col gap-1 rounded-[3px] border border-clay/60 bg-chalk px-2 py-1 text-[12px]" data-mention-warning>
          <p>
            <span aria-hidden="true">⚠ </span>
            {warning}
          </p>
          <div className="flex gap-2">
            <Button type="submit" disabled={busy}>Send anyway</Button>
          </div>
        </div>
      ) : null}
    </form>
  );
}

function when(iso: string) {
  return formatMinute(iso);
}

function CommentBody({
  comment,
  userId,
  canComment,
  onEdit,
  revision,
  members,
}: {
  members: MentionPerson[];
  comment: Comment;
  userId: string;
  canComment: boolean;
  onEdit: (id: string, body: string) => Promise<void>;
  /** The sheet's newest revision: a comment made on an older one says so. */
  revision: number;
}) {
  const earlier = comment.revision > 0 && comment.revision < revision;
  const [editing, setEditing] = useState(false);
  const [text, setText] = useState(comment.body);
  return (
    <div className="flex flex-col gap-1" data-comment-id={comment.id}>
      <div className="flex flex-wrap items-baseline gap-2 text-[12px] text-slate">
        <span className="font-medium text-basalt">{comment.author?.name ?? 'Former member'}</span>
        <time dateTime={comment.createdAt} className="num">{when(comment.createdAt)}</time>
        {earlier ? (
          <span className="font-medium text-basalt" data-earlier-revision={comment.revision} title={`Made on r${comment.revision}, before r${revision}`}>
            <span aria-hidden="true">↶ </span>on earlier revision <span className="num">r{comment.revision}</span>
          </span>
        ) : (
          <span className="num">r{comment.revision}</span>
        )}
        {comment.edited ? <span>(edited)</span> : null}
        {comment.outdated ? (
          <span className="text-clay" title="The block has changed since this comment was made">
            <span aria-hidden="true">⚠ </span>block changed since
          </span>
        ) : null}
      </div>
      {editing ? (
        <form
          className="flex flex-col gap-1"
          onSubmit={async (e) => {
            e.preventDefault();
            await onEdit(comment.id, text);
            setEditing(false);
          }}
        >
          <textarea aria-label="Edit comment" value={text} onChange={(e) => setText(e.target.value)} rows={3} maxLength={10000} className="rounded-[3px] border border-rule bg-chalk px-2 py-1 text-[13px]" />
          <div className="flex gap-2">
            <Button type="submit" variant="primary">Save</Button>
            <Button onClick={() => { setEditing(false); setText(comment.body); }}>Cancel</Button>
          </div>
        </form>
      ) : (
        <p className="whitespace-pre-wrap text-[13px]">
          <MentionText body={comment.body} members={members} />
        </p>
      )}
      {!editing && canComment && comment.author?.id === userId ? (
        <button type="button" className="self-start text-[12px] text-river hover:underline" onClick={() => setEditing(true)}>
          Edit
        </button>
      ) : null}
    </div>
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
  members?: MentionPerson[];
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
    mutationFn: ({ url, method, body }: { url: string; method: ApiRequest['method']; body: unknown }) => call<unknown>(url, method, body),
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
    <li key={thread.id} className={`flex flex-col gap-2 rounded-[4px] border border-rule p-2 ${thread.resolved ? 'opacity-70' : ''}`} data-thread={thread.id}>
      <CommentBody comment={thread} userId={userId} canComment={canComment} onEdit={edit} revision={revision} members={members} />
      {thread.replies.length ? (
        <ul className="flex flex-col gap-2 border-l-2 border-rule pl-3">
          {thread.replies.map((r) => (
            <li key={r.id}>
              <CommentBody comment={r} userId={userId} canComment={canComment} onEdit={edit} revision={revision} members={members} />
            </li>
          ))}
        </ul>
      ) : null}
      {canComment ? (
        <div className="flex flex-col gap-1">
          {!thread.resolved ? (
            <CommentForm members={members} label="Reply" placeholder="Reply…" submitLabel="Reply" busy={mutate.isPending} onSend={(body) => post(body, thread.id)} />
          ) : null}
          <button type="button" className="self-start text-[12px] text-river hover:underline" onClick={() => setResolved(thread.id, !thread.resolved)}>
            {thread.resolved ? 'Reopen' : 'Resolve'}
          </button>
        </div>
      ) : null}
      {thread.resolved && thread.resolvedBy ? <p className="text-[12px] text-moss"><span aria-hidden="true">✓ </span>Resolved by {thread.resolvedBy.name}</p> : null}
    </li>
  );

  return (
    <section aria-label={`Comments on ${blockName}`} className="flex flex-col gap-3 text-[13px]">
      <h2 className="text-[14px] font-semibold">
        Comments on <span className="num">{blockName}</span> <span className="font-normal text-slate">({open.length} open)</span>
      </h2>
      {isLoading ? <p className="text-slate">Loading…</p> : null}
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
          <button type="button" className="text-[12px] text-river hover:underline" aria-expanded={showResolved} onClick={() => setShowResolved((v) => !v)}>
            {showResolved ? 'Hide' : 'Show'} {resolved.length} resolved
          </button>
          {showResolved ? <ul className="mt-2 flex flex-col gap-2">{resolved.map(renderThread)}</ul> : null}
        </div>
      ) : null}
    </section>
  );
}
