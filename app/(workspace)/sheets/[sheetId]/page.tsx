import type { Metadata } from 'next';
import { notFound } from 'next/navigation';
import { SheetWorkspace } from '@/components/sheet/sheet-workspace';
import { requireSheetRole } from '@/lib/auth/guard';
import { requirePageUser } from '@/lib/auth/page';
import { roleAllows } from '@/lib/auth/permissions';
import { getSheetDetail, listSheetsByTeam } from '@/lib/db/sheets';
import { AppError } from '@/lib/errors';
import { clientCatalog } from '@/lib/sheet/catalog.server';
import type { SheetDocument } from '@/lib/sheet/types';

type Params = { params: Promise<{ sheetId: string }> };

async function loadSheet(sheetId: string) {
  const { user, teams } = await requirePageUser();
  try {
    const { sheet, role } = await requireSheetRole({ userId: user.id, sheetId, action: 'read' });
    const detail = await getSheetDetail({ sheetId, visibleTeamIds: teams.map((t) => t.id) });
    return { user, sheet, role, detail };
  } catch (error) {
    if (error instanceof AppError && (error.status === 404 || error.status === 403)) notFound();
    throw error;
  }
}

export async function generateMetadata({ params }: Params): Promise<Metadata> {
  const { sheetId } = await params;
  const { detail } = await loadSheet(sheetId);
  return { title: detail.sheet.title };
}

export default async function SheetPage({ params }: Params) {
  const { sheetId } = await params;
  const { sheet, role, detail } = await loadSheet(sheetId);
  const others = await listSheetsByTeam({ teamId: sheet.teamId });
  return (
    <SheetWorkspace
      key={sheetId}
      sheetId={sheetId}
      draft={{ version: detail.draft.version, document: detail.draft.document as SheetDocument }}
      head={detail.head}
      catalog={clientCatalog()}
      canEdit={roleAllows(role, 'edit')}
      role={role}
      otherSheets={others.items.filter((s) => s.id !== sheetId).map((s) => ({ id: s.id, title: s.title }))}
    />
  );
}
