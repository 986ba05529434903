import 'server-only';
import { forbidden, notFound, unauthenticated } from '@/lib/errors';
import type { PublicUser } from '@/lib/db/users';
import { getMembershipRole } from '@/lib/db/teams';
import { findSheetRecord, type SheetRecord } from '@/lib/db/sheets';
import type { TeamRole } from '@/models';
import { roleAllows, type TeamAction } from './permissions';
import { getSessionContext, sessionLookedUp, type SessionContext } from './session';

/**
 * The signed-in user with their teams, or a 401. The user is re-read (once per request) so a deleted
 * account, or a session older than the account's last password change, loses access at once.
 */
export async function requireSession(): Promise<SessionContext> {
  const context = await getSessionContext();
  if (!context) throw unauthenticated();
  return context;
}

/** The signed-in user, or a 401 (see requireSession). */
export async function requireUser(): Promise<PublicUser> {
  return (await requireSession()).user;
}

/** The user's role in a team: from this request's session look-up when it is the caller, else a query. */
async function membershipRole(userId: string, teamId: string): Promise<TeamRole | null> {
  const context = await sessionLookedUp()?.catch(() => null);
  if (context && context.user.id === userId) return context.teams.find((t) => t.id === teamId)?.role ?? null;
  return getMembershipRole({ userId, teamId });
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
  const role = await membershipRole(userId, teamId);
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
  const role = await membershipRole(userId, sheet.teamId);
  if (!role) throw notFound('Sheet');
  if (!roleAllows(role, action)) throw forbidden();
  return { sheet, role };
}
