import 'server-only';
import { Op, type Transaction } from 'sequelize';
import { badRequest, conflict, notFound } from '@/lib/errors';
import { Invitation, Membership, Team, User, type TeamRole } from '@/models';
import { recordAudit } from './audit';
import { db } from './index';
import { toPublicUser, type PublicUser } from './users';

export type MemberItem = { user: PublicUser; role: TeamRole; joinedAt: string };
export type PendingInvitation = { id: string; email: string; role: TeamRole; invitedBy: PublicUser | null; expiresAt: string; createdAt: string };

/** Members are listed owners first, then editors, reviewers and viewers (then by name). */
export const ROLE_ORDER: Record<TeamRole, number> = { owner: 0, editor: 1, reviewer: 2, viewer: 3 };

/** A team's members (owners first, then by name). */
export async function listMembersByTeam({ teamId }: { teamId: string }): Promise<{ items: MemberItem[]; total: number }> {
  db();
  const memberships = await Membership.findAll({ where: { teamId }, include: [User] });
  const items = memberships
    .map((m) => ({
      user: toPublicUser((m as Membership & { User: User }).User),
      role: m.role,
      joinedAt: new Date(m.createdAt).toISOString(),
    }))
    .sort((a, b) => ROLE_ORDER[a.role] - ROLE_ORDER[b.role] || a.user.name.localeCompare(b.user.name));
  return { items, total: items.length };
}

/** Invitations of a team not yet accepted and not expired. */
export async function listPendingInvitationsByTeam({ teamId }: { teamId: string }): Promise<PendingInvitation[]> {
  db();
  const rows = await Invitation.findAll({
    where: { teamId, acceptedAt: null, expiresAt: { [Op.gt]: new Date() } },
    order: [['createdAt', 'DESC']],
  });
  const inviters = new Map((await User.findAll({ where: { id: [...new Set(rows.map((r) => r.invitedBy))] } })).map((u) => [u.id, toPublicUser(u)]));
  return rows.map((r) => ({
    id: r.id,
    email: r.email,
    role: r.role,
    invitedBy: inviters.get(r.invitedBy) ?? null,
    expiresAt: new Date(r.expiresAt).toISOString(),
    createdAt: new Date(r.createdAt).toISOString(),
  }));
}

/**
 * Locks the team's membership rows and counts its owners (so two demotions cannot race past the last owner).
 * The rows are locked in id order, so concurrent changes in one team queue up instead of deadlocking.
 */
async function lockedOwnerCount(teamId: string, transaction: Transaction): Promise<number> {
  const rows = await Membership.findAll({ where: { teamId }, order: [['id', 'ASC']], transaction, lock: transaction.LOCK.UPDATE });
  return rows.filter((r) => r.role === 'owner').length;
}

/** Changes a member's role; 409 when it would leave the team without an owner. */
export async function updateMemberRole({
  teamId,
  actorId,
  userId,
  role,
}: {
  teamId: string;
  actorId: string;
  userId: string;
  role: TeamRole;
}): Promise<MemberItem> {
  const sequelize = db();
  return sequelize.transaction(async (transaction) => {
    const owners = await lockedOwnerCount(teamId, transaction);
    const membership = await Membership.findOne({ where: { teamId, userId }, include: [User], transaction });
    if (!membership) throw notFound('Member');
    const before = membership.role;
    if (before === 'owner' && role !== 'owner' && owners <= 1) {
      throw conflict('A team keeps at least one owner: make someone else an owner first.', { current: { owners } });
    }
    if (before !== role) {
      await membership.update({ role }, { transaction });
      await recordAudit(
        { teamId, actorId, action: 'member.role_changed', subjectType: 'user', subjectId: userId, details: { from: before, to: role } },
        transaction,
      );
    }
    return { user: toPublicUser((membership as Membership & { User: User }).User), role, joinedAt: new Date(membership.createdAt).toISOString() };
  });
}

/** Removes a member; 409 for the last owner. */
export async function removeMember({ teamId, actorId, userId }: { teamId: string; actorId: string; userId: string }): Promise<void> {
  const sequelize = db();
  await sequelize.transaction(async (transaction) => {
    const owners = await lockedOwnerCount(teamId, transaction);
    const membership = await Membership.findOne({ where: { teamId, userId }, include: [User], transaction });
    if (!membership) throw notFound('Member');
    if (membership.role === 'owner' && owners <= 1) {
      throw conflict('A team keeps at least one owner: make someone else an owner first.', { current: { owners } });
    }
    const user = (membership as Membership & { User: User }).User;
    await membership.destroy({ transaction });
    if (user.currentTeamId === teamId) await user.update({ currentTeamId: null }, { transaction });
    await recordAudit(
      { teamId, actorId, action: 'member.removed', subjectType: 'user', subjectId: userId, details: { name: user.name, email: user.email, role: membership.role } },
      transaction,
    );
  });
}

export async function getTeamName({ teamId }: { teamId: string }): Promise<string> {
  db();
  const team = await Team.findByPk(teamId);
  if (!team) throw notFound('Team');
  return team.name;
}

export const assertRole = (role: string): TeamRole => {
  if (!(role in ROLE_ORDER)) throw badRequest('role: choose owner, editor, reviewer or viewer', 'role');
  return role as TeamRole;
};
