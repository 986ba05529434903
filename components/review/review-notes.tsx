import { formatMinute } from '@/lib/format/dates';
// The notes of each review action (request, check, return, approve) with who and when.
export type ReviewNote = {
  id: string;
  revision: number;
  action: 'request' | 'check' | 'return' | 'approve';
  by: { id: string; name: string } | null;
  reviewer?: { id: string; name: string } | null;
  message: string;
  at: string;
};

export const REVIEW_ACTION_WORDS: Record<ReviewNote['action'], string> = {
  request: 'asked for a check',
  check: 'checked',
  return: 'returned for changes',
  approve: 'approved',
};

const when = (iso: string) => `${formatMinute(iso)} UTC`;

export function ReviewNotes({ notes, showRevision = false }: { notes: ReviewNote[]; showRevision?: boolean }) {
  if (!notes.length) return null;
  return (
    <ol className="flex flex-col gap-0.5 text-[12px]" aria-label="Review notes" data-review-notes="">
      {notes.map((n) => (
        <li key={n.id} className={n.action === 'return' ? 'text-oxide' : 'text-slate'} data-review-action={n.action}>
          <span className="num">{when(n.at)}</span> · {showRevision ? <span className="num">r{n.revision} · </span> : null}
          <span className="text-basalt">{n.by?.name ?? 'someone'}</span> {REVIEW_ACTION_WORDS[n.action]}
          {n.action === 'request' && n.reviewer ? ` (checker: ${n.reviewer.name})` : ''}
          {n.message ? (
            <>
              : <q className="text-basalt">{n.message}</q>
            </>
          ) : n.action === 'return' ? (
            ': no reason given'
          ) : null}
        </li>
      ))}
    </ol>
  );
}
