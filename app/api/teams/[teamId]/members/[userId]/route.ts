import { requireTeamRole, requireUser } from '@/lib/auth/guard';
import { removeMember, updateMemberRole } from '@/lib/db/members';
import { json, notAllowed, parseWith, readJson, route, uuidParam } from '@/lib/http';
import { teamIdSchema, updateMemberSchema } from '../schema';

type Context = { params: Promise<{ teamId: string; userId: string }> };

export const PATCH = route(async (request, { params }: Context) => {
  const user = await requireUser();
  const raw = await params;
  const teamId = parseWith(teamIdSchema, raw.teamId);
  await requireTeamRole({ userId: user.id, teamId, action: 'manage_members' });
  const userId = parseWith(uuidParam, raw.userId);
  const { role } = await readJson(request, updateMemberSchema);
  return json({ member: await updateMemberRole({ teamId, actorId: user.id, userId, role }) });
});

export const DELETE = route(async (_request, { params }: Context) => {
  const user = await requireUser();
  const raw = await params;
  const teamId = parseWith(teamIdSchema, raw.teamId);
  await requireTeamRole({ userId: user.id, teamId, action: 'manage_members' });
  const userId = parseWith(uuidParam, raw.userId);
  await removeMember({ teamId, actorId: user.id, userId });
  return json({ removed: userId });
});

export const { GET, POST, PUT } = notAllowed('PATCH, DELETE');
