import 'server-only';
import { db } from './index';

// Rows that are only kept for a while (a scheduled job, lib/jobs/workers.ts `scheduleRetentionPruning`): without
// it the mail outbox and the password-reset tokens grow with every request, for ever. Revisions, comments and the
// audit log are the record of the work and are never pruned; quick calculations are bounded per user when stored
// (lib/db/quick.ts), rate-limit counters by their own job (lib/rate-limit `pruneRateLimits`).

const DAY_MS = 24 * 60 * 60 * 1000;

/** A sent or finally failed mail is kept this long (to answer "did my invitation go out?"), a queued one always. */
export const MAIL_RETENTION_MS = 30 * DAY_MS;
/** A password-reset token is kept this long after it expired or was used (recent reset activity), then deleted. */
export const RESET_TOKEN_RETENTION_MS = DAY_MS;

export interface RetentionPruned {
  mails: number;
  resetTokens: number;
}

const rowCount = (result: unknown) => (result as { rowCount?: number } | undefined)?.rowCount ?? 0;

/** Deletes the mails and reset tokens past their retention at `now`; returns how many of each. */
export async function pruneRetiredRecords(now: Date = new Date()): Promise<RetentionPruned> {
  const sequelize = db();
  const [, mails] = await sequelize.query(
    `DELETE FROM mail_outbox WHERE status IN ('sent', 'failed') AND COALESCE(sent_at, created_at) < $1`,
    { bind: [new Date(now.getTime() - MAIL_RETENTION_MS)] },
  );
  const [, resets] = await sequelize.query(
    `DELETE FROM password_resets WHERE LEAST(expires_at, COALESCE(used_at, expires_at)) < $1`,
    { bind: [new Date(now.getTime() - RESET_TOKEN_RETENTION_MS)] },
  );
  return { mails: rowCount(mails), resetTokens: rowCount(resets) };
}
