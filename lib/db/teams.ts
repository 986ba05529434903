import 'server-only';
import { notFound } from '@/lib/errors';
import { Membership, Team, User, type TeamRole } from '@/models';
import { recordAudit } from './audit';
import { db } from './index';

export type TeamSummary = { id: string; name: string; role: TeamRole; current: boolean };

/** The teams a user belongs to, with their role, and which one is current. */
export async function listTeamsForUser({ userId }: { userId: string }): Promise<TeamSummary[]> {
  db();
  const [user, memberships] = await Promise.all([
    User.findByPk(userId),
    Membership.findAll({ where: { userId }, include: [Team], order: [[Team, 'name', 'ASC']] }),
  ]);
  const rows = memberships.map((m) => {
    const team = (m as Membership & { Team: Team }).Team;
    return { id: team.id, name: team.name, role: m.role, current: false };
  });
  const currentId = rows.some((r) => r.id === user?.currentTeamId) ? user?.currentTeamId : rows[0]?.id;
  return rows.map((r) => ({ ...r, current: r.id === currentId }));
}

/** The user's current team: the stored one while they still belong to it, else their first. */
export async function getCurrentTeam({ userId }: { userId: string }): Promise<TeamSummary | null> {
  const teams = await listTeamsForUser({ userId });
  return teams.find((t) => t.current) ?? null;
}

export async function getMembershipRole({ userId, teamId }: { userId: string; teamId: string }): Promise<TeamRole | null> {
  db();
  const membership = await Membership.findOne({ where: { userId, teamId } });
  return membership?.role ?? null;
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
