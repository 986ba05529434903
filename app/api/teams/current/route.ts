import { requireUser } from '@/lib/auth/guard';
import { listTeamsForUser, setCurrentTeam } from '@/lib/db/teams';
import { json, notAllowed, readJson, route } from '@/lib/http';
import { currentTeamSchema } from '../schema';

export const PUT = route(async (request) => {
  const user = await requireUser();
  const { teamId } = await readJson(request, currentTeamSchema);
  await setCurrentTeam({ userId: user.id, teamId });
  const items = await listTeamsForUser({ userId: user.id });
  return json({ items, total: items.length });
});

export const { GET, POST, PATCH, DELETE } = notAllowed('PUT');
