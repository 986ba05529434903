// Helpers for the suites of scheduled jobs (pg-boss on the test database).
import { QueryTypes } from 'sequelize';
import { getSequelize } from '@/lib/db/sequelize';

/** The cron expression pg-boss holds for a queue's schedule, or undefined when there is none. */
export async function scheduledCron(queue: string): Promise<string | undefined> {
  const [schedule] = await getSequelize().query<{ cron: string }>('SELECT cron FROM pgboss.schedule WHERE name = $1', {
    bind: [queue],
    type: QueryTypes.SELECT,
  });
  return schedule?.cron;
}

/** Polls until `done` is true or the time is up (the caller then asserts what it waited for). */
export async function pollUntil(done: () => Promise<boolean>, timeoutMs = 30_000, everyMs = 250): Promise<void> {
  const deadline = Date.now() + timeoutMs;
  while (!(await done()) && Date.now() < deadline) await new Promise((resolve) => setTimeout(resolve, everyMs));
}
