import 'server-only';
import { getServerSession } from 'next-auth';
import { forbidden, notFound, unauthenticated } from '@/lib/errors';
import { getSessionUser, type PublicUser } from '@/lib/db/users';
import { getMembershipRole } from '@/lib/db/teams';
import { findSheetRecord, type SheetRecord } from '@/lib/db/sheets';
import type { TeamRole } from '@/models';
import { authOptions } from './options';
import { roleAllows, type TeamAction } from './permissions';

/**
 * The signed-in user, or a 401. The user is re-read so a deleted account, or a session older than the
 * account's last password change, loses access at once.
 */
export async function requireUser(): Promise<PublicUser> {
  const session = await getServerSession(authOptions);
  const id = session?.user?.id;
  if (!id) throw unauthenticated();
  const user = await getSessionUser({ id, signedInAt: session.signedInAt });
  if (!user) throw unauthenticated();
  return user;
}

/** The user's role in a team if it allows the action: 404 when not a member, 403 when the role forbids. */
export async function requireTeamRole({
  userId,
  teamId,
  action,
}: {
  userId: string;
  teamId: string;
  action: TeamAction;
}): Promise<TeamRole> {
  const role = await getMembershipRole({ userId, teamId });
  if (!role) throw notFound('Team');
  if (!roleAllows(role, action)) throw forbidden();
  return role;
}

/** A sheet the user may act on: another team's sheet is 404, a forbidden action 403. */
export async function requireSheetRole({
  userId,
  sheetId,
  action,
}: {
  userId: string;
  sheetId: string;
  action: TeamAction;
}): Promise<{ sheet: SheetRecord; role: TeamRole }> {
  const sheet = await findSheetRecord({ sheetId });
  if (!sheet) throw notFound('Sheet');
  const role = await getMembershipRole({ userId, teamId: sheet.teamId });
  if (!role) throw notFound('Sheet');
  if (!roleAllows(role, action)) throw forbidden();
  return { sheet, role };
}
