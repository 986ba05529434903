import 'server-only';
import { QueryTypes } from 'sequelize';
import { AppError, badRequest, conflict, forbidden } from '@/lib/errors';
import { Invitation, Membership, Team, User, type TeamRole } from '@/models';
import { recordAudit } from './audit';
import { db } from './index';
import { hashToken, newToken } from './tokens';
import { normaliseEmail, toPublicUser, type PublicUser } from './users';

export const INVITATION_LIFETIME_MS = 7 * 24 * 60 * 60 * 1000;

/** Creates an invitation; returns the raw token once (only its SHA-256 is stored). */
export async function createInvitation({
  teamId,
  invitedBy,
  email,
  role,
}: {
  teamId: string;
  invitedBy: string;
  email: string;
  role: TeamRole;
}): Promise<{ invitation: { id: string; email: string; role: TeamRole; expiresAt: string }; token: string; teamName: string; inviter: PublicUser }> {
  const sequelize = db();
  const address = normaliseEmail(email);
  return sequelize.transaction(async (transaction) => {
    const team = await Team.findByPk(teamId, { transaction });
    const inviter = await User.findByPk(invitedBy, { transaction });
    if (!team || !inviter) throw badRequest('The team or the inviting account no longer exists.');
    const existing = await User.findOne({ where: { email: address }, transaction });
    if (existing && (await Membership.findOne({ where: { teamId, userId: existing.id }, transaction }))) {
      throw conflict(`${address} is already a member of this team.`);
    }
    const { token, tokenHash } = newToken();
    const row = await Invitation.create(
      { teamId, email: address, role, tokenHash, invitedBy, expiresAt: new Date(Date.now() + INVITATION_LIFETIME_MS), acceptedAt: null, acceptedBy: null },
      { transaction },
    );
    await recordAudit(
      { teamId, actorId: invitedBy, action: 'member.invited', subjectType: 'invitation', subjectId: row.id, details: { email: address, role } },
      transaction,
    );
    return {
      invitation: { id: row.id, email: address, role, expiresAt: new Date(row.expiresAt).toISOString() },
      token,
      teamName: team.name,
      inviter: toPublicUser(inviter),
    };
  });
}

export type InvitationPreview =
  | { state: 'open'; teamName: string; email: string; role: TeamRole; invitedBy: string; expiresAt: string; accountExists: boolean }
  | { state: 'used' | 'expired' | 'unknown' };

/** What an invitation link shows before it is accepted (no secrets; nothing changes). */
export async function getInvitationPreview({ token }: { token: string }): Promise<InvitationPreview> {
  db();
  const row = await Invitation.findOne({ where: { tokenHash: hashToken(token) } });
  if (!row) return { state: 'unknown' };
  if (row.acceptedAt) return { state: 'used' };
  if (new Date(row.expiresAt).getTime() <= Date.now()) return { state: 'expired' };
  const [team, inviter, account] = await Promise.all([Team.findByPk(row.teamId), User.findByPk(row.invitedBy), User.findOne({ where: { email: row.email } })]);
  return {
    state: 'open',
    teamName: team?.name ?? 'a team',
    email: row.email,
    role: row.role,
    invitedBy: inviter?.name ?? 'A team owner',
    expiresAt: new Date(row.expiresAt).toISOString(),
    accountExists: Boolean(account),
  };
}

/**
 * Accepts an invitation for the signed-in user, whose e-mail must be the invited one (403 otherwise).
 * Single use: the row is claimed with one conditional UPDATE, so two accepts cannot both win. 400 with a
 * plain message for a used, expired or unknown link. The team becomes the user's current team.
 */
export async function acceptInvitation({
  token,
  user,
}: {
  token: string;
  user: PublicUser;
}): Promise<{ teamId: string; teamName: string; role: TeamRole }> {
  const sequelize = db();
  const tokenHash = hashToken(token);
  return sequelize.transaction(async (transaction) => {
    const row = await Invitation.findOne({ where: { tokenHash }, transaction, lock: transaction.LOCK.UPDATE });
    if (!row) throw badRequest('This invitation link is not valid. Ask the team owner for a new one.');
    if (row.acceptedAt) throw badRequest('This invitation has already been used. Ask the team owner for a new one if you still need access.');
    if (new Date(row.expiresAt).getTime() <= Date.now()) throw badRequest('This invitation has expired. Ask the team owner for a new one.');
    if (normaliseEmail(user.email) !== row.email) {
      throw forbidden(`This invitation is for ${row.email}; you are signed in as ${user.email}. Sign in with the invited address.`);
    }
    const claimed = await sequelize.query<{ id: string }>(
      `UPDATE invitations SET accepted_at = now(), accepted_by = :userId
        WHERE id = :id AND accepted_at IS NULL AND expires_at > now() RETURNING id`,
      { type: QueryTypes.SELECT, replacements: { id: row.id, userId: user.id }, transaction },
    );
    if (claimed.length !== 1) throw new AppError('validation', 'This invitation has already been used or has expired.');
    const [membership, created] = await Membership.findOrCreate({
      where: { teamId: row.teamId, userId: user.id },
      defaults: { teamId: row.teamId, userId: user.id, role: row.role },
      transaction,
    });
    await User.update({ currentTeamId: row.teamId }, { where: { id: user.id }, transaction });
    await recordAudit(
      {
        teamId: row.teamId,
        actorId: user.id,
        action: 'member.joined',
        subjectType: 'invitation',
        subjectId: row.id,
        details: { email: row.email, role: membership.role, alreadyMember: !created },
      },
      transaction,
    );
    const team = await Team.findByPk(row.teamId, { transaction });
    return { teamId: row.teamId, teamName: team?.name ?? '', role: membership.role };
  });
}
