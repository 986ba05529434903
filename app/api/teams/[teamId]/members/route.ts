import { requireTeamRole, requireUser } from '@/lib/auth/guard';
import { listMembersByTeam, listPendingInvitationsByTeam } from '@/lib/db/members';
import { roleAllows } from '@/lib/auth/permissions';
import { json, notAllowed, parseWith, route } from '@/lib/http';
import { teamIdSchema } from './schema';

type Context = { params: Promise<{ teamId: string }> };

export const GET = route(async (_request, { params }: Context) => {
  const user = await requireUser();
  const teamId = parseWith(teamIdSchema, (await params).teamId);
  const role = await requireTeamRole({ userId: user.id, teamId, action: 'read' });
  const members = await listMembersByTeam({ teamId });
  const invitations = roleAllows(role, 'manage_members') ? await listPendingInvitationsByTeam({ teamId }) : [];
  return json({ ...members, invitations });
});

export const { POST, PUT, PATCH, DELETE } = notAllowed('GET');
