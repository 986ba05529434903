import { requireUser } from '@/lib/auth/guard';
import { createTeam, listTeamsForUser } from '@/lib/db/teams';
import { json, notAllowed, readJson, route } from '@/lib/http';
import { createTeamSchema } from './schema';

export const GET = route(async () => {
  const user = await requireUser();
  const items = await listTeamsForUser({ userId: user.id });
  return json({ items, total: items.length });
});

export const POST = route(async (request) => {
  const user = await requireUser();
  const { name } = await readJson(request, createTeamSchema);
  const team = await createTeam({ userId: user.id, name });
  return json({ team }, 201);
});

export const { PUT, PATCH, DELETE } = notAllowed('GET, POST');
