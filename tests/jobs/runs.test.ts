import { execFileSync } from 'node:child_process';
import { existsSync } from 'node:fs';
import path from 'node:path';
import PgBoss from 'pg-boss';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { ENGINE_VERSION, evaluateSheet, estimateEvaluationCost, hashSheetDocument, needsLongRun, SYNC_COST_LIMIT, type SheetDocument } from '@/lib/engine';
import { databaseUrl } from '@/lib/db/config';
import { QueryTypes } from 'sequelize';
import { db } from '@/lib/db';
import { getRun, insertRun } from '@/lib/db/runs';
import { deleteSheet } from '@/lib/db/sheets';
import { readRevision } from '@/lib/db/revisions';
import { saveRevision } from '@/lib/db/revision-save';
import { WORKER_FILE } from '@/lib/evaluation/pool';
import { stopJobQueue } from '@/lib/jobs/queue';
import { closeRunPool, executeRun, RUN_QUEUE, startRunWorker } from '@/lib/jobs/runs';
import { cancelSheetRun, readSheetRun, startSheetRun } from '@/lib/runs/service.server';
import { makeSheet, rejection, sampleDocument, useTeamFixture } from '../support/review-fixtures';

/** A sheet of `count` blocks, each a product of two 250×250 matrices (a fraction of a second each). */
type FixtureDocument = ReturnType<typeof sampleDocument>;

function slowDocument(count: number, title = `Slow ${Date.now()}-${Math.random()}`): FixtureDocument {
  return {
    format: 'denudata-sheet@1',
    title,
    blocks: Array.from({ length: count }, (_, i) => ({
      id: `slow-${i}`,
      name: `slow${i}`,
      type: 'formula',
      inputs: { expr: `sum(ones(250, 250) * ones(250, 250)) + ${i}` },
    })),
  } as unknown as FixtureDocument;
}

const asSheet = (document: FixtureDocument) => document as unknown as SheetDocument;

async function waitFor<T>(read: () => Promise<T>, done: (value: T) => boolean, timeoutMs = 120_000, everyMs = 200): Promise<T> {
  const started = Date.now();
  for (;;) {
    const value = await read();
    if (done(value)) return value;
    if (Date.now() - started > timeoutMs) throw new Error(`timed out waiting; last: ${JSON.stringify(value).slice(0, 200)}`);
    await new Promise((resolve) => setTimeout(resolve, everyMs));
  }
}

describe('long runs on the job queue (CONTRACT §6b)', () => {
  const team = useTeamFixture({ closePool: true });

  beforeAll(async () => {
    if (!existsSync(WORKER_FILE)) {
      execFileSync(process.execPath, [path.resolve(__dirname, '../../scripts/build-worker.mjs')], { cwd: path.resolve(__dirname, '../..') });
    }
    await startRunWorker();
  }, 120_000);

  afterAll(async () => {
    await stopJobQueue();
    await closeRunPool();
  }, 60_000);

  it('should estimate cost per block and send sheets over the synchronous limit to runs', () => {
    expect(estimateEvaluationCost(asSheet(sampleDocument()))).toBeLessThan(SYNC_COST_LIMIT);
    expect(needsLongRun(asSheet(sampleDocument()))).toBe(false);
    expect(estimateEvaluationCost(asSheet(slowDocument(12)))).toBe(12);
    // Monte Carlo: every sample counts (uncertainty settings of CONTRACT §8.2).
    const uncertain = {
      format: 'denudata-sheet@1',
      title: 'Samples',
      uncertainty: { method: 'monte_carlo', samples: 100_000, seed: 1 },
      blocks: Array.from({ length: 20 }, (_, i) => ({ id: `u${i}`, name: `u${i}`, type: 'quantities', inputs: { a: 'normal(1 m, 0.1 m)' } })),
    } as unknown as SheetDocument;
    expect(needsLongRun(uncertain)).toBe(true);
  });

  it('should run a draft: queued → running with progress → done, with results equal to a synchronous evaluation', async () => {
    const document = slowDocument(12);
    const sheet = await makeSheet(team.teamId, team.people.editor.id, document);
    const run = await startSheetRun({ sheetId: sheet.id, userId: team.people.editor.id, draftVersion: 1 });
    expect(['queued', 'running']).toContain(run.status);
    const seen: number[] = [];
    const finished = await waitFor(
      () => getRun({ runId: run.id }),
      (current) => {
        if (current.status === 'running') seen.push(current.progress);
        return current.status === 'done' || current.status === 'failed';
      },
    );
    expect(finished.status).toBe('done');
    expect(finished.progress).toBe(1);
    expect(finished.startedAt).not.toBeNull();
    // Progress was written while it ran, never going back.
    expect(seen.some((p) => p > 0 && p < 1)).toBe(true);
    expect(seen).toEqual([...seen].sort((a, b) => a - b));
    const { run: body, results } = await readSheetRun({ runId: run.id, userId: team.people.viewer.id });
    expect(body.status).toBe('done');
    // Stored as jsonb (keys reordered), equal value for value.
    expect(results).toEqual(evaluateSheet(asSheet(document)));
    // slow0 = 250 · 250 · 250 (every element of the product is 250).
    expect(results!.blocks.slow0!.outputs.value!.value).toBe(15_625_000);
  }, 180_000);

  it('should answer a run of an already evaluated document at once from the cache by hash', async () => {
    const document = sampleDocument();
    const sheet = await makeSheet(team.teamId, team.people.owner.id, document);
    const first = await startSheetRun({ sheetId: sheet.id, userId: team.people.owner.id, draftVersion: 1 });
    await waitFor(() => getRun({ runId: first.id }), (r) => r.status === 'done');
    const other = await makeSheet(team.teamId, team.people.editor.id, document);
    const second = await startSheetRun({ sheetId: other.id, userId: team.people.editor.id, draftVersion: 1 });
    expect(second.status).toBe('done');
    expect(second.progress).toBe(1);
    const a = await readSheetRun({ runId: first.id, userId: team.people.owner.id });
    const b = await readSheetRun({ runId: second.id, userId: team.people.owner.id });
    expect(b.results).toEqual(a.results);
  }, 120_000);

  it('should refer to cached results instead of copying them, answer a repeated request with the same run, and hand the results on when their holder is deleted', async () => {
    const document = { ...sampleDocument(), title: `Held once ${Date.now()}-${Math.random()}` };
    const stored = async (runId: string) => {
      const [row] = await db().query<{ has_results: boolean; results_from: string | null }>(
        'SELECT results IS NOT NULL AS has_results, results_from FROM runs WHERE id = $1',
        { bind: [runId], type: QueryTypes.SELECT },
      );
      return row;
    };
    const runsOf = async (sheetId: string) =>
      Number((await db().query<{ n: string }>('SELECT count(*) AS n FROM runs WHERE sheet_id = $1', { bind: [sheetId], type: QueryTypes.SELECT }))[0]!.n);

    const holderSheet = await makeSheet(team.teamId, team.people.owner.id, document);
    const holder = await startSheetRun({ sheetId: holderSheet.id, userId: team.people.owner.id, draftVersion: 1 });
    await waitFor(() => getRun({ runId: holder.id }), (r) => r.status === 'done');
    const expected = (await readSheetRun({ runId: holder.id, userId: team.people.owner.id })).results;
    expect(expected).toEqual(evaluateSheet(asSheet(document)));
    expect(await stored(holder.id)).toEqual({ has_results: true, results_from: null });

    // Another sheet with the same document: done at once, referring to the holder, no copy.
    const otherSheet = await makeSheet(team.teamId, team.people.editor.id, document);
    const cached = await startSheetRun({ sheetId: otherSheet.id, userId: team.people.editor.id, draftVersion: 1 });
    expect(cached.status).toBe('done');
    expect(await stored(cached.id)).toEqual({ has_results: false, results_from: holder.id });
    expect((await readSheetRun({ runId: cached.id, userId: team.people.viewer.id })).results).toEqual(expected);

    // The same request again (same sheet, draft version, document): the same run, no new row.
    for (let i = 0; i < 3; i++) {
      const again = await startSheetRun({ sheetId: otherSheet.id, userId: team.people.viewer.id, draftVersion: 1 });
      expect(again.id).toBe(cached.id);
    }
    expect(await runsOf(otherSheet.id)).toBe(1);

    // A referring run in the holder's own sheet goes with it in the same statement (no heir from there).
    const sibling = await insertRun({
      sheetId: holderSheet.id,
      requesterId: team.people.owner.id,
      draftVersion: 2,
      revisionNumber: null,
      document: asSheet(document),
      documentHash: hashSheetDocument(asSheet(document)),
      engineVersion: ENGINE_VERSION,
      cachedFrom: holder.id,
    });
    expect(await stored(sibling.id)).toEqual({ has_results: false, results_from: holder.id });

    // The holder's sheet (no revision) is deleted with its runs: the referring run elsewhere takes the results over.
    expect(await deleteSheet({ sheetId: holderSheet.id, userId: team.people.owner.id })).toBe('deleted');
    expect(await runsOf(holderSheet.id)).toBe(0);
    expect(await stored(cached.id)).toEqual({ has_results: true, results_from: null });
    expect((await readSheetRun({ runId: cached.id, userId: team.people.editor.id })).results).toEqual(expected);

    // A third sheet now refers to the new holder.
    const third = await makeSheet(team.teamId, team.people.editor.id, document);
    const fromNewHolder = await startSheetRun({ sheetId: third.id, userId: team.people.editor.id, draftVersion: 1 });
    expect(await stored(fromNewHolder.id)).toEqual({ has_results: false, results_from: cached.id });
    expect((await readSheetRun({ runId: fromNewHolder.id, userId: team.people.editor.id })).results).toEqual(expected);
  }, 120_000);

  it('should give a revision without results those of a cached run when its run is asked for again (copied in PostgreSQL)', async () => {
    // Over the cost limit: 7 uncertain quantities at 100,000 samples (as in tests/api/revision-runs.test.ts).
    const document = {
      format: 'denudata-sheet@1',
      title: `Costly ${Date.now()}-${Math.random()}`,
      uncertainty: { method: 'monte_carlo', samples: 100_000, seed: 5 },
      blocks: Array.from({ length: 7 }, (_, i) => ({ id: `u${i}`, name: `u${i}`, type: 'quantities', inputs: { a: `normal(${i + 1} m, 0.1 m)` } })),
    } as unknown as FixtureDocument;
    expect(needsLongRun(asSheet(document))).toBe(true);
    const revisionSheet = await makeSheet(team.teamId, team.people.editor.id, document);
    const saved = (await saveRevision({ sheetId: revisionSheet.id, userId: team.people.editor.id, baseRevision: 0, document, message: 'costly' })) as { run?: { id: string } };
    expect(saved.run?.id).toEqual(expect.any(String));
    await cancelSheetRun({ runId: saved.run!.id, userId: team.people.editor.id });
    expect((await readRevision({ sheetId: revisionSheet.id, number: 1 })).results).toBeNull();

    // The same document evaluated on another sheet's draft holds the results now.
    const draftSheet = await makeSheet(team.teamId, team.people.owner.id, document);
    const holder = await startSheetRun({ sheetId: draftSheet.id, userId: team.people.owner.id, draftVersion: 1 });
    await waitFor(() => getRun({ runId: holder.id }), (r) => r.status === 'done', 150_000);
    const expected = (await readSheetRun({ runId: holder.id, userId: team.people.owner.id })).results!;

    const again = await startSheetRun({ sheetId: revisionSheet.id, userId: team.people.editor.id, revision: 1 });
    expect(again.status).toBe('done');
    expect(again.revisionNumber).toBe(1);
    const [row] = await db().query<{ results_from: string | null }>('SELECT results_from FROM runs WHERE id = $1', { bind: [again.id], type: QueryTypes.SELECT });
    expect(row!.results_from).toBe(holder.id);
    expect((await readRevision({ sheetId: revisionSheet.id, number: 1 })).results).toEqual(expected);
  }, 180_000);

  it('should cancel a running run (requester or owner only) and stop its evaluation', async () => {
    const sheet = await makeSheet(team.teamId, team.people.editor.id, slowDocument(60));
    const run = await startSheetRun({ sheetId: sheet.id, userId: team.people.editor.id, draftVersion: 1 });
    await waitFor(() => getRun({ runId: run.id }), (r) => r.status === 'running');
    // A reviewer who did not start it may not cancel it; an outsider does not even see it.
    expect((await rejection(cancelSheetRun({ runId: run.id, userId: team.people.reviewer.id }))).status).toBe(403);
    expect((await rejection(cancelSheetRun({ runId: run.id, userId: team.outsider.id }))).status).toBe(404);
    expect((await rejection(readSheetRun({ runId: run.id, userId: team.outsider.id }))).status).toBe(404);
    const { run: cancelled } = await cancelSheetRun({ runId: run.id, userId: team.people.owner.id });
    expect(cancelled.status).toBe('cancelled');
    // It stays cancelled (the evaluation thread is stopped, no results are written) and a second cancel is 409.
    await new Promise((resolve) => setTimeout(resolve, 1500));
    const after = await readSheetRun({ runId: run.id, userId: team.people.editor.id });
    expect(after.run.status).toBe('cancelled');
    expect(after.results).toBeUndefined();
    expect((await rejection(cancelSheetRun({ runId: run.id, userId: team.people.editor.id }))).status).toBe(409);
  }, 180_000);

  it('should refuse a run of a draft version that is no longer current (409) and an unknown revision (404)', async () => {
    const sheet = await makeSheet(team.teamId, team.people.editor.id, sampleDocument());
    const stale = await rejection(startSheetRun({ sheetId: sheet.id, userId: team.people.editor.id, draftVersion: 7 }));
    expect(stale.status).toBe(409);
    expect(stale.toBody()).toMatchObject({ current: { version: 1 } });
    expect((await rejection(startSheetRun({ sheetId: sheet.id, userId: team.people.editor.id, revision: 3 }))).status).toBe(404);
  });

  it('should process every run exactly once with two queue workers (a second instance on the same database)', async () => {
    const second = new PgBoss({ connectionString: databaseUrl(), schema: 'pgboss', max: 2 });
    await second.start();
    const takenBySecond: string[] = [];
    await second.work<{ runId: string }>(RUN_QUEUE, { batchSize: 1, pollingIntervalSeconds: 1 }, async (jobs) => {
      for (const job of jobs) {
        takenBySecond.push(job.data.runId);
        await executeRun(job.data.runId);
      }
    });
    try {
      const runs = [];
      const roles = ['owner', 'editor', 'reviewer', 'viewer'] as const;
      for (let i = 0; i < 4; i++) {
        const person = team.people[roles[i]!];
        const sheet = await makeSheet(team.teamId, team.people.owner.id, slowDocument(2, `Two workers ${i} ${Date.now()}`));
        runs.push(await startSheetRun({ sheetId: sheet.id, userId: person.id, draftVersion: 1 }));
        if (i === 1) await new Promise((resolve) => setTimeout(resolve, 200));
      }
      const finished = await Promise.all(runs.map((run) => waitFor(() => getRun({ runId: run.id }), (r) => r.status === 'done' || r.status === 'failed')));
      expect(finished.map((r) => r.status)).toEqual(['done', 'done', 'done', 'done']);
      // Each job is delivered to one worker only.
      expect(new Set(takenBySecond).size).toBe(takenBySecond.length);
    } finally {
      await second.stop({ graceful: true, wait: true, timeout: 10_000 });
    }
  }, 240_000);
});
