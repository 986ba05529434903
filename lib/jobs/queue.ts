import 'server-only';
import PgBoss from 'pg-boss';
import { databaseUrl } from '@/lib/db/config';

/**
 * The one PostgreSQL-backed job queue (pg-boss 10, in its own schema `pgboss` of the app's database),
 * shared by every app instance: a job sent by one instance may be worked by any. One queue client per
 * process, started on first use and stopped on shutdown. Queues are declared here, with their retry
 * policy, so that every sender and worker agrees on them.
 */
export const QUEUES = {
  /** Send one message of the mail outbox (retried with backoff while the SMTP server fails). */
  mailSend: { name: 'mail-send', retryLimit: 6, retryDelay: 5, retryBackoff: true },
  /** A password-reset request: look the address up and, when it has an account, queue the message. */
  passwordReset: { name: 'password-reset', retryLimit: 3, retryDelay: 5, retryBackoff: true },
  /** A long evaluation (CONTRACT §6b): never retried (a failed run is reported, not repeated). */
  evaluationRun: { name: 'evaluation-run', retryLimit: 0, retryDelay: 0, retryBackoff: false },
  /** Deletes rate-limit counters whose window has ended (scheduled, RATE_LIMIT_PRUNE_CRON). */
  rateLimitPrune: { name: 'rate-limits-prune', retryLimit: 1, retryDelay: 60, retryBackoff: false },
  /** Deletes sent mails and spent reset tokens past their retention (scheduled, RETENTION_PRUNE_CRON; lib/db/retention.ts). */
  retentionPrune: { name: 'retention-prune', retryLimit: 1, retryDelay: 60, retryBackoff: false },
  /** Fails stalled long runs and queues again runs whose job was never sent (scheduled, lib/jobs/run-sweeper.ts). */
  runSweep: { name: 'runs-sweep', retryLimit: 1, retryDelay: 30, retryBackoff: false },
} as const;

/** When the rate-limit counters are pruned: every 10 minutes (pg-boss sends one job per slot, whichever instance). */
export const RATE_LIMIT_PRUNE_CRON = '*/10 * * * *';

/** When mails and reset tokens past their retention are deleted: hourly, at 17 minutes past. */
export const RETENTION_PRUNE_CRON = '17 * * * *';

export type QueueName = (typeof QUEUES)[keyof typeof QUEUES]['name'];

const globalForQueue = globalThis as unknown as { denudataJobQueue?: Promise<PgBoss> };

async function startQueue(): Promise<PgBoss> {
  const boss = new PgBoss({ connectionString: databaseUrl(), schema: 'pgboss', max: 4, application_name: 'denudata-jobs' });
  boss.on('error', (error: Error) => console.error('[denudata] job queue:', error.message));
  await boss.start();
  for (const queue of Object.values(QUEUES)) {
    await boss.createQueue(queue.name, { name: queue.name, retryLimit: queue.retryLimit, retryDelay: queue.retryDelay, retryBackoff: queue.retryBackoff });
  }
  return boss;
}

/** The process's queue client (started once; a failed start is retried on the next call). */
export function jobQueue(): Promise<PgBoss> {
  if (!globalForQueue.denudataJobQueue) {
    globalForQueue.denudataJobQueue = startQueue().catch((error: unknown) => {
      globalForQueue.denudataJobQueue = undefined;
      throw error;
    });
  }
  return globalForQueue.denudataJobQueue;
}

/** Queues one job; resolves once it is stored in PostgreSQL. */
export async function sendJob(queue: QueueName, data: object): Promise<void> {
  const boss = await jobQueue();
  await boss.send(queue, data);
}

/** Stops the queue client of this process (tests, shutdown), letting running jobs finish. */
export async function stopJobQueue(): Promise<void> {
  const pending = globalForQueue.denudataJobQueue;
  globalForQueue.denudataJobQueue = undefined;
  if (pending) await (await pending).stop({ graceful: true, wait: true, timeout: 10_000 });
}
