import 'server-only';
import bcrypt from 'bcryptjs';
import { UniqueConstraintError } from 'sequelize';
import { conflict } from '@/lib/errors';
import { Membership, Team, User } from '@/models';
import { recordAudit } from './audit';
import { db } from './index';

export type PublicUser = { id: string; name: string; email: string };

const BCRYPT_COST = 10;
let dummyHash: string | undefined;

export const toPublicUser = (user: User): PublicUser => ({ id: user.id, name: user.name, email: user.email });

export const normaliseEmail = (email: string) => email.trim().toLowerCase();

const TEAM_NAME_MAX = 120;

/** "{name}’s team", shortened so it fits a team name (120 characters, counted as PostgreSQL does). */
export function ownTeamName(name: string): string {
  const suffix = '’s team';
  const chars = Array.from(name.trim());
  const room = TEAM_NAME_MAX - Array.from(suffix).length;
  return `${chars.length > room ? chars.slice(0, room).join('').trimEnd() : chars.join('')}${suffix}`;
}

export async function hashPassword(password: string): Promise<string> {
  return bcrypt.hash(password, BCRYPT_COST);
}

/** Signs a person up: the user and a team of their own, which they own and which becomes current. */
export async function createUserWithTeam({
  email,
  password,
  name,
}: {
  email: string;
  password: string;
  name: string;
}): Promise<{ user: PublicUser; teamId: string }> {
  const sequelize = db();
  const address = normaliseEmail(email);
  const passwordHash = await hashPassword(password);
  try {
    return await sequelize.transaction(async (transaction) => {
      const taken = await User.findOne({ where: { email: address }, transaction });
      if (taken) throw conflict('An account with that e-mail address already exists.');
      const team = await Team.create({ name: ownTeamName(name) }, { transaction });
      const user = await User.create(
        { email: address, name: name.trim(), passwordHash, currentTeamId: team.id },
        { transaction },
      );
      await Membership.create({ teamId: team.id, userId: user.id, role: 'owner' }, { transaction });
      await recordAudit(
        { teamId: team.id, actorId: user.id, action: 'user.signed_up', subjectType: 'user', subjectId: user.id },
        transaction,
      );
      return { user: toPublicUser(user), teamId: team.id };
    });
  } catch (error) {
    if (error instanceof UniqueConstraintError) throw conflict('An account with that e-mail address already exists.');
    throw error;
  }
}

/** The user whose e-mail and password match, or null; the same answer time for both kinds of miss. */
export async function verifyCredentials({ email, password }: { email: string; password: string }): Promise<PublicUser | null> {
  db();
  const user = await User.findOne({ where: { email: normaliseEmail(email) } });
  if (!user) {
    dummyHash ??= await bcrypt.hash('no account has this password', BCRYPT_COST);
    await bcrypt.compare(password, dummyHash);
    return null;
  }
  return (await bcrypt.compare(password, user.passwordHash)) ? toPublicUser(user) : null;
}

export async function getUserById({ id }: { id: string }): Promise<PublicUser | null> {
  db();
  const user = await User.findByPk(id);
  return user ? toPublicUser(user) : null;
}

/**
 * The user behind a session, or null when the account is gone or its password changed after the session
 * began (a password reset signs out every other session).
 */
export async function getSessionUser({ id, signedInAt }: { id: string; signedInAt?: number }): Promise<PublicUser | null> {
  db();
  const user = await User.findByPk(id);
  if (!user) return null;
  if (user.passwordChangedAt && (signedInAt === undefined || signedInAt < user.passwordChangedAt.getTime())) return null;
  return toPublicUser(user);
}

export async function getUserByEmail({ email }: { email: string }): Promise<PublicUser | null> {
  db();
  const user = await User.findOne({ where: { email: normaliseEmail(email) } });
  return user ? toPublicUser(user) : null;
}

export async function setUserPassword({ userId, password }: { userId: string; password: string }): Promise<void> {
  db();
  await User.update({ passwordHash: await hashPassword(password), passwordChangedAt: new Date() }, { where: { id: userId } });
}
