import 'server-only';
import { failStalledRuns, findOrphanedQueuedRuns } from '@/lib/db/runs';
import { enqueueRun, RUN_QUEUE } from './runs';

/**
 * Keeps long runs (CONTRACT §6b) moving when an app instance ends at the wrong moment; any instance
 * may sweep (pg-boss sends one job per minute, whichever instance takes it):
 *  - a run marked running whose heartbeat (its progress write, every half second) stopped for a minute
 *    is failed with a message saying so, so the sheet offers "Evaluate again" instead of waiting;
 *  - a run saved as queued whose job never reached the queue (the instance ended between the two) is
 *    queued again after a minute's grace. A run's start is atomic (queued → running), so a job sent
 *    twice still evaluates it once.
 */
export const RUN_SWEEP_CRON = '* * * * *';
/** Seconds without a heartbeat after which a running run counts as stalled. */
export const STALLED_AFTER_SECONDS = 60;
/** Seconds a queued run may be without a job before it is queued again. */
export const ORPHANED_AFTER_SECONDS = 60;
/** Runs queued again by one sweep at most (the rest wait for the next). */
const MAX_REQUEUED_PER_SWEEP = 50;

export async function sweepRuns(): Promise<{ failed: string[]; requeued: string[] }> {
  const failed = await failStalledRuns({ staleSeconds: STALLED_AFTER_SECONDS });
  const orphans = await findOrphanedQueuedRuns({ queue: RUN_QUEUE, graceSeconds: ORPHANED_AFTER_SECONDS, limit: MAX_REQUEUED_PER_SWEEP });
  for (const run of orphans) await enqueueRun(run);
  if (failed.length || orphans.length) {
    console.warn(`[denudata] run sweeper: ${failed.length} stalled run(s) failed, ${orphans.length} queued run(s) without a job queued again`);
  }
  return { failed, requeued: orphans.map((run) => run.id) };
}
