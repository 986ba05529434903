import 'server-only';
import { QueryTypes } from 'sequelize';
import { badRequest } from '@/lib/errors';
import { PasswordReset, User } from '@/models';
import { recordAudit } from './audit';
import { db } from './index';
import { hashToken, newToken } from './tokens';
import { hashPassword, normaliseEmail } from './users';

export const PASSWORD_RESET_LIFETIME_MS = 60 * 60 * 1000;

/** A reset token for the account with that e-mail, or null when there is none (the caller says nothing either way). */
export async function createPasswordReset({ email }: { email: string }): Promise<{ token: string; email: string } | null> {
  db();
  const user = await User.findOne({ where: { email: normaliseEmail(email) } });
  if (!user) return null;
  const { token, tokenHash } = newToken();
  await PasswordReset.create({ userId: user.id, tokenHash, expiresAt: new Date(Date.now() + PASSWORD_RESET_LIFETIME_MS), usedAt: null });
  await recordAudit({ teamId: null, actorId: user.id, action: 'password.reset_requested', subjectType: 'user', subjectId: user.id });
  return { token, email: user.email };
}

/** True while the token can still be used (for the page; changes nothing). */
export async function isPasswordResetOpen({ token }: { token: string }): Promise<boolean> {
  db();
  const row = await PasswordReset.findOne({ where: { tokenHash: hashToken(token) } });
  return Boolean(row && !row.usedAt && new Date(row.expiresAt).getTime() > Date.now());
}

/**
 * Sets a new password with a reset token: single use (claimed by one conditional UPDATE), 1 hour.
 * 400 with a plain message for a used, expired or unknown token. Other open tokens of the user are spent too.
 */
export async function completePasswordReset({ token, password }: { token: string; password: string }): Promise<void> {
  const sequelize = db();
  const passwordHash = await hashPassword(password);
  await sequelize.transaction(async (transaction) => {
    const claimed = await sequelize.query<{ user_id: string }>(
      `UPDATE password_resets SET used_at = now()
        WHERE token_hash = :tokenHash AND used_at IS NULL AND expires_at > now() RETURNING user_id`,
      { type: QueryTypes.SELECT, replacements: { tokenHash: hashToken(token) }, transaction },
    );
    const [claim] = claimed;
    if (!claim || claimed.length !== 1) {
      throw badRequest('This link to set a new password has been used or has expired. Ask for a new one.');
    }
    const userId = claim.user_id;
    await User.update({ passwordHash, passwordChangedAt: new Date() }, { where: { id: userId }, transaction });
    await sequelize.query('UPDATE password_resets SET used_at = now() WHERE user_id = :userId AND used_at IS NULL', {
      replacements: { userId },
      transaction,
    });
    await recordAudit({ teamId: null, actorId: userId, action: 'password.reset', subjectType: 'user', subjectId: userId }, transaction);
  });
}
