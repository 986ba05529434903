import { Button } from '@/components/ui/button';
import type { Metadata } from 'next';
import Link from 'next/link';
import { StatusTag } from '@/components/ui/status';
import { listRevisionsBySheet, REVISION_PAGE_SIZE } from '@/lib/db/revisions';
import { listReviewEvents } from '@/lib/db/review-events';
import { ReviewNotes } from '@/components/review/review-notes';
import { requireSheetPage } from '@/lib/sheet/page-access';
import { formatMinute } from '@/lib/format/dates';

export const metadata: Metadata = { title: 'Revisions' };

type Search = Record<string, string | string[] | undefined>;

export default async function RevisionsPage({ params, searchParams }: { params: Promise<{ sheetId: string }>; searchParams: Promise<Search> }) {
  const { sheetId } = await params;
  const query = await searchParams;
  const { sheet } = await requireSheetPage(sheetId);
  // Pages of REVISION_PAGE_SIZE, newest first, 1-based in the address (anything else is the first page). One
  // more row is read than is shown: the revision just before the page's oldest, for its "changes" link.
  const page = typeof query.page === 'string' && /^[1-9][0-9]{0,5}$/.test(query.page) ? Number(query.page) : 1;
  const offset = (page - 1) * REVISION_PAGE_SIZE;
  const { items: read, total } = await listRevisionsBySheet({ sheetId, limit: REVISION_PAGE_SIZE + 1, offset });
  const items = read.slice(0, REVISION_PAGE_SIZE);
  const events = await listReviewEvents({ sheetId, revisions: items.map((r) => r.number) });
  const pages = Math.max(1, Math.ceil(total / REVISION_PAGE_SIZE));
  const pageHref = (to: number) => `/sheets/${sheetId}/revisions${to > 1 ? `?page=${to}` : ''}`;
  const notesOf = (n: number) => events.filter((e) => e.revision === n).map((e) => ({ ...e, by: e.by ? { id: e.by.id, name: e.by.name } : null, reviewer: e.reviewer ? { id: e.reviewer.id, name: e.reviewer.name } : null }));
  // Newest first: the latest number, and the number saved just before the i-th row (none for the oldest).
  const latest = items[0]?.number ?? 1;
  const previous = (i: number): number | undefined => read[i + 1]?.number;
  return (
    <div className="flex flex-col gap-4">
      <nav aria-label="Breadcrumb" className="text-[13px] text-slate">
        <Link href="/sheets" className="hover:text-basalt">Sheets</Link> /{' '}
        <Link href={`/sheets/${sheetId}`} className="hover:text-basalt">{sheet.title}</Link> / Revisions
      </nav>
      <h1 className="text-[20px] font-semibold tracking-tight">Revisions of {sheet.title}</h1>
      {total === 0 ? (
        <p className="text-[13px] text-slate">No revision yet. Save one from the sheet to keep a numbered, reproducible record.</p>
      ) : items.length === 0 ? (
        <p className="text-[13px] text-slate">
          There are {pages} {pages === 1 ? 'page' : 'pages'} of revisions.{' '}
          <Link href={pageHref(pages)} className="text-river hover:underline">Go to the last page</Link>
        </p>
      ) : (
        <>
          <form action={`/sheets/${sheetId}/compare`} className="flex flex-wrap items-end gap-2 text-[13px]">
            <label className="flex flex-col gap-1">
              <span>From</span>
              <select name="from" defaultValue={items[1]?.number ?? latest} className="h-8 rounded-[3px] border border-rule bg-chalk px-2">
                {items.map((r) => (
                  <option key={r.number} value={r.number}>r{r.number}</option>
                ))}
              </select>
            </label>
            <label className="flex flex-col gap-1">
              <span>To</span>
              <select name="to" defaultValue={latest} className="h-8 rounded-[3px] border border-rule bg-chalk px-2">
                {items.map((r) => (
                  <option key={r.number} value={r.number}>r{r.number}</option>
                ))}
              </select>
            </label>
            <Button type="submit">Compare</Button>
          </form>
          <div className="overflow-x-auto rounded-[4px] border border-rule bg-chalk">
            <table className="w-full border-collapse text-[13px]">
              <thead>
                <tr className="border-b border-rule text-left text-[12px] text-slate">
                  <th scope="col" className="px-3 py-2 font-medium">Revision</th>
                  <th scope="col" className="px-3 py-2 font-medium">Message</th>
                  <th scope="col" className="px-3 py-2 font-medium">Prepared by</th>
                  <th scope="col" className="px-3 py-2 font-medium">Saved</th>
                  <th scope="col" className="px-3 py-2 font-medium">Status</th>
                  <th scope="col" className="px-3 py-2 font-medium">Hash</th>
                  <th scope="col" className="px-3 py-2 font-medium"><span className="sr-only">Links</span></th>
                </tr>
              </thead>
              <tbody>
                {items.map((r, i) => (
                  <tr key={r.number} className="border-b border-rule last:border-0" data-revision={r.number}>
                    <td className="num px-3 py-2">
                      <Link href={`/sheets/${sheetId}/revisions/${r.number}`} className="text-river hover:underline">r{r.number}</Link>
                      {i === 0 && offset === 0 ? <span className="ml-1 text-[12px] text-slate">(newest)</span> : null}
                    </td>
                    <td className="px-3 py-2">{r.message || <span className="text-slate">—</span>}</td>
                    <td className="px-3 py-2">{r.author?.name ?? '—'}</td>
                    <td className="num px-3 py-2 whitespace-nowrap"><time dateTime={r.createdAt}>{formatMinute(r.createdAt)} UTC</time></td>
                    <td className="px-3 py-2">
                      <StatusTag status={r.review.status} />
                      {r.evaluation.status !== 'done' ? (
                        <span className="ml-2 text-[12px] text-ochre" data-testid="revision-evaluating">
                          <span aria-hidden="true">◌ </span>
                          {r.evaluation.status === 'evaluating' ? 'evaluating' : 'not evaluated'}
                        </span>
                      ) : null}
                      <div className="mt-1"><ReviewNotes notes={notesOf(r.number)} /></div>
                    </td>
                    <td className="num px-3 py-2 text-slate" title={r.hash}>{r.hash.slice(0, 10)}</td>
                    <td className="px-3 py-2 whitespace-nowrap text-[12px]">
                      {previous(i) ? (
                        <Link href={`/sheets/${sheetId}/compare?from=${previous(i)}&to=${r.number}`} className="text-river hover:underline">changes</Link>
                      ) : null}{' '}
                      <a href={`/api/sheets/${sheetId}/export?revision=${r.number}`} className="text-river hover:underline">export</a>{' '}
                      {r.evaluation.status === 'done' ? (
                        <Link href={`/sheets/${sheetId}/revisions/${r.number}/report`} className="text-river hover:underline">report</Link>
                      ) : null}
                    </td>
                  </tr>
                ))}
              </tbody>
            </table>
          </div>
          {pages > 1 ? (
            <nav aria-label="Pages of revisions" className="flex items-center justify-between gap-3 text-[13px]">
              {page > 1 ? (
                <Link href={pageHref(Math.min(page - 1, pages))} rel="prev" className="text-river hover:underline">
                  ← Newer
                </Link>
              ) : (
                <span />
              )}
              <span className="text-slate">
                {`r${items[0]!.number}–r${items[items.length - 1]!.number} of ${total} revisions · page ${page} of ${pages}`}
              </span>
              {page < pages ? (
                <Link href={pageHref(page + 1)} rel="next" className="text-river hover:underline">
                  Older →
                </Link>
              ) : (
                <span />
              )}
            </nav>
          ) : null}
        </>
      )}
    </div>
  );
}
