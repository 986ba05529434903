// Runs once when a server instance starts:
//  - the method guard: TRACE, TRACK and CONNECT answered 405 before Next.js sees them (lib/http/method-guard.ts);
//  - the job workers (mail outbox, password-reset requests) start with it, so every instance works the shared
//    PostgreSQL queue. DENUDATA_JOB_WORKERS=off leaves them out.
export async function register(): Promise<void> {
  if (process.env.NEXT_RUNTIME !== 'nodejs') return;
  const { installMethodGuard } = await import('./lib/http/method-guard');
  installMethodGuard();
  if (process.env.DENUDATA_JOB_WORKERS === 'off') return;
  const { startJobWorkers } = await import('./lib/jobs/workers');
  const starting = startJobWorkers().then(
    () => 'started' as const,
    (error: unknown) => {
      console.error('[denudata] job workers did not start:', error instanceof Error ? error.message : 'unknown error');
      return 'failed' as const;
    },
  );
  // The server does not serve until this returns: wait for the workers a bounded time only, so a slow queue
  // (a lock held by another instance starting at the same moment) delays the jobs, never the whole instance.
  let timer: NodeJS.Timeout | undefined;
  const waited = await Promise.race([starting, new Promise<'slow'>((resolve) => (timer = setTimeout(() => resolve('slow'), WORKER_START_WAIT_MS)))]);
  clearTimeout(timer);
  if (waited === 'slow') console.warn(`[denudata] job workers still starting after ${WORKER_START_WAIT_MS / 1000} s; serving meanwhile`);
}

const WORKER_START_WAIT_MS = 15_000;
