'use client';

import dynamic from 'next/dynamic';
import { useState } from 'react';
import { Button } from '@/components/ui/button';
import type { CommentItem, CommentThread as Thread } from '@/lib/db/comments';
import type { PublicUser as Person } from '@/lib/db/users';
import { formatMinute } from '@/lib/format/dates';
import { CommentForm } from './comment-form';

// The mention highlighting loads with the comments panel's first use, not with the sheet page.
const MentionText = dynamic(() => import('./mention-box').then((m) => m.MentionText), { ssr: false });

interface CommentContext {
  members: Person[];
  userId: string;
  canComment: boolean;
  onEdit: (id: string, body: string) => Promise<void>;
  /** The sheet's newest revision: a comment made on an older one says so. */
  revision: number;
}

/** One comment: author, time, revision and marks, its text, and its author's edit form. */
function CommentBody({ comment, userId, canComment, onEdit, revision, members }: CommentContext & { comment: CommentItem }) {
  const earlier = comment.revision > 0 && comment.revision < revision;
  const [editing, setEditing] = useState(false);
  const [text, setText] = useState(comment.body);
  return (
    <div className="flex flex-col gap-1" data-comment-id={comment.id}>
      <div className="flex flex-wrap items-baseline gap-2 text-[12px] text-slate">
        <span className="font-medium text-basalt">{comment.author?.name ?? 'Former member'}</span>
        <time dateTime={comment.createdAt} className="num">{formatMinute(comment.createdAt)}</time>
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
        <Button variant="link" size="inline" className="self-start text-[12px]" onClick={() => setEditing(true)}>
          Edit
        </Button>
      ) : null}
    </div>
  );
}

/** A thread: its first comment, the replies, a reply form, and resolve or reopen. */
export function CommentThreadItem({
  thread,
  busy,
  onReply,
  onResolve,
  ...context
}: CommentContext & {
  thread: Thread;
  busy: boolean;
  onReply: (body: string, parentId: string) => Promise<boolean>;
  onResolve: (id: string, resolved: boolean) => void;
}) {
  return (
    <li className={`flex flex-col gap-2 rounded-[4px] border border-rule p-2 ${thread.resolved ? 'opacity-70' : ''}`} data-thread={thread.id}>
      <CommentBody comment={thread} {...context} />
      {thread.replies.length ? (
        <ul className="flex flex-col gap-2 border-l-2 border-rule pl-3">
          {thread.replies.map((r) => (
            <li key={r.id}>
              <CommentBody comment={r} {...context} />
            </li>
          ))}
        </ul>
      ) : null}
      {context.canComment ? (
        <div className="flex flex-col gap-1">
          {!thread.resolved ? (
            <CommentForm members={context.members} label="Reply" placeholder="Reply…" submitLabel="Reply" busy={busy} onSend={(body) => onReply(body, thread.id)} />
          ) : null}
          <Button variant="link" size="inline" className="self-start text-[12px]" onClick={() => onResolve(thread.id, !thread.resolved)}>
            {thread.resolved ? 'Reopen' : 'Resolve'}
          </Button>
        </div>
      ) : null}
      {thread.resolved && thread.resolvedBy ? <p className="text-[12px] text-moss"><span aria-hidden="true">✓ </span>Resolved by {thread.resolvedBy.name}</p> : null}
    </li>
  );
}
