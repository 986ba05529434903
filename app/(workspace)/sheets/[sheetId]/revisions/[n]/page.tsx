import type { Metadata } from 'next';
import Link from 'next/link';
import { notFound } from 'next/navigation';
import { RevisionBlocks, ResultCautions } from '@/components/history/revision-view';
import { ReviewBar } from '@/components/review/review-bar';
import { RevisionSideRail } from '@/components/history/revision-side-rail';
import { RevisionEvaluation } from '@/components/history/revision-evaluation';
import { roleAllows } from '@/lib/auth/permissions';
import { listCommentsBySheet } from '@/lib/db/comments';
import { listMembersByTeam } from '@/lib/db/members';
import { readRevision } from '@/lib/db/revisions';
import { listReviewEvents } from '@/lib/db/review-events';
import { latestApprovedRevision } from '@/lib/sheet/draft-standing.server';
import { requireSheetPage } from '@/lib/sheet/page-access';
import { formatMinute } from '@/lib/format/dates';

export const metadata: Metadata = { title: 'Revision' };

export default async function RevisionPage({ params }: { params: Promise<{ sheetId: string; n: string }> }) {
  const { sheetId, n } = await params;
  const { user, sheet, role } = await requireSheetPage(sheetId);
  const number = Number(n);
  if (!Number.isInteger(number) || number < 1) notFound();
  const revision = await readRevision({ sheetId, number }).catch(() => null);
  if (!revision) notFound();
  const [members, comments, events, approved] = await Promise.all([
    listMembersByTeam({ teamId: sheet.teamId }),
    listCommentsBySheet({ sheetId }),
    listReviewEvents({ sheetId, revision: number }),
    latestApprovedRevision({ sheetId }),
  ]);
  const notes = events.map((e) => ({ ...e, by: e.by ? { id: e.by.id, name: e.by.name } : null, reviewer: e.reviewer ? { id: e.reviewer.id, name: e.reviewer.name } : null }));
  const checkers = members.items.filter((m) => roleAllows(m.role, 'check')).map((m) => m.user);
  const isHead = number === sheet.headRevision;
  const document = revision.document;
  // Saved over the cost limit: no results until its long run stores them (CONTRACT §6b).
  const evaluated = revision.results !== null;
  return (
    <div className="grid gap-6 lg:grid-cols-[minmax(0,1fr)_340px]">
    <div className="flex min-w-0 flex-col gap-4">
      <nav aria-label="Breadcrumb" className="text-[13px] text-slate">
        <Link href="/sheets" className="hover:text-basalt">Sheets</Link> /{' '}
        <Link href={`/sheets/${sheetId}`} className="hover:text-basalt">{sheet.title}</Link> /{' '}
        <Link href={`/sheets/${sheetId}/revisions`} className="hover:text-basalt">Revisions</Link> / r{number}
      </nav>
      <header className="flex flex-col gap-1">
        <h1 className="text-[20px] font-semibold tracking-tight">
          {document.title} <span className="num text-slate">r{number}</span>
        </h1>
        <p className="text-[13px] text-slate">
          {document.site ? `${document.site.name} · ` : ''}read-only record · saved {formatMinute(revision.createdAt)} UTC by{' '}
          {revision.author?.name ?? '—'} · engine {revision.engineVersion} ·{' '}
          <span className="num" title={revision.hash}>
            {revision.hash.slice(0, 12)}
          </span>
        </p>
        {revision.message ? <p className="text-[14px]">“{revision.message}”</p> : null}
        <p className="text-[13px]" data-testid="revision-standing">
          {revision.review.status === 'approved'
            ? approved === number
              ? `r${number} is the latest approved revision of this sheet.`
              : `r${number} was approved; r${approved} is the latest approved revision.`
            : approved !== null
              ? `r${number} is not approved; the latest approved revision is r${approved}.`
              : `r${number} is not approved; no revision of this sheet is approved yet.`}
        </p>
        <p className="flex flex-wrap gap-3 text-[13px]">
          {number > 1 ? (
            <Link className="text-river hover:underline" href={`/sheets/${sheetId}/compare?from=${number - 1}&to=${number}`}>
              Changes since r{number - 1}
            </Link>
          ) : null}
          {evaluated ? (
            <>
              <Link className="text-river hover:underline" href={`/sheets/${sheetId}/revisions/${number}/report`}>
                Calculation report
              </Link>
              <a className="text-river hover:underline" href={`/api/sheets/${sheetId}/revisions/${number}/report.pdf`}>
                PDF
              </a>
            </>
          ) : null}
          <a className="text-river hover:underline" href={`/api/sheets/${sheetId}/export?revision=${number}`}>
            Export this revision
          </a>
          {!isHead ? (
            <Link className="text-river hover:underline" href={`/sheets/${sheetId}/revisions/${sheet.headRevision}`}>
              Newest revision (r{sheet.headRevision})
            </Link>
          ) : null}
          {approved !== null && approved !== number ? (
            <Link className="text-river hover:underline" href={`/sheets/${sheetId}/revisions/${approved}`}>
              Latest approved (r{approved})
            </Link>
          ) : null}
          <Link className="text-river hover:underline" href={`/sheets/${sheetId}?draft=1`} data-testid="open-draft">
            Open the working draft
          </Link>
        </p>
      </header>
      <ReviewBar sheetId={sheetId} revision={number} isHead={isHead} review={revision.review} role={role} userId={user.id} checkers={checkers} notes={notes} />
      <RevisionEvaluation sheetId={sheetId} revision={number} evaluation={revision.evaluation} />
      <ResultCautions />
      <RevisionBlocks blocks={document.blocks} results={revision.results ?? {}} openCounts={comments.openByBlock} />
    </div>
    <RevisionSideRail
      sheetId={sheetId}
      sheetTitle={sheet.title}
      revision={number}
      blocks={document.blocks.map((b) => ({ id: b.id, name: b.name, type: b.type }))}
      userId={user.id}
      canComment={roleAllows(role, 'comment')}
      canFork={roleAllows(role, 'edit')}
    />
    </div>
  );
}
