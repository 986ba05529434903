import type { ReactNode } from 'react';
import { StatusTag, type SheetStatus } from '@/components/ui/status';
import type { SiteInfo } from '@/lib/sheet/types';

export interface SheetHeaderProps {
  title: string;
  site?: SiteInfo | null;
  draftVersion: number;
  head: { number: number; hash: string; status: SheetStatus } | null;
  /** Save and evaluation state, shown at the right. */
  state?: ReactNode;
  /** Buttons for the few visible actions. */
  actions?: ReactNode;
  /** Room for later additions (sign-off, fork source...). */
  children?: ReactNode;
}

/** Title, site, draft version, head revision (number, short hash, review status) and actions. */
export function SheetHeader({ title, site, draftVersion, head, state, actions, children }: SheetHeaderProps) {
  return (
    <header className="flex flex-col gap-2 border-b border-rule pb-3">
      <div className="flex flex-wrap items-start justify-between gap-3">
        <div className="min-w-0">
          <h1 className="text-[20px] font-semibold tracking-tight">{title}</h1>
          <dl className="mt-1 flex flex-wrap items-center gap-x-4 gap-y-1 text-[12px] text-slate">
            <div className="flex gap-1">
              <dt>Site</dt>
              <dd className="text-basalt">
                {site?.name ?? '—'}
                {site?.latitude !== undefined && site?.longitude !== undefined ? (
                  <span className="num text-slate">
                    {' '}
                    ({site.latitude.toFixed(4)}, {site.longitude.toFixed(4)})
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
              <dd className="num text-basalt">{head ? `r${head.number}` : 'none yet'}</dd>
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
              <dd>
                <StatusTag status={head?.status ?? 'draft'} />
              </dd>
            </div>
          </dl>
        </div>
        <div className="flex flex-wrap items-center gap-2">
          {state}
          {actions}
        </div>
      </div>
      {children}
    </header>
  );
}
