import { requireTeamRole, requireUser } from '@/lib/auth/guard';
import { createInvitation } from '@/lib/db/invitations';
import { json, notAllowed, parseWith, readJson, route } from '@/lib/http';
import { notifyInvitation } from '@/lib/notifications';
import { consumeRateLimit } from '@/lib/rate-limit';
import { teamIdSchema } from '../members/schema';
import { createInvitationSchema } from './schema';

type Context = { params: Promise<{ teamId: string }> };

export const POST = route(async (request, { params }: Context) => {
  const user = await requireUser();
  const teamId = parseWith(teamIdSchema, (await params).teamId);
  await requireTeamRole({ userId: user.id, teamId, action: 'manage_members' });
  const body = await readJson(request, createInvitationSchema);
  await consumeRateLimit(['invitationTeam', teamId]);
  const created = await createInvitation({ teamId, invitedBy: user.id, email: body.email, role: body.role });
  const mail = await notifyInvitation({ to: created.invitation.email, teamName: created.teamName, role: body.role, invitedBy: created.inviter, token: created.token });
  // When the message could not be sent, the owner gets the link to pass on by hand.
  return json({ invitation: created.invitation, mailDelivered: mail.delivered, ...(mail.delivered ? {} : { link: mail.link }) }, 201);
});

export const { GET, PUT, PATCH, DELETE } = notAllowed('POST');
