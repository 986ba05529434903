import { Button } from '@/components/ui/button';
import Link from 'next/link';
import type { ReactNode } from 'react';
import { StatusTag, type SheetStatus } from '@/components/ui/status';
import type { SiteInfo } from '@/lib/sheet/types';

export interface ForkOrigin {
  /** null (as the title) when the source belongs to a team the reader is not in. */
  sheetId: string | null;
  title: string | null;
  revision: number | null;
  visible: boolean;
}

export interface ForkItem {
  id: string;
  title: string;
  site: string | null;
  revision: number | null;
}

export interface SheetHeaderProps {
  sheetId: string;
  title: string;
  site?: SiteInfo | null;
  draftVersion: number;
  /** `evaluating`: the head revision's long run has not stored its results yet (CONTRACT §6b). */
  head: { number: number; hash: string; status: SheetStatus; evaluating?: boolean } | null;
  forkedFrom?: ForkOrigin | null;
  forks?: ForkItem[];
  /** Every fork, when more than `forks` lists. */
  forkCount?: number;
  /** Save and evaluation state, shown at the right. */
  state?: ReactNode;
  /** Buttons for the few visible actions. */
  actions?: ReactNode;
  /** Shown instead of the title and site while they are edited. */
  editor?: ReactNode;
  /** Starts editing the title and site (editors and owners only). */
  onEditTitle?: () => void;
  /** Room for later additions (sign-off...). */
  children?: ReactNode;
}

const linkClass = 'text-river underline-offset-2 hover:underline';

function Origin({ origin }: { origin: ForkOrigin }) {
  const at = origin.revision ? ` at r${origin.revision}` : ' from its draft';
  if (!origin.visible) {
    return (
      <p className="text-[12px] text-slate" data-testid="fork-origin">
        Forked{at} from a sheet of a team you are not in.
      </p>
    );
  }
  return (
    <p className="text-[12px] text-slate" data-testid="fork-origin">
      Forked from{' '}
      <Link href={`/sheets/${origin.sheetId}`} className={linkClass}>
        {origin.title}
      </Link>
      {origin.revision ? (
        <>
          {' at '}
          <Link href={`/sheets/${origin.sheetId}/revisions/${origin.revision}`} className={`num ${linkClass}`}>
            r{origin.revision}
          </Link>
        </>
      ) : (
        ' (from its draft)'
      )}
    </p>
  );
}

/** Title, site, draft version, head revision (number, short hash, review status), lineage, links and actions. */
export function SheetHeader({
  sheetId,
  title,
  site,
  draftVersion,
  head,
  forkedFrom,
  forks = [],
  forkCount = forks.length,
  state,
  actions,
  editor,
  onEditTitle,
  children,
}: SheetHeaderProps) {
  const compare =
    head && head.number > 1
      ? { href: `/sheets/${sheetId}/compare?from=${head.number - 1}&to=${head.number}`, text: `Compare r${head.number - 1} → r${head.number}` }
      : head && forkedFrom?.visible && forkedFrom.revision
        ? { href: `/sheets/${sheetId}/compare?from=${forkedFrom.sheetId}:${forkedFrom.revision}&to=${head.number}`, text: 'Compare with its origin' }
        : null;
  return (
    <header className="flex flex-col gap-2 border-b border-rule pb-3">
      <div className="flex flex-wrap items-start justify-between gap-3">
        <div className="min-w-0 flex-[1_1_18rem]">
          {editor ?? (
            <>
              <div className="flex flex-wrap items-baseline gap-2">
                <h1 className="text-[20px] font-semibold tracking-tight">{title}</h1>
                {onEditTitle ? (
                  <Button variant="link" size="inline" onClick={onEditTitle} className="text-[12px]">
                    Edit title and site
                  </Button>
                ) : null}
              </div>
              <dl className="mt-1 flex flex-wrap items-center gap-x-4 gap-y-1 text-[12px] text-slate">
                <div className="flex gap-1">
                  <dt>Site</dt>
                  <dd className="text-basalt" data-testid="sheet-site">
                    {site?.name ?? '—'}
                    {site?.latitude !== undefined || site?.longitude !== undefined ? (
                      <span className="num text-slate">
                        {' '}
                        ({site?.latitude !== undefined ? site.latitude.toFixed(4) : '—'}, {site?.longitude !== undefined ? site.longitude.toFixed(4) : '—'})
                      </span>
                    ) : null}
                  </dd>
                </div>
                <div className="flex gap-1">
                  <dt>Draft</dt>
                  <dd className="num text-basalt" data-testid="draft-version">
                    v{draftVersion}
                  </dd>
                </div>
                <div className="flex gap-1">
                  <dt>Revision</dt>
                  <dd className="num text-basalt" data-testid="head-revision">
                    {head ? (
                      <Link href={`/sheets/${sheetId}/revisions/${head.number}`} className={linkClass}>
                        r{head.number}
                      </Link>
                    ) : (
                      'none yet'
                    )}
                  </dd>
                </div>
                {head ? (
                  <div className="flex gap-1">
                    <dt>Hash</dt>
                    <dd className="num text-basalt" title={head.hash}>
                      {head.hash.slice(0, 10)}
                    </dd>
                  </div>
                ) : null}
                <div className="flex items-center gap-1">
                  <dt>Status</dt>
                  <dd className="flex items-center gap-2">
                    <StatusTag status={head?.status ?? 'draft'} />
                    {head?.evaluating ? (
                      <Link href={`/sheets/${sheetId}/revisions/${head.number}`} className="text-ochre underline-offset-2 hover:underline" data-testid="head-evaluating">
                        <span aria-hidden="true">◌ </span>r{head.number} evaluating
                      </Link>
                    ) : null}
                  </dd>
                </div>
              </dl>
              {site?.notes ? (
                <p className="mt-1 max-w-[80ch] whitespace-pre-wrap text-[12px] text-slate" data-testid="site-notes">
                  {site.notes}
                </p>
              ) : null}
            </>
          )}
        </div>
        <div className="flex flex-wrap items-center gap-2">
          {state}
          {actions}
        </div>
      </div>
      {forkedFrom ? <Origin origin={forkedFrom} /> : null}
      {forks.length ? (
        <div className="flex flex-wrap items-baseline gap-x-2 text-[12px] text-slate" data-testid="fork-list">
          <span>
            Forks ({forkCount}):
          </span>
          <ul className="flex flex-wrap gap-x-3">
            {forks.map((fork) => (
              <li key={fork.id}>
                <Link href={`/sheets/${fork.id}`} className={linkClass}>
                  {fork.title}
                </Link>
                {fork.site ? <span> · {fork.site}</span> : null}
                {fork.revision ? <span className="num"> (from r{fork.revision})</span> : null}
              </li>
            ))}
            {forkCount > forks.length ? <li>and {forkCount - forks.length} more, not listed here</li> : null}
          </ul>
        </div>
      ) : null}
      <nav aria-label="Revisions of this sheet" className="flex flex-wrap gap-x-4 gap-y-1 text-[12px]">
        <Link href={`/sheets/${sheetId}/revisions`} className={linkClass}>
          History{head ? ` (${head.number} ${head.number === 1 ? 'revision' : 'revisions'})` : ''}
        </Link>
        {compare ? (
          <Link href={compare.href} className={linkClass}>
            {compare.text}
          </Link>
        ) : null}
        {head ? (
          <a href={`/api/sheets/${sheetId}/export`} download className={linkClass}>
            Export r{head.number} (JSON)
          </a>
        ) : null}
      </nav>
      {children}
    </header>
  );
}
