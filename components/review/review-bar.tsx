'use client';

import { useRouter } from 'next/navigation';
import { useCallback, useState } from 'react';
import { Button } from '@/components/ui/button';
import { StatusTag } from '@/components/ui/status';
import { ErrorText } from '@/components/ui/error-text';
import { Dialog } from '@/components/ui/dialog';
import { ReviewNotes, type ReviewNote } from './review-notes';
import type { TeamRole as Role } from '@/models';
import { allowedReviewActions as allowedByRules, type ReviewAction } from '@/lib/auth/review-rules';
import type { PublicUser as Person } from '@/lib/db/users';
import type { ReviewSummary } from '@/lib/db/revisions';
import { ApiError, apiFetch, failureOf } from '@/lib/api-client';
import { formatDay } from '@/lib/format/dates';

export type { ReviewAction };

/** The sign-off of a revision, as lib/db answers it. */
export type ReviewState = Omit<ReviewSummary, 'evaluating'> & { evaluating?: boolean };

const day = (iso: string | null) => formatDay(iso);

/** Which review actions this person may take now (the rules of lib/auth/review-rules.ts; the server checks again). */
export function allowedReviewActions({ role, userId, review, isHead }: { role: Role; userId: string; review: ReviewState; isHead: boolean }): ReviewAction[] {
  return allowedByRules({ role, actorId: userId, authorId: review.preparedBy?.id ?? null, checkedById: review.checkedBy?.id ?? null, status: review.status, evaluating: review.evaluating ?? false, isHead });
}

export const LABELS: Record<ReviewAction, string> = { request: 'Ask for a check', check: 'Mark checked', return: 'Return for changes', approve: 'Approve' };

/**
 * Runs review actions on one revision: the server decides (independent checking is enforced there);
 * a refusal (403, 409...) is kept as its message to show as it is.
 */
export function useReviewActions({ sheetId, revision, onChanged }: { sheetId: string; revision: number; onChanged?: () => void }) {
  const router = useRouter();
  const [pending, setPending] = useState<ReviewAction | null>(null);
  const [error, setError] = useState<string | null>(null);
  // The confirm step with a note: every entry point (the bar's buttons, the palette) asks first.
  const [confirming, setConfirming] = useState<{ action: ReviewAction; reviewerId?: string } | null>(null);
  const ask = useCallback((action: ReviewAction, options: { reviewerId?: string } = {}) => {
    setError(null);
    setConfirming({ action, ...(options.reviewerId ? { reviewerId: options.reviewerId } : {}) });
  }, []);
  const cancel = useCallback(() => setConfirming(null), []);
  const act = useCallback(
    async (action: ReviewAction, options: { reviewerId?: string; message?: string } = {}): Promise<boolean> => {
      setPending(action);
      setError(null);
      try {
        await apiFetch(`/api/sheets/${sheetId}/review`, {
          body: {
            action,
            revision,
            ...(action === 'request' ? { reviewerId: options.reviewerId } : {}),
            ...(options.message?.trim() ? { message: options.message.trim() } : {}),
          },
        });
      } catch (failure) {
        // A refusal (403, 409...) is shown as the server said it.
        setError(
          failure instanceof ApiError && failure.status === 0
            ? 'The server could not be reached. Try again.'
            : failureOf(failure, `That did not work (the server answered ${failure instanceof ApiError ? failure.status : 'oddly'}). Try again.`).message,
        );
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
  return { act, pending, error, setError, confirming, ask, cancel };
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
  notes = [],
  draftDiffers = false,
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
  /** The review actions on this revision with their notes, oldest first. */
  notes?: ReviewNote[];
  /** Shown on the sheet page when the draft beside the bar is not this revision. */
  draftDiffers?: boolean;
}) {
  const own = useReviewActions({ sheetId, revision, onChanged });
  const controls = controller ?? own;
  const { pending, error, confirming, ask, cancel } = controls;
  const eligible = checkers.filter((p) => p.id !== review.preparedBy?.id);
  const [reviewerId, setReviewerId] = useState(eligible[0]?.id ?? '');
  const actions = allowedReviewActions({ role, userId, review, isHead });

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
      {draftDiffers ? (
        <p className="text-[12px] text-clay" data-testid="sign-off-scope">
          This sign-off is of r{revision} only: the draft shown below differs from r{revision}, and its outputs are not signed off.
        </p>
      ) : null}
      <ReviewNotes notes={notes} />
      {review.evaluating ? (
        <p className="text-[12px] text-ochre" data-testid="review-evaluating">
          <span aria-hidden="true">◌ </span>Evaluating: r{revision}&apos;s results are stored when its long run finishes; a check can be asked for after that.
        </p>
      ) : null}
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
          {actions.map((a) => (
            <Button key={a} variant={a === 'return' ? 'danger' : 'primary'} disabled={pending !== null || (a === 'request' && !reviewerId)} onClick={() => ask(a, { reviewerId })}>
              {pending === a ? '…' : LABELS[a]}
            </Button>
          ))}
        </div>
      ) : null}
      {error ? (
        <ErrorText size="inherit">{error}</ErrorText>
      ) : null}
      {confirming ? (
        <ReviewConfirm
          key={`${confirming.action}-${confirming.reviewerId ?? ''}`}
          revision={revision}
          action={confirming.action}
          checkers={eligible}
          reviewerId={confirming.reviewerId ?? reviewerId}
          onCancel={cancel}
          onConfirm={(options) => {
            cancel();
            void controls.act(confirming.action, options);
          }}
        />
      ) : null}
    </section>
  );
}

const NOTE_LABELS: Record<ReviewAction, string> = {
  request: 'Note to the checker (optional)',
  check: 'Check note (optional)',
  return: 'Reason for returning (shown to the author)',
  approve: 'Approval note (optional)',
};

/** The confirm step of a review action, with a note: the same for the bar's buttons and the palette. */
function ReviewConfirm({
  revision,
  action,
  checkers,
  reviewerId: initialReviewer,
  onCancel,
  onConfirm,
}: {
  revision: number;
  action: ReviewAction;
  checkers: Person[];
  reviewerId: string;
  onCancel: () => void;
  onConfirm: (options: { reviewerId?: string; message?: string }) => void;
}) {
  const [note, setNote] = useState('');
  const [reviewerId, setReviewerId] = useState(initialReviewer || checkers[0]?.id || '');
  const needsReason = action === 'return';
  return (
    <Dialog open onClose={onCancel} title={`Confirm: ${LABELS[action]} (r${revision})`}>
      <form
        className="flex flex-col gap-3 text-[13px]"
        onSubmit={(event) => {
          event.preventDefault();
          if (needsReason && !note.trim()) return;
          onConfirm({ ...(action === 'request' ? { reviewerId } : {}), message: note });
        }}
      >
        {action === 'request' ? (
          <label className="flex flex-col gap-0.5">
            <span className="text-[12px] text-slate">Checker for this revision</span>
            <select value={reviewerId} onChange={(e) => setReviewerId(e.target.value)} className="h-8 rounded-[3px] border border-rule bg-chalk px-2">
              {checkers.map((p) => (
                <option key={p.id} value={p.id}>
                  {p.name}
                </option>
              ))}
            </select>
          </label>
        ) : null}
        <label className="flex flex-col gap-0.5">
          <span className="text-[12px] text-slate">{NOTE_LABELS[action]}</span>
          <textarea
            value={note}
            onChange={(e) => setNote(e.target.value)}
            maxLength={2000}
            rows={3}
            required={needsReason}
            autoFocus
            className="rounded-[3px] border border-rule bg-chalk px-2 py-1"
          />
        </label>
        <p className="text-[12px] text-slate">The note is kept with the revision&apos;s review trail and shown in its report.</p>
        <div className="flex justify-end gap-2">
          <Button type="button" variant="quiet" onClick={onCancel}>
            Cancel
          </Button>
          <Button type="submit" variant={action === 'return' ? 'danger' : 'primary'} disabled={(action === 'request' && !reviewerId) || (needsReason && !note.trim())}>
            {LABELS[action]}
          </Button>
        </div>
      </form>
    </Dialog>
  );
}
