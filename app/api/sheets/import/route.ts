import { requireUser } from '@/lib/auth/guard';
import { resolveTeam } from '@/lib/auth/team';
import { importSheet } from '@/lib/db/revisions';
import { json, readJson, route } from '@/lib/http';
import { importSchema } from './schema';

export const POST = route(async (request) => {
  const user = await requireUser();
  const body = await readJson(request, importSchema);
  const { teamId } = await resolveTeam({ userId: user.id, teamId: body.teamId, action: 'edit' });
  const { sheet, revision } = await importSheet({ teamId, userId: user.id, document: body.document });
  return json({ sheet, revision }, 201);
});
