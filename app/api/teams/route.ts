import { requireSession, requireUser } from '@/lib/auth/guard';
import { createTeam } from '@/lib/db/teams';
import { json, notAllowed, readJson, route } from '@/lib/http';
import { createTeamSchema } from './schema';

// One query: the caller's teams come with the session look-up (lib/auth/session.ts), read fresh for this
// request, so a membership just granted or removed shows at once.
export const GET = route(async () => {
  const { teams: items } = await requireSession();
  return json({ items, total: items.length });
});

export const POST = route(async (request) => {
  const user = await requireUser();
  const { name } = await readJson(request, createTeamSchema);
  const team = await createTeam({ userId: user.id, name });
  return json({ team }, 201);
});

export const { PUT, PATCH, DELETE } = notAllowed('GET, POST');
