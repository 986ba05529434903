import { Button } from '@/components/ui/button';
import type { Metadata } from 'next';
import Link from 'next/link';
import { NewSheetForm } from '@/components/sheets/new-sheet-form';
import { StatusTag, STATUS_WORDS, type SheetStatus } from '@/components/ui/status';
import { requirePageUser } from '@/lib/auth/page';
import { roleAllows } from '@/lib/auth/permissions';
import { listSheetsByTeam, SHEET_PAGE_SIZE, type SheetSort } from '@/lib/db/sheet-list';
import { formatMinute } from '@/lib/format/dates';

export const metadata: Metadata = { title: 'Sheets' };

const COLUMNS: { key: SheetSort | null; label: string }[] = [
  { key: 'title', label: 'Title' },
  { key: 'site', label: 'Site' },
  { key: 'status', label: 'Status' },
  { key: 'revision', label: 'Revision' },
  { key: 'updated', label: 'Updated' },
  { key: null, label: 'Last edited by' },
];

const SORTS = new Set<SheetSort>(['updated', 'title', 'site', 'revision', 'status']);

type Search = Record<string, string | string[] | undefined>;

export default async function SheetsPage({ searchParams }: { searchParams: Promise<Search> }) {
  const params = await searchParams;
  const { current } = await requirePageUser();
  const q = typeof params.q === 'string' ? params.q.slice(0, 200) : '';
  const rawSort = typeof params.sort === 'string' ? params.sort : 'updated';
  const sortKey = (SORTS.has(rawSort.replace(/^-/, '') as SheetSort) ? rawSort.replace(/^-/, '') : 'updated') as SheetSort;
  const reversed = rawSort.startsWith('-');
  const descending = sortKey === 'updated' ? !reversed : reversed;
  const status = typeof params.status === 'string' && params.status in STATUS_WORDS ? (params.status as SheetStatus) : undefined;
  // Pages of SHEET_PAGE_SIZE, 1-based in the address; anything else than a page number is the first page.
  const page = typeof params.page === 'string' && /^[1-9][0-9]{0,4}$/.test(params.page) ? Number(params.page) : 1;

  if (!current) {
    return <p className="text-slate">You are not a member of any team yet.</p>;
  }
  const offset = (page - 1) * SHEET_PAGE_SIZE;
  const { items, total } = await listSheetsByTeam({ teamId: current.id, q, sort: sortKey, descending, status, limit: SHEET_PAGE_SIZE, offset });
  const canEdit = roleAllows(current.role, 'edit');
  const pages = Math.max(1, Math.ceil(total / SHEET_PAGE_SIZE));

  const listHref = ({ sort = rawSort, toPage = 1 }: { sort?: string; toPage?: number }) => {
    const next = new URLSearchParams();
    if (q) next.set('q', q);
    if (status) next.set('status', status);
    next.set('sort', sort);
    if (toPage > 1) next.set('page', String(toPage));
    return `/sheets?${next.toString()}`;
  };
  // A new sort starts again at the first page.
  const hrefFor = (key: SheetSort) => listHref({ sort: key === sortKey && !reversed ? `-${key}` : key });

  return (
    <div className="flex flex-col gap-4">
      <div className="flex flex-wrap items-end justify-between gap-3">
        <div>
          <h1 className="text-[20px] font-semibold tracking-tight">Sheets</h1>
          <p className="text-[13px] text-slate">
            {current.name} · your role: {current.role}
          </p>
        </div>
        {canEdit ? <NewSheetForm /> : null}
      </div>

      <form role="search" className="flex flex-wrap items-center gap-2" action="/sheets">
        <label htmlFor="sheet-search" className="sr-only">
          Search sheets by title or site
        </label>
        <input
          id="sheet-search"
          name="q"
          defaultValue={q}
          placeholder="Search title or site"
          className="h-8 w-72 rounded-[3px] border border-rule bg-chalk px-2 text-[13px]"
        />
        <label htmlFor="sheet-status" className="sr-only">
          Filter by status
        </label>
        <select id="sheet-status" name="status" defaultValue={status ?? ''} className="h-8 rounded-[3px] border border-rule bg-chalk px-2 text-[13px]">
          <option value="">Any status</option>
          {Object.entries(STATUS_WORDS).map(([key, s]) => (
            <option key={key} value={key}>
              {s.word}
            </option>
          ))}
        </select>
        <input type="hidden" name="sort" value={rawSort} />
        <Button type="submit">Search</Button>
        <span className="text-[12px] text-slate">
          {total > SHEET_PAGE_SIZE && items.length > 0
            ? `${offset + 1}–${offset + items.length} of ${total} sheets`
            : `${total} ${total === 1 ? 'sheet' : 'sheets'}`}
        </span>
      </form>

      <div className="overflow-x-auto rounded-[4px] border border-rule bg-chalk">
        <table className="w-full border-collapse text-[13px]">
          <thead>
            <tr className="border-b border-rule text-left text-[12px] text-slate">
              {COLUMNS.map((c) => (
                <th
                  key={c.label}
                  scope="col"
                  className="px-3 py-2 font-medium"
                  aria-sort={c.key === sortKey ? (descending ? 'descending' : 'ascending') : undefined}
                >
                  {c.key ? (
                    <Link href={hrefFor(c.key)} className="hover:text-basalt">
                      {c.label}
                      {c.key === sortKey ? <span aria-hidden="true">{descending ? ' ↓' : ' ↑'}</span> : null}
                    </Link>
                  ) : (
                    c.label
                  )}
                </th>
              ))}
            </tr>
          </thead>
          <tbody>
            {items.length === 0 ? (
              <tr>
                <td colSpan={COLUMNS.length} className="px-3 py-6 text-center text-slate">
                  {page > pages ? (
                    <>
                      There are {pages} {pages === 1 ? 'page' : 'pages'} of sheets. <Link href={listHref({ toPage: pages })} className="text-river hover:underline">Go to the last page</Link>
                    </>
                  ) : q || status ? (
                    'No sheet matches that search.'
                  ) : (
                    'No sheets yet.'
                  )}
                </td>
              </tr>
            ) : (
              items.map((sheet) => (
                <tr key={sheet.id} className="border-b border-rule last:border-0 hover:bg-wash/60">
                  <td className="px-3 py-2 font-medium">
                    <Link href={`/sheets/${sheet.id}`} className="text-river hover:underline">
                      {sheet.title}
                    </Link>
                  </td>
                  <td className="px-3 py-2">{sheet.site ?? <span className="text-slate">—</span>}</td>
                  <td className="px-3 py-2">
                    <StatusTag status={sheet.status} />
                  </td>
                  <td className="num px-3 py-2">{sheet.revision > 0 ? `r${sheet.revision}` : <span className="text-slate">—</span>}</td>
                  <td className="num px-3 py-2 whitespace-nowrap">
                    <time dateTime={sheet.updatedAt}>{formatMinute(sheet.updatedAt)} UTC</time>
                  </td>
                  <td className="px-3 py-2">{sheet.author?.name ?? '—'}</td>
                </tr>
              ))
            )}
          </tbody>
        </table>
      </div>
      {pages > 1 ? (
        <nav aria-label="Pages of sheets" className="flex items-center justify-between gap-3 text-[13px]">
          {page > 1 ? (
            <Link href={listHref({ toPage: Math.min(page - 1, pages) })} rel="prev" className="text-river hover:underline">
              ← Previous {SHEET_PAGE_SIZE}
            </Link>
          ) : (
            <span />
          )}
          <span className="text-slate">
            Page {Math.min(page, pages)} of {pages}
          </span>
          {page < pages ? (
            <Link href={listHref({ toPage: page + 1 })} rel="next" className="text-river hover:underline">
              Next {Math.min(SHEET_PAGE_SIZE, total - page * SHEET_PAGE_SIZE)} →
            </Link>
          ) : (
            <span />
          )}
        </nav>
      ) : null}
    </div>
  );
}
