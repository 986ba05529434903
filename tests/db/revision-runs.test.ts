import { execFileSync } from 'node:child_process';
import { existsSync } from 'node:fs';
import path from 'node:path';
import { QueryTypes } from 'sequelize';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { evaluateSheet, estimateEvaluationCost, needsLongRun, SYNC_COST_LIMIT, type SheetDocument } from '@/lib/engine';
import { db } from '@/lib/db';
import { getRun } from '@/lib/db/runs';
import { applyReviewAction } from '@/lib/db/review';
import { getRevision, getReviewSummary, listRevisionsBySheet, readRevision, readRevisionJson } from '@/lib/db/revisions';
import { saveRevision } from '@/lib/db/revision-save';
import { appendRawMembers } from '@/lib/http/json-text';
import { getSheetDetail } from '@/lib/db/sheet-detail';
import { WORKER_FILE } from '@/lib/evaluation/pool';
import { stopJobQueue } from '@/lib/jobs/queue';
import { closeRunPool, startRunWorker } from '@/lib/jobs/runs';
import { cancelSheetRun, readSheetRun, readSheetRunJson, startSheetRun } from '@/lib/runs/service.server';
import { makeSheet as makeFixtureSheet, rejection, useTeamFixture } from '../support/review-fixtures';

// CONTRACT §6b: a revision whose evaluation is estimated above the synchronous cost limit is saved at
// once with its document and hash; its results are stored when its long run finishes; it shows
// "evaluating" until then, and its review cannot be requested before.

/**
 * `blocks` uncertain quantities at 100,000 Monte Carlo samples: 7 blocks estimate 21,007 units (over
 * the limit of 20,000) and take a few seconds on a loaded machine. The title makes the hash unique.
 */
function costlyDocument(blocks = 7, title = `Costly ${Date.now()}-${Math.random()}`): SheetDocument {
  return {
    format: 'denudata-sheet@1',
    title,
    uncertainty: { method: 'monte_carlo', samples: 100_000, seed: 1 },
    blocks: Array.from({ length: blocks }, (_, i) => ({ id: `u${i}`, name: `u${i}`, type: 'quantities', inputs: { a: `normal(${i + 1} m, 0.1 m)` } })),
  } as unknown as SheetDocument;
}

/** The JSON text parses to the same value as the object, with the same keys in the same order at the top. */
async function expectSameJson(text: Promise<string>, value: object): Promise<void> {
  const parsed = JSON.parse(await text);
  expect(parsed).toEqual(JSON.parse(JSON.stringify(value)));
  expect(Object.keys(parsed)).toEqual(Object.keys(value));
}

/** A sheet whose draft is the given document (the fixture's helper is typed for its sample). */
const makeSheet = (teamId: string, userId: string, document: SheetDocument) =>
  makeFixtureSheet(teamId, userId, document as unknown as Parameters<typeof makeFixtureSheet>[2]);

async function waitFor<T>(read: () => Promise<T>, done: (value: T) => boolean, timeoutMs = 120_000): Promise<T> {
  const started = Date.now();
  for (;;) {
    const value = await read();
    if (done(value)) return value;
    if (Date.now() - started > timeoutMs) throw new Error(`timed out waiting; last: ${JSON.stringify(value).slice(0, 300)}`);
    await new Promise((resolve) => setTimeout(resolve, 250));
  }
}

describe('revisions over the synchronous cost limit (CONTRACT §6b)', () => {
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

  it('should save at once, show evaluating, refuse the review request, then store the run results on the revision', async () => {
    const document = costlyDocument();
    expect(estimateEvaluationCost(document)).toBeGreaterThan(SYNC_COST_LIMIT);
    const sheet = await makeSheet(team.teamId, team.people.editor.id, document);
    const saved = await saveRevision({ sheetId: sheet.id, userId: team.people.editor.id, baseRevision: 0, document, message: 'costly' });
    expect(saved).toMatchObject({ number: 1, hash: expect.stringMatching(/^[0-9a-f]{64}$/), evaluation: 'evaluating', run: { id: expect.any(String) } });

    // Saved with its document and hash, without results yet.
    const pending = await readRevision({ sheetId: sheet.id, number: 1 });
    expect(pending.hash).toBe(saved.hash);
    expect(pending.document).toEqual(document);
    expect(pending.results).toBeNull();
    expect(pending.evaluation.status).toBe('evaluating');
    expect(pending.evaluation.run?.id).toBe(saved.run!.id);
    expect(pending.review).toMatchObject({ status: 'unsigned', evaluating: true });
    // The API's text (document and results spliced in as PostgreSQL writes them) says the same, key for key.
    await expectSameJson(readRevisionJson({ sheetId: sheet.id, number: 1 }), pending);
    expect((await listRevisionsBySheet({ sheetId: sheet.id })).items[0]!.evaluation.status).toBe('evaluating');
    expect((await getSheetDetail({ sheetId: sheet.id, visibleTeamIds: [team.teamId] })).head).toMatchObject({ number: 1, evaluating: true });
    // Reports, CSV and records need the results: 409 until they are stored.
    const early = await rejection(getRevision({ sheetId: sheet.id, number: 1 }));
    expect(early.status).toBe(409);
    const request = await rejection(
      applyReviewAction({ sheetId: sheet.id, actorId: team.people.editor.id, action: 'request', revision: 1, reviewerId: team.people.reviewer.id }),
    );
    expect(request.status).toBe(409);
    expect(request.message).toMatch(/still being evaluated/);
    expect((await getReviewSummary({ sheetId: sheet.id, number: 1 })).status).toBe('unsigned');

    // The run finishes and stores its results on the revision.
    const run = await waitFor(() => getRun({ runId: saved.run!.id }), (r) => r.status === 'done' || r.status === 'failed');
    expect(run.status).toBe('done');
    const stored = await getRevision({ sheetId: sheet.id, number: 1 });
    expect(stored.evaluation).toEqual({ status: 'done', run: null });
    expect(stored.review.evaluating).toBe(false);
    // Equal to a synchronous evaluation of the same document, output for output (Monte Carlo is reproducible, §8.6).
    expect(stored.results).toEqual(evaluateSheet(document));
    expect(stored.results.blocks.u2!.outputs.a!.value).toBe(3);
    await expectSameJson(readRevisionJson({ sheetId: sheet.id, number: 1 }), await readRevision({ sheetId: sheet.id, number: 1 }));
    // The run's answer too: with its results once done.
    await expectSameJson(readSheetRunJson({ runId: run.id, userId: team.people.viewer.id }), await readSheetRun({ runId: run.id, userId: team.people.viewer.id }));
    expect(JSON.parse(await readSheetRunJson({ runId: run.id, userId: team.people.viewer.id })).results).toEqual(stored.results);
    const requested = await applyReviewAction({ sheetId: sheet.id, actorId: team.people.editor.id, action: 'request', revision: 1, reviewerId: team.people.reviewer.id });
    expect(requested.outcome.status).toBe('in_review');

    // Stored once: the database refuses to change the results again (revisions are immutable).
    await expect(
      db().query(`UPDATE sheet_revisions SET results = '{}'::jsonb WHERE sheet_id = :sheetId AND number = 1`, {
        replacements: { sheetId: sheet.id },
        type: QueryTypes.UPDATE,
      }),
    ).rejects.toThrow(/immutable/);
    await expect(
      db().query(`UPDATE sheet_revisions SET results = NULL WHERE sheet_id = :sheetId AND number = 1`, { replacements: { sheetId: sheet.id }, type: QueryTypes.UPDATE }),
    ).rejects.toThrow(/immutable/);
  }, 180_000);

  it('should store cached results at once when the same document was evaluated before', async () => {
    const document = costlyDocument();
    const first = await makeSheet(team.teamId, team.people.editor.id, document);
    const saved = await saveRevision({ sheetId: first.id, userId: team.people.editor.id, baseRevision: 0, document, message: '' });
    await waitFor(() => getRun({ runId: saved.run!.id }), (r) => r.status === 'done');
    const second = await makeSheet(team.teamId, team.people.owner.id, document);
    const again = await saveRevision({ sheetId: second.id, userId: team.people.owner.id, baseRevision: 0, document, message: '' });
    expect(again.evaluation).toBeUndefined();
    expect(again.hash).toBe(saved.hash);
    const stored = await getRevision({ sheetId: second.id, number: 1 });
    expect(stored.results).toEqual((await getRevision({ sheetId: first.id, number: 1 })).results);
  }, 180_000);

  it('should show a cancelled revision run as not evaluated, and store the results of a new run of the revision', async () => {
    const document = costlyDocument(14);
    const sheet = await makeSheet(team.teamId, team.people.editor.id, document);
    const saved = await saveRevision({ sheetId: sheet.id, userId: team.people.editor.id, baseRevision: 0, document, message: '' });
    await cancelSheetRun({ runId: saved.run!.id, userId: team.people.editor.id });
    const cancelled = await readRevision({ sheetId: sheet.id, number: 1 });
    expect(cancelled.results).toBeNull();
    // A run that is not done answers without results.
    const cancelledRun = JSON.parse(await readSheetRunJson({ runId: saved.run!.id, userId: team.people.viewer.id }));
    expect(Object.keys(cancelledRun)).toEqual(['run']);
    expect(cancelledRun.run.status).toBe('cancelled');
    expect(cancelled.evaluation).toMatchObject({ status: 'failed', run: { id: saved.run!.id, status: 'cancelled' } });
    expect(
      (await rejection(applyReviewAction({ sheetId: sheet.id, actorId: team.people.owner.id, action: 'request', revision: 1, reviewerId: team.people.reviewer.id }))).status,
    ).toBe(409);
    // Anyone who may read the sheet may start its evaluation again.
    const rerun = await startSheetRun({ sheetId: sheet.id, userId: team.people.viewer.id, revision: 1 });
    expect((await readRevision({ sheetId: sheet.id, number: 1 })).evaluation).toMatchObject({ status: 'evaluating', run: { id: rerun.id } });
    await waitFor(() => getRun({ runId: rerun.id }), (r) => r.status === 'done' || r.status === 'failed');
    const stored = await getRevision({ sheetId: sheet.id, number: 1 });
    expect(stored.results.blocks.u13!.outputs.a!.value).toBe(14);
  }, 240_000);

  it('should append members whose values are JSON texts already, to empty and non-empty objects', () => {
    expect(appendRawMembers({ a: 1, b: 'x"y' }, [['document', '{"k": [1, 2.5e-7]}'], ['results', 'null']])).toBe('{"a":1,"b":"x\\"y","document":{"k": [1, 2.5e-7]},"results":null}');
    expect(JSON.parse(appendRawMembers({}, [['results', '[]']]))).toEqual({ results: [] });
    expect(appendRawMembers({ run: { id: 'r' } }, [])).toBe('{"run":{"id":"r"}}');
    expect(appendRawMembers({}, [])).toBe('{}');
  });

  it('should estimate Monte Carlo cost from the blocks downstream of uncertain inputs, and profile_evolution samples at full grid cost', () => {
    // A heavy certain block beside a cheap uncertain one is not multiplied by the samples.
    const evolution = { id: 'e', name: 'evo', type: 'profile_evolution', inputs: { diffusivity: '1 m^2/kyr', duration: '10 kyr', vertical_offset: '2 m', half_width: '100 m', dx: '0.1 m', steps: '1000' } };
    const quantity = { id: 'q', name: 'q', type: 'quantities', inputs: { K: 'normal(1 m^2/kyr, 0.1 m^2/kyr)' } };
    const base = { format: 'denudata-sheet@1', title: 'Cost', uncertainty: { method: 'monte_carlo', samples: 10_000, seed: 1 } };
    const apart = { ...base, blocks: [quantity, evolution] } as unknown as SheetDocument;
    // 2001 nodes × 1000 steps / 10⁴ = 200.1 units for the grid; the quantity 1 + 10⁴ × 0.03.
    expect(estimateEvaluationCost(apart)).toBeCloseTo(200.1 + 1 + 10_000 * 0.03, 6);
    expect(needsLongRun(apart)).toBe(false);
    // The same grid driven by the uncertain K is run again in every sample (sampleCost): far over the limit.
    const driven = { ...base, blocks: [quantity, { ...evolution, inputs: { ...evolution.inputs, diffusivity: 'q.K' } }] } as unknown as SheetDocument;
    expect(estimateEvaluationCost(driven)).toBeCloseTo(1 + 200.1 * 2 + 10_000 * (0.03 + 200.1), 3);
    expect(needsLongRun(driven)).toBe(true);
    // Linear propagation: 2 evaluations per uncertain input.
    const linear = { ...driven, uncertainty: { method: 'linear' } } as unknown as SheetDocument;
    expect(estimateEvaluationCost(linear)).toBeCloseTo(1 + 200.1 * 2 + 2 * (0.03 + 200.1), 3);
  });
});
