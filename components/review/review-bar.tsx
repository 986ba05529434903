'use client';

import { useRouter } from 'next/navigation';
import { useCallback, useState } from 'react';
import { Button } from '@/components/ui/button';
import { StatusTag, type SheetStatus } from '@/components/ui/status';
import { ErrorText } from '@/components/ui/error-text';

type Person = { id: string; name: string; email: string };
type Role = 'owner' | 'editor' | 'reviewer' | 'viewer';
export type ReviewState = {
  status: Exclude<SheetStatus, 'draft'>;
  preparedBy: Person | null;
  preparedAt: string;
  reviewer: Person | null;
  requestedAt: string | null;
  checkedBy: Person | null;
  checkedAt: string | null;
  approvedBy: Person | null;
  approvedAt: string | null;
  returnedBy: Person | null;
  returnedAt: string | null;
};
export type ReviewAction = 'request' | 'check' | 'return' | 'approve';

const day = (iso: string | null) => (iso ? iso.slice(0, 10) : '');

/** Which review actions this person may take now (the server checks again; this only shapes the buttons). */
export function allowedReviewActions({ role, userId, review, isHead }: { role: Role; userId: string; review: ReviewState; isHead: boolean }): ReviewAction[] {
  if (!isHead) return [];
  const isAuthor = review.preparedBy?.id === userId;
  const actions: ReviewAction[] = [];
  if ((role === 'owner' || role === 'editor') && (review.status === 'unsigned' || review.status === 'returned')) actions.push('request');
  if ((role === 'owner' || role === 'reviewer') && !isAuthor && review.status === 'in_review') actions.push('check');
  if ((role === 'owner' || role === 'reviewer') && !isAuthor && (review.status === 'in_review' || review.status === 'checked')) actions.push('return');
  if (role === 'owner' && !isAuthor && review.checkedBy?.id !== userId && review.status === 'checked') actions.push('approve');
  return actions;
}

const LABELS: Record<ReviewAction, string> = { request: 'Ask for a check', check: 'Mark checked', return: 'Return for changes', approve: 'Approve' };

/**
 * Runs review actions on one revision: the server decides (independent checking is enforced there);
 * a refusal (403, 409...) is kept as its message to show as it is.
 */
export function useReviewActions({ sheetId, revision, onChanged }: { sheetId: string; revision: number; onChanged?: () => void }) {
  const router = useRouter();
  const [pending, setPending] = useState<ReviewAction | null>(null);
  const [error, setError] = useState<string | null>(null);
  const act = useCallback(
    async (action: ReviewAction, options: { reviewerId?: string; message?: string } = {}): Promise<boolean> => {
      setPending(action);
      setError(null);
      try {
        const response = await fetch(`/api/sheets/${sheetId}/review`, {
          method: 'POST',
          headers: { 'content-type': 'application/json' },
          body: JSON.stringify({
            action,
            revision,
            ...(action === 'request' ? { reviewerId: options.reviewerId } : {}),
            ...(options.message?.trim() ? { message: options.message.trim() } : {}),
          }),
        });
        if (!response.ok) {
          const payload = (await response.json().catch(() => null)) as { error?: { message: string } } | null;
          setError(payload?.error?.message ?? `That did not work (the server answered ${response.status}). Try again.`);
          return false;
        }
      } catch {
        setError('The server could not be reached. Try again.');
        return false;
      } finally {
        setPending(null);
      }
      onChanged?.();
      router.refresh();
      return true;
    },
    [onChanged, revision, router, sheetId],
  );
  return { act, pending, error, setError };
}

export type ReviewController = ReturnType<typeof useReviewActions>;

/** Prepared / checked / approved for one revision, with the actions the role allows. */
export function ReviewBar({
  sheetId,
  revision,
  isHead,
  review,
  role,
  userId,
  checkers,
  onChanged,
  controller,
}: {
  sheetId: string;
  revision: number;
  isHead: boolean;
  review: ReviewState;
  role: Role;
  userId: string;
  /** Members who may check (owners and reviewers). */
  checkers: Person[];
  onChanged?: () => void;
  /** Shared with other entry points (the palette) so their errors show here; the bar makes its own otherwise. */
  controller?: ReviewController;
}) {
  const own = useReviewActions({ sheetId, revision, onChanged });
  const { act: run, pending, error } = controller ?? own;
  const [note, setNote] = useState('');
  const eligible = checkers.filter((p) => p.id !== review.preparedBy?.id);
  const [reviewerId, setReviewerId] = useState(eligible[0]?.id ?? '');
  const actions = allowedReviewActions({ role, userId, review, isHead });

  async function act(action: ReviewAction) {
    if (await run(action, { reviewerId, message: note })) setNote('');
  }

  return (
    <section aria-label="Review sign-off" className="flex flex-col gap-2 rounded-[4px] border border-rule bg-chalk px-3 py-2 text-[13px]" data-review-status={review.status}>
      <div className="flex flex-wrap items-center gap-x-4 gap-y-1">
        <StatusTag status={review.status} />
        <span>
          <span className="text-slate">Prepared</span> {review.preparedBy?.name ?? '—'} <span className="num text-slate">{day(review.preparedAt)}</span>
        </span>
        <span>
          <span className="text-slate">Checked</span>{' '}
          {review.checkedBy ? (
            <>
              {review.checkedBy.name} <span className="num text-slate">{day(review.checkedAt)}</span>
            </>
          ) : review.status === 'in_review' && review.reviewer ? (
            <span className="text-slate">awaiting {review.reviewer.name}</span>
          ) : (
            '—'
          )}
        </span>
        <span>
          <span className="text-slate">Approved</span>{' '}
          {review.approvedBy ? (
            <>
              {review.approvedBy.name} <span className="num text-slate">{day(review.approvedAt)}</span>
            </>
          ) : (
            '—'
          )}
        </span>
        {review.status === 'returned' && review.returnedBy ? (
          <span className="text-oxide">
            Returned by {review.returnedBy.name} <span className="num">{day(review.returnedAt)}</span>
          </span>
        ) : null}
      </div>
      {!isHead ? <p className="text-[12px] text-slate">Only the newest revision can be reviewed.</p> : null}
      {actions.length ? (
        <div className="flex flex-wrap items-end gap-2">
          {actions.includes('request') ? (
            <div className="flex flex-col gap-0.5">
              <label htmlFor={`checker-${sheetId}`} className="text-[12px] text-slate">Checker</label>
              <select id={`checker-${sheetId}`} value={reviewerId} onChange={(e) => setReviewerId(e.target.value)} className="h-8 rounded-[3px] border border-rule bg-chalk px-2">
                {eligible.map((p) => (
                  <option key={p.id} value={p.id}>
                    {p.name}
                  </option>
                ))}
              </select>
            </div>
          ) : null}
          <label className="flex min-w-56 flex-1 flex-col gap-0.5">
            <span className="text-[12px] text-slate">Note (optional)</span>
            <input value={note} onChange={(e) => setNote(e.target.value)} maxLength={2000} className="h-8 rounded-[3px] border border-rule bg-chalk px-2" aria-label="Review note" />
          </label>
          {actions.map((a) => (
            <Button key={a} variant={a === 'return' ? 'danger' : 'primary'} disabled={pending !== null || (a === 'request' && !reviewerId)} onClick={() => act(a)}>
              {pending === a ? '…' : LABELS[a]}
            </Button>
          ))}
        </div>
      ) : null}
      {error ? (
        <ErrorText size="inherit">{error}</ErrorText>
      ) : null}
    </section>
  );
}
