import { requireSheetRole, requireUser } from '@/lib/auth/guard';
import { deleteSheet, getSheetDetail } from '@/lib/db/sheets';
import { listTeamsForUser } from '@/lib/db/teams';
import { json, notAllowed, route } from '@/lib/http';

type Context = { params: Promise<{ sheetId: string }> };

export const GET = route(async (_request, { params }: Context) => {
  const user = await requireUser();
  const { sheetId } = await params;
  await requireSheetRole({ userId: user.id, sheetId, action: 'read' });
  const teams = await listTeamsForUser({ userId: user.id });
  return json(await getSheetDetail({ sheetId, visibleTeamIds: teams.map((t) => t.id) }));
});

export const DELETE = route(async (_request, { params }: Context) => {
  const user = await requireUser();
  const { sheetId } = await params;
  await requireSheetRole({ userId: user.id, sheetId, action: 'edit' });
  const outcome = await deleteSheet({ sheetId, userId: user.id });
  return json({ outcome });
});

export const { POST, PUT, PATCH } = notAllowed('GET, DELETE');
