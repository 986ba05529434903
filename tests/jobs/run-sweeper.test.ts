import { execFileSync } from 'node:child_process';
import { existsSync } from 'node:fs';
import path from 'node:path';
import { QueryTypes } from 'sequelize';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { ENGINE_VERSION, hashSheetDocument, type SheetDocument } from '@/lib/engine';
import { db } from '@/lib/db';
import { getRun, insertRun, recordRunProgress, STALLED_RUN_MESSAGE, type RunRecord } from '@/lib/db/runs';
import { WORKER_FILE } from '@/lib/evaluation/pool';
import { jobQueue, stopJobQueue } from '@/lib/jobs/queue';
import { sweepRuns } from '@/lib/jobs/run-sweeper';
import { closeRunPool, RUN_QUEUE } from '@/lib/jobs/runs';
import { makeSheet, sampleDocument, useTeamFixture } from '../support/review-fixtures';

// The run sweeper (CONTRACT §6b long runs; issue 8 "nothing that matters lives only in one process"):
// runs left behind by an instance that ended at the wrong moment are failed (stalled heartbeat) or
// queued again (saved, but the job never sent). Real PostgreSQL and the real pg-boss queue.

async function waitFor<T>(read: () => Promise<T>, done: (value: T) => boolean, timeoutMs = 120_000): Promise<T> {
  const started = Date.now();
  for (;;) {
    const value = await read();
    if (done(value)) return value;
    if (Date.now() - started > timeoutMs) throw new Error(`timed out waiting; last: ${JSON.stringify(value).slice(0, 200)}`);
    await new Promise((resolve) => setTimeout(resolve, 200));
  }
}

/** Sets a run's state and times as an instance that ended would have left them. */
async function age(runId: string, set: string): Promise<void> {
  await db().query(`UPDATE runs SET ${set} WHERE id = :runId`, { replacements: { runId }, type: QueryTypes.UPDATE });
}

async function jobsOf(runId: string): Promise<number> {
  const rows = await db().query<{ n: string }>(
    `SELECT count(*) AS n FROM pgboss.job WHERE name = :queue AND data->>'runId' = :runId`,
    { replacements: { queue: RUN_QUEUE, runId }, type: QueryTypes.SELECT },
  );
  return Number(rows[0]!.n);
}

describe('the run sweeper', () => {
  const team = useTeamFixture({ closePool: true });
  let sheetId = '';
  const newRun = async (): Promise<RunRecord> => {
    // A distinct document per run, so no run is answered from another's cache.
    const document = { ...(sampleDocument() as unknown as SheetDocument), title: `Sweep ${Math.random()}` };
    return insertRun({
      sheetId,
      requesterId: team.people.editor.id,
      draftVersion: 1,
      revisionNumber: null,
      document,
      documentHash: hashSheetDocument(document),
      engineVersion: ENGINE_VERSION,
      cachedFrom: null,
    });
  };

  beforeAll(async () => {
    if (!existsSync(WORKER_FILE)) {
      execFileSync(process.execPath, [path.resolve(__dirname, '../../scripts/build-worker.mjs')], { cwd: path.resolve(__dirname, '../..') });
    }
    await jobQueue(); // creates pg-boss's schema; no worker runs until the sweeper queues a job
    sheetId = (await makeSheet(team.teamId, team.people.editor.id)).id;
  }, 120_000);

  afterAll(async () => {
    await stopJobQueue();
    await closeRunPool();
  }, 60_000);

  it('should fail a running run whose heartbeat stopped, leave a live one running, and queue again only a queued run without a job', async () => {
    const stalled = await newRun();
    await age(stalled.id, `status = 'running', started_at = now() - interval '5 minutes', heartbeat_at = now() - interval '2 minutes'`);
    const live = await newRun();
    await age(live.id, `status = 'running', started_at = now() - interval '5 minutes', heartbeat_at = now() - interval '2 minutes'`);
    // Its instance is alive: the progress write (every half second while it runs) is its heartbeat.
    expect(await recordRunProgress({ runId: live.id, progress: 0.5 })).toBe(true);
    const orphan = await newRun();
    await age(orphan.id, `created_at = now() - interval '3 minutes'`);
    const young = await newRun(); // queued a moment ago: its instance may be about to send the job
    const waiting = await newRun(); // queued long ago, but its job is on the queue (a busy queue, not a lost job)
    await age(waiting.id, `created_at = now() - interval '3 minutes'`);
    await (await jobQueue()).send(RUN_QUEUE, { runId: waiting.id }, { startAfter: 3600 });

    const swept = await sweepRuns();

    expect(swept.failed).toContain(stalled.id);
    expect(swept.failed).not.toContain(live.id);
    expect(swept.requeued).toContain(orphan.id);
    expect(swept.requeued).not.toContain(young.id);
    expect(swept.requeued).not.toContain(waiting.id);
    const failed = await getRun({ runId: stalled.id });
    expect(failed.status).toBe('failed');
    expect(failed.error).toBe(STALLED_RUN_MESSAGE);
    expect((await getRun({ runId: live.id })).status).toBe('running');
    expect(await jobsOf(waiting.id)).toBe(1);
    // The orphan's new job is worked like any other: the run ends done.
    const done = await waitFor(() => getRun({ runId: orphan.id }), (run) => run.status === 'done' || run.status === 'failed');
    expect(done.status).toBe('done');
    expect(await jobsOf(orphan.id)).toBe(1);
    // Leave no run behind that a later sweep would act on (the live run would stall, the young one orphan).
    for (const run of [live, young]) await age(run.id, `status = 'cancelled', finished_at = now()`);
  }, 180_000);

  it('should queue nothing again on the next sweep once every queued run has its job', async () => {
    const again = await sweepRuns();
    expect(again.requeued).toEqual([]);
    expect(again.failed).toEqual([]);
  }, 60_000);
});
