import 'server-only';
import PgBoss from 'pg-boss';
import { databaseUrl } from '@/lib/db/config';

/**
 * The one pg-boss of this process: a PostgreSQL-backed job queue in its own schema (`pgboss`) of
 * the app's database, so that every app instance shares the queue. Started once per process on
 * first use, stopped on shutdown (SIGTERM, SIGINT) or by stopJobQueue() in tests.
 */
const globalForBoss = globalThis as unknown as {
  denudataBoss?: Promise<PgBoss>;
  denudataBossShutdownHooked?: boolean;
};

export const JOB_SCHEMA = 'pgboss';

function hookShutdown(): void {
  if (globalForBoss.denudataBossShutdownHooked) return;
  globalForBoss.denudataBossShutdownHooked = true;
  const stop = () => {
    void stopJobQueue();
  };
  process.once('SIGTERM', stop);
  process.once('SIGINT', stop);
}

/** The started queue (starts it on first call; concurrent callers share the start). */
export function getJobQueue(): Promise<PgBoss> {
  if (!globalForBoss.denudataBoss) {
    const boss = new PgBoss({
      connectionString: databaseUrl(),
      schema: JOB_SCHEMA,
      max: 4,
      application_name: 'denudata-jobs',
    });
    boss.on('error', (error) => console.error('[denudata] job queue:', error.message));
    globalForBoss.denudataBoss = boss.start().then(
      () => boss,
      (error: unknown) => {
        globalForBoss.denudataBoss = undefined;
        throw error;
      },
    );
    hookShutdown();
  }
  return globalForBoss.denudataBoss;
}

/** Stops the queue of this process (waits briefly for active jobs). */
export async function stopJobQueue(): Promise<void> {
  const started = globalForBoss.denudataBoss;
  globalForBoss.denudataBoss = undefined;
  if (!started) return;
  const boss = await started.catch(() => null);
  if (boss) await boss.stop({ graceful: true, wait: true, timeout: 10_000 });
}
