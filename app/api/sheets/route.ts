import { requireUser } from '@/lib/auth/guard';
import { resolveTeam } from '@/lib/auth/team';
import { listSheetsByTeam, type SheetSort } from '@/lib/db/sheet-list';
import { createSheet } from '@/lib/db/sheets';
import { json, notAllowed, readJson, readQuery, route } from '@/lib/http';
import { createSheetSchema, listSheetsQuerySchema } from './schema';

export const GET = route(async (request) => {
  const user = await requireUser();
  const query = readQuery(request, listSheetsQuerySchema);
  const { teamId } = await resolveTeam({ userId: user.id, teamId: query.team, action: 'read' });
  const sort = query.sort ?? 'updated';
  const descending = sort === 'updated' ? true : sort === '-updated' ? false : sort.startsWith('-');
  const result = await listSheetsByTeam({
    teamId,
    q: query.q,
    sort: sort.replace(/^-/, '') as SheetSort,
    descending,
    status: query.status,
    limit: query.limit,
    offset: query.offset,
  });
  return json(result);
});

export const POST = route(async (request) => {
  const user = await requireUser();
  const input = await readJson(request, createSheetSchema);
  const { teamId } = await resolveTeam({ userId: user.id, teamId: input.teamId, action: 'edit' });
  const sheet = await createSheet({ teamId, userId: user.id, title: input.title, site: input.site });
  return json({ sheet }, 201);
});

export const { PUT, PATCH, DELETE } = notAllowed('GET, POST');
