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
  try {
    await startJobWorkers();
  } catch (error) {
    console.error('[denudata] job workers did not start:', error instanceof Error ? error.message : 'unknown error');
  }
}
