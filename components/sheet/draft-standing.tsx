import Link from 'next/link';
import type { DraftStanding } from '@/lib/sheet/draft-standing.server';

// Beside the draft: whether it differs from the head revision and from the last approved one,
// with a link to compare. Kept out of the review bar so sign-off and draft never blur together.
export function DraftStandingNote({ sheetId, standing }: { sheetId: string; standing: DraftStanding }) {
  const { head, approved } = standing;
  if (!head) return null;
  const parts: { key: string; text: string; href: string | null }[] = [];
  const sameRevision = approved && approved.number === head.number;
  parts.push({
    key: 'head',
    text: head.differs
      ? `Draft differs from r${head.number}${sameRevision ? ' (approved)' : ' (newest revision)'}`
      : `Draft is the same as r${head.number}${sameRevision ? ' (approved)' : ' (newest revision)'}`,
    href: head.differs ? `/sheets/${sheetId}/compare?from=${head.number}&to=draft` : null,
  });
  if (approved && !sameRevision) {
    parts.push({
      key: 'approved',
      text: approved.differs ? `Draft differs from r${approved.number} (approved)` : `Draft is the same as r${approved.number} (approved)`,
      href: approved.differs ? `/sheets/${sheetId}/compare?from=${approved.number}&to=draft` : null,
    });
  }
  if (!approved) parts.push({ key: 'none', text: 'No revision of this sheet is approved yet', href: null });
  return (
    <p className="flex flex-wrap gap-x-4 gap-y-1 text-[12px]" data-testid="draft-standing">
      {parts.map((p) => (
        <span key={p.key} className={p.href ? 'text-clay' : 'text-slate'}>
          {p.text}
          {p.href ? (
            <>
              {' '}
              <Link href={p.href} className="text-river hover:underline">
                compare
              </Link>
            </>
          ) : null}
        </span>
      ))}
      {approved ? (
        <Link href={`/sheets/${sheetId}/revisions/${approved.number}`} className="text-river hover:underline">
          Open the approved r{approved.number}
        </Link>
      ) : null}
    </p>
  );
}
