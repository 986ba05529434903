import 'server-only';
import type PgBoss from 'pg-boss';
import { createPasswordReset } from '@/lib/db/password-resets';
import { deliverMail } from '@/lib/mail';
import { getOutboxMessage, markOutboxAttemptFailed, markOutboxSent } from '@/lib/mail/outbox';
import { notifyPasswordReset } from '@/lib/notifications';
import { pruneRateLimits } from '@/lib/rate-limit';
import { pruneRetiredRecords } from '@/lib/db/retention';
import { QUEUES, RATE_LIMIT_PRUNE_CRON, RETENTION_PRUNE_CRON, jobQueue } from './queue';
import { RUN_SWEEP_CRON, sweepRuns } from './run-sweeper';
import { startRunWorker } from './runs';

/** Sends one outbox message; throws (so pg-boss retries) when the SMTP server does not take it. */
export async function runMailSendJob({ outboxId }: { outboxId: string }, { final }: { final: boolean }): Promise<void> {
  const message = await getOutboxMessage({ id: outboxId });
  if (!message || message.status !== 'queued') return; // already sent, or gone: nothing to do
  try {
    await deliverMail(message);
  } catch (error) {
    const reason = error instanceof Error ? error.message : 'unknown error';
    await markOutboxAttemptFailed({ id: outboxId, error: reason, final });
    throw error;
  }
  await markOutboxSent({ id: outboxId });
}

/**
 * A password-reset request. The route only queues this job, so its answer does the same work and
 * takes the same time for every address; here the address is looked up and, when it belongs to an
 * account, a token is made and the message queued.
 */
export async function runPasswordResetJob({ email }: { email: string }): Promise<void> {
  const reset = await createPasswordReset({ email });
  if (reset) await notifyPasswordReset({ to: reset.email, token: reset.token });
}

const globalForWorkers = globalThis as unknown as { denudataWorkersStarted?: boolean };

/** Starts this process's job workers (once). Every app instance runs them; pg-boss hands each job to one. */
export async function startJobWorkers(): Promise<void> {
  if (globalForWorkers.denudataWorkersStarted) return;
  globalForWorkers.denudataWorkersStarted = true;
  const boss = await jobQueue();
  await boss.work<{ outboxId: string }>(QUEUES.mailSend.name, { pollingIntervalSeconds: 0.5, includeMetadata: true }, async (jobs: PgBoss.JobWithMetadata<{ outboxId: string }>[]) => {
    for (const job of jobs) await runMailSendJob(job.data, { final: job.retryCount >= job.retryLimit });
  });
  await boss.work<{ email: string }>(QUEUES.passwordReset.name, { pollingIntervalSeconds: 0.5 }, async (jobs) => {
    for (const job of jobs) await runPasswordResetJob(job.data);
  });
  await scheduleRateLimitPruning(boss);
  await scheduleRetentionPruning(boss);
  await scheduleRunSweeps(boss);
  await startRunWorker();
}

/** Schedules the sweep of stalled and unqueued long runs and works its jobs (every instance may; one job per minute). */
export async function scheduleRunSweeps(boss: PgBoss): Promise<void> {
  await boss.schedule(QUEUES.runSweep.name, RUN_SWEEP_CRON, {}, { tz: 'UTC' });
  await boss.work(QUEUES.runSweep.name, { pollingIntervalSeconds: 10 }, async () => {
    await sweepRuns();
  });
}

/** Schedules the pruning of ended rate-limit windows and works its jobs (every instance may; one job per slot). */
export async function scheduleRateLimitPruning(boss: PgBoss): Promise<void> {
  await boss.schedule(QUEUES.rateLimitPrune.name, RATE_LIMIT_PRUNE_CRON, {}, { tz: 'UTC' });
  await boss.work(QUEUES.rateLimitPrune.name, { pollingIntervalSeconds: 10 }, async () => {
    await pruneRateLimits();
  });
}

/** Schedules the pruning of mails and reset tokens past their retention and works its jobs (one job per hour). */
export async function scheduleRetentionPruning(boss: PgBoss): Promise<void> {
  await boss.schedule(QUEUES.retentionPrune.name, RETENTION_PRUNE_CRON, {}, { tz: 'UTC' });
  await boss.work(QUEUES.retentionPrune.name, { pollingIntervalSeconds: 10 }, async () => {
    await pruneRetiredRecords();
  });
}
