import type { Metadata } from 'next';
import { notFound, redirect } from 'next/navigation';
import { cache } from 'react';
import { SheetWorkspace } from '@/components/sheet/sheet-workspace';
import { roleAllows } from '@/lib/auth/permissions';
import { getSheetPageData } from '@/lib/db/sheet-page';
import { AppError } from '@/lib/errors';
import { publishedCatalog } from '@/lib/sheet/catalog.server';
import { catalogUrl } from '@/lib/sheet/catalog-url';
import { preload } from 'react-dom';
import { requireSheetPage } from '@/lib/sheet/page-access';
import type { SheetDocument } from '@/lib/sheet/types';

type Params = { params: Promise<{ sheetId: string }>; searchParams?: Promise<Record<string, string | string[] | undefined>> };

// One load per request, shared by generateMetadata and the page; the access check is the layout's
// (requireSheetPage, cached for the request: a sheet the user may not see is a 404 there). Everything
// else the page shows comes from one query (getSheetPageData).
const loadSheet = cache(async (sheetId: string) => {
  const { user, teams, sheet, role, visibleTeamIds } = await requireSheetPage(sheetId);
  try {
    const data = await getSheetPageData({ sheetId, visibleTeamIds });
    return { user, teams, sheet, role, detail: data.detail, data };
  } catch (error) {
    if (error instanceof AppError && (error.status === 404 || error.status === 403)) notFound();
    throw error;
  }
});

export async function generateMetadata({ params }: Params): Promise<Metadata> {
  const { sheetId } = await params;
  const { detail } = await loadSheet(sheetId);
  return { title: detail.sheet.title };
}

export default async function SheetPage({ params, searchParams }: Params) {
  const { sheetId } = await params;
  const query = (await searchParams) ?? {};
  const { user, teams, sheet, role, detail, data } = await loadSheet(sheetId);
  // Viewers (and reviewers with nothing awaiting their check) open the latest approved revision, or the
  // newest one, so a draft's numbers are never read as signed ones; ?draft=1 opens the working draft.
  if (detail.head && query.draft !== '1' && (role === 'viewer' || (role === 'reviewer' && !['in_review', 'checked'].includes(detail.head.status)))) {
    redirect(`/sheets/${sheetId}/revisions/${data.approvedRevision ?? detail.head.number}`);
  }
  const { teamSheets, members, review, reviewEvents: notes, draftStanding: standing, preferences } = data;
  // The block catalog goes by its version, fetched once by the browser (and cached), not in this payload.
  const { version: catalogVersion } = publishedCatalog();
  preload(catalogUrl(catalogVersion), { as: 'fetch', crossOrigin: 'anonymous' });
  // Teams the user may fork into (editor or owner there), this sheet's team first.
  const forkTeams = teams
    .filter((t) => roleAllows(t.role, 'edit'))
    .sort((a, b) => Number(b.id === sheet.teamId) - Number(a.id === sheet.teamId))
    .map((t) => ({ id: t.id, name: t.name }));
  return (
    <SheetWorkspace
      key={sheetId}
      sheetId={sheetId}
      teamId={sheet.teamId}
      draft={{ version: detail.draft.version, document: detail.draft.document as SheetDocument }}
      head={detail.head}
      review={review}
      reviewNotes={notes.map((n) => ({ ...n, by: n.by ? { id: n.by.id, name: n.by.name } : null, reviewer: n.reviewer ? { id: n.reviewer.id, name: n.reviewer.name } : null }))}
      draftStanding={standing}
      forkedFrom={detail.forkedFrom ?? null}
      forks={detail.forks}
      forkCount={detail.forkCount}
      catalogVersion={catalogVersion}
      canEdit={roleAllows(role, 'edit')}
      role={role}
      user={{ id: user.id, name: user.name }}
      checkers={members.filter((m) => roleAllows(m.role, 'check')).map((m) => m.user)}
      members={members.map((m) => m.user)}
      preferences={preferences}
      forkTeams={forkTeams}
      otherSheets={teamSheets.filter((s) => s.id !== sheetId).map((s) => ({ id: s.id, title: s.title }))}
    />
  );
}
