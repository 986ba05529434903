import { requireSheetRole, requireTeamRole, requireUser } from '@/lib/auth/guard';
import { forkSheet } from '@/lib/db/forks';
import { json, notAllowed, readJson, route } from '@/lib/http';
import { forkSchema } from './schema';

type Context = { params: Promise<{ sheetId: string }> };

export const POST = route(async (request, { params }: Context) => {
  const user = await requireUser();
  const { sheetId } = await params;
  const { sheet } = await requireSheetRole({ userId: user.id, sheetId, action: 'read' });
  const body = await readJson(request, forkSchema);
  const teamId = body.teamId ?? sheet.teamId;
  await requireTeamRole({ userId: user.id, teamId, action: 'edit' });
  const forked = await forkSheet({ sourceSheetId: sheetId, teamId, userId: user.id, title: body.title, site: body.site, revision: body.revision });
  return json(forked, 201);
});

export const { GET, PUT, PATCH, DELETE } = notAllowed('POST');
