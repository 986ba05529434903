import { requireSession, requireSheetRole, requireUser } from '@/lib/auth/guard';
import { roleAllows } from '@/lib/auth/permissions';
import { getSheetDetail } from '@/lib/db/sheet-detail';
import { deleteSheet } from '@/lib/db/sheets';
import { forbidden, notFound } from '@/lib/errors';
import { json, notAllowed, route } from '@/lib/http';

type Context = { params: Promise<{ sheetId: string }> };

// Two queries: the caller with their teams, then the sheet with everything shown; the sheet's team is
// checked against the caller's memberships before anything is answered (another team's sheet is 404).
export const GET = route(async (_request, { params }: Context) => {
  const { teams } = await requireSession();
  const { sheetId } = await params;
  const detail = await getSheetDetail({ sheetId, visibleTeamIds: teams.map((t) => t.id) });
  const role = teams.find((t) => t.id === detail.sheet.teamId)?.role;
  if (!role) throw notFound('Sheet');
  if (!roleAllows(role, 'read')) throw forbidden();
  return json(detail);
});

export const DELETE = route(async (_request, { params }: Context) => {
  const user = await requireUser();
  const { sheetId } = await params;
  await requireSheetRole({ userId: user.id, sheetId, action: 'edit' });
  const outcome = await deleteSheet({ sheetId, userId: user.id });
  return json({ outcome });
});

export const { POST, PUT, PATCH } = notAllowed('GET, DELETE');
