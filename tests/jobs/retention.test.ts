// Retention of the mail outbox and the password-reset tokens (lib/db/retention.ts, scheduled by
// lib/jobs/workers.ts): past their retention, sent and failed mails and spent tokens are deleted; queued mails,
// recent ones and live tokens stay; the queue holds the hourly schedule and works its job. Real PostgreSQL and
// pg-boss on the test database. The retention periods are this product's choice (DEVELOPERS.md).
import { QueryTypes } from 'sequelize';
import { afterAll, describe, expect, it } from 'vitest';
import { db } from '@/lib/db';
import { MAIL_RETENTION_MS, RESET_TOKEN_RETENTION_MS, pruneRetiredRecords } from '@/lib/db/retention';
import { createUserWithTeam } from '@/lib/db/users';
import { jobQueue, QUEUES, RETENTION_PRUNE_CRON, stopJobQueue } from '@/lib/jobs/queue';
import { scheduleRetentionPruning } from '@/lib/jobs/workers';
import { pollUntil, scheduledCron } from '../support/jobs';

afterAll(async () => {
  await stopJobQueue();
});

const DAY = 24 * 60 * 60 * 1000;
const stamp = () => `${Date.now()}-${Math.random().toString(36).slice(2)}`;

/** One outbox row as the mail worker would have left it; returns its id. */
async function mail(status: 'queued' | 'sent' | 'failed', createdAt: Date, sentAt: Date | null): Promise<string> {
  const [row] = await db().query<{ id: string }>(
    `INSERT INTO mail_outbox (recipient, subject, body, status, created_at, sent_at) VALUES ($1, 'Retention', 'text', $2, $3, $4) RETURNING id`,
    { bind: [`retention-${stamp()}@example.test`, status, createdAt, sentAt], type: QueryTypes.SELECT },
  );
  return row!.id;
}

async function token(userId: string, expiresAt: Date, usedAt: Date | null): Promise<string> {
  const hash = Buffer.from(stamp()).toString('hex').padEnd(64, '0').slice(0, 64);
  const [row] = await db().query<{ id: string }>(
    'INSERT INTO password_resets (user_id, token_hash, expires_at, used_at) VALUES ($1, $2, $3, $4) RETURNING id',
    { bind: [userId, hash, expiresAt, usedAt], type: QueryTypes.SELECT },
  );
  return row!.id;
}

async function existing(table: 'mail_outbox' | 'password_resets', ids: string[]): Promise<string[]> {
  const rows = await db().query<{ id: string }>(`SELECT id FROM ${table} WHERE id = ANY($1::uuid[])`, { bind: [ids], type: QueryTypes.SELECT });
  return rows.map((r) => r.id).sort();
}

describe('retention of mails and reset tokens', () => {
  it('should keep mails 30 days after sending or failing and reset tokens a day after expiry or use', () => {
    expect(MAIL_RETENTION_MS).toBe(30 * DAY);
    expect(RESET_TOKEN_RETENTION_MS).toBe(DAY);
  });

  it('should delete what is past retention and keep queued mails, recent mails and live or recent tokens', async () => {
    const now = new Date();
    const ago = (ms: number) => new Date(now.getTime() - ms);
    const oldSent = await mail('sent', ago(40 * DAY), ago(40 * DAY));
    const oldFailed = await mail('failed', ago(31 * DAY), null);
    const sentLate = await mail('sent', ago(40 * DAY), ago(29 * DAY)); // queued long ago, sent within 30 days
    const oldQueued = await mail('queued', ago(60 * DAY), null); // still to be sent: never pruned
    const recent = await mail('sent', ago(DAY), ago(DAY));

    const { user } = await createUserWithTeam({ email: `retention-${stamp()}@example.test`, password: 'long-enough-password', name: 'Retention' });
    const expiredLongAgo = await token(user.id, ago(2 * DAY), null);
    const usedLongAgo = await token(user.id, new Date(now.getTime() + DAY), ago(2 * DAY)); // used, though it would still be valid
    const expiredRecently = await token(user.id, ago(DAY / 2), null);
    const live = await token(user.id, new Date(now.getTime() + DAY / 24), null);

    const pruned = await pruneRetiredRecords(now);
    expect(pruned.mails).toBeGreaterThanOrEqual(2);
    expect(pruned.resetTokens).toBeGreaterThanOrEqual(2);
    expect(await existing('mail_outbox', [oldSent, oldFailed, sentLate, oldQueued, recent])).toEqual([sentLate, oldQueued, recent].sort());
    expect(await existing('password_resets', [expiredLongAgo, usedLongAgo, expiredRecently, live])).toEqual([expiredRecently, live].sort());
    // Nothing of these is left to prune at the same moment.
    expect(await pruneRetiredRecords(now)).toEqual({ mails: 0, resetTokens: 0 });
  });

  it('should schedule the pruning hourly and prune when the job runs', async () => {
    const boss = await jobQueue();
    const stale = await mail('sent', new Date(Date.now() - 45 * DAY), new Date(Date.now() - 45 * DAY));
    await boss.send(QUEUES.retentionPrune.name, {});
    await scheduleRetentionPruning(boss);
    expect(await scheduledCron(QUEUES.retentionPrune.name)).toBe(RETENTION_PRUNE_CRON);
    expect(RETENTION_PRUNE_CRON).toBe('17 * * * *');
    await pollUntil(async () => (await existing('mail_outbox', [stale])).length === 0);
    expect(await existing('mail_outbox', [stale])).toEqual([]);
  }, 40_000);
});
