import 'server-only';
import { QueryTypes } from 'sequelize';
import { notFound } from '@/lib/errors';
import { Membership, Team, User, type TeamRole } from '@/models';
import { recordAudit } from './audit';
import { isUuid } from './ids';
import { db } from './index';
import { plainSelect } from './plain-select';
import type { PublicUser } from './users';

export type TeamSummary = { id: string; name: string; role: TeamRole; current: boolean };

type UserTeamRow = {
  id: string;
  name: string;
  email: string;
  current_team_id: string | null;
  password_changed_at: Date | null;
  team_id: string | null;
  team_name: string | null;
  role: TeamRole | null;
};

/** One query: the user and each of their memberships with the team's name, teams by name. */
async function userWithTeams(userId: string): Promise<UserTeamRow[]> {
  if (!isUuid(userId)) return [];
  return plainSelect<UserTeamRow>(
    `SELECT u.id, u.name, u.email, u.current_team_id, u.password_changed_at, t.id AS team_id, t.name AS team_name, m.role
       FROM users u
       LEFT JOIN memberships m ON m.user_id = u.id
       LEFT JOIN teams t ON t.id = m.team_id
      WHERE u.id = $1
      ORDER BY t.name ASC, t.id ASC`,
    [userId],
  );
}

function teamsOf(rows: UserTeamRow[]): TeamSummary[] {
  const teams = rows
    .filter((r) => r.team_id !== null && r.role !== null)
    .map((r) => ({ id: r.team_id!, name: r.team_name!, role: r.role!, current: false }));
  const stored = rows[0]?.current_team_id;
  const currentId = teams.some((t) => t.id === stored) ? stored : teams[0]?.id;
  return teams.map((t) => ({ ...t, current: t.id === currentId }));
}

/** The teams a user belongs to, with their role, and which one is current. */
export async function listTeamsForUser({ userId }: { userId: string }): Promise<TeamSummary[]> {
  return teamsOf(await userWithTeams(userId));
}

/** What a request needs to know about its caller: the user, their teams and the current one. */
export type SessionContext = { user: PublicUser; teams: TeamSummary[]; current: TeamSummary | null };

/**
 * The user behind a session with their teams, in one query; null when the account is gone or its
 * password changed after the session began (as getSessionUser).
 */
export async function loadSessionContext({ id, signedInAt }: { id: string; signedInAt?: number }): Promise<SessionContext | null> {
  const rows = await userWithTeams(id);
  const row = rows[0];
  if (!row) return null;
  if (row.password_changed_at && (signedInAt === undefined || signedInAt < row.password_changed_at.getTime())) return null;
  const teams = teamsOf(rows);
  return { user: { id: row.id, name: row.name, email: row.email }, teams, current: teams.find((t) => t.current) ?? null };
}

/** The user's current team: the stored one while they still belong to it, else their first. */
export async function getCurrentTeam({ userId }: { userId: string }): Promise<TeamSummary | null> {
  const teams = await listTeamsForUser({ userId });
  return teams.find((t) => t.current) ?? null;
}

export async function getMembershipRole({ userId, teamId }: { userId: string; teamId: string }): Promise<TeamRole | null> {
  if (!isUuid(userId) || !isUuid(teamId)) return null;
  const [row] = await db().query<{ role: TeamRole }>('SELECT role FROM memberships WHERE user_id = $1 AND team_id = $2', {
    bind: [userId, teamId],
    type: QueryTypes.SELECT,
  });
  return row?.role ?? null;
}

export async function createTeam({ userId, name }: { userId: string; name: string }): Promise<TeamSummary> {
  const sequelize = db();
  return sequelize.transaction(async (transaction) => {
    const team = await Team.create({ name: name.trim() }, { transaction });
    await Membership.create({ teamId: team.id, userId, role: 'owner' }, { transaction });
    await recordAudit({ teamId: team.id, actorId: userId, action: 'team.created', subjectType: 'team', subjectId: team.id }, transaction);
    return { id: team.id, name: team.name, role: 'owner' as const, current: false };
  });
}

export async function setCurrentTeam({ userId, teamId }: { userId: string; teamId: string }): Promise<void> {
  const role = await getMembershipRole({ userId, teamId });
  if (!role) throw notFound('Team');
  const sequelize = db();
  await sequelize.transaction(async (transaction) => {
    await User.update({ currentTeamId: teamId }, { where: { id: userId }, transaction });
    // A choice of the person, not of the team: kept out of the team's activity (no team id).
    await recordAudit({ teamId: null, actorId: userId, action: 'user.current_team_set', subjectType: 'team', subjectId: teamId }, transaction);
  });
}
