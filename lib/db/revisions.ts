import 'server-only';
import { literal, QueryTypes, UniqueConstraintError, type Transaction } from 'sequelize';
import { AppError, conflict, notFound } from '@/lib/errors';
import { ENGINE_VERSION, EngineError, hashSheetDocument, needsLongRun, type SheetDocument, type SheetResults } from '@/lib/engine';
import { requireValidDocument } from '@/lib/sheet/evaluation.server';
import { runEvaluate } from '@/lib/evaluation/pool';
import type { DatasetLookup } from '@/lib/engine/dataset';
import { datasetReferences } from '@/lib/datasets/references';
import { Dataset, Sheet, SheetRevision, Team, User, type ReviewStatus } from '@/models';
import { recordAudit } from './audit';
import { checkBundleDatasets, insertBundleDatasets, requireKnownDatasets, resolveDocumentDatasets } from './datasets';
import { db } from './index';
import { findCachedRunResults, insertRun, latestRevisionRuns, type RunRecord } from './runs';
import { enqueueRun } from '@/lib/jobs/runs';
import { insertSheet, toSheetRecord, type SheetRecord } from './sheets';
import { toPublicUser, type PublicUser } from './users';

export type ReviewSummary = {
  status: ReviewStatus;
  /** True while the revision's results are not stored (its long run evaluates it): no review request yet. */
  evaluating: boolean;
  preparedBy: PublicUser | null;
  preparedAt: string;
  requestedBy: PublicUser | null;
  requestedAt: string | null;
  reviewer: PublicUser | null;
  checkedBy: PublicUser | null;
  checkedAt: string | null;
  approvedBy: PublicUser | null;
  approvedAt: string | null;
  returnedBy: PublicUser | null;
  returnedAt: string | null;
};

/**
 * Whether a revision's results are stored (CONTRACT §6b): `done`; `evaluating` while its long run is
 * queued or running; `failed` when its last run failed or was cancelled (a new run may be started).
 */
export type RevisionEvaluation = {
  status: 'done' | 'evaluating' | 'failed';
  /** The revision's newest long run, while its results are not stored. */
  run: { id: string; status: RunRecord['status']; progress: number; error?: string } | null;
};

export type RevisionListItem = {
  number: number;
  hash: string;
  engineVersion: string;
  author: PublicUser | null;
  message: string;
  createdAt: string;
  review: ReviewSummary;
  evaluation: RevisionEvaluation;
};

/** A revision with its stored results (getRevision: 409 while they are not stored yet). */
export type RevisionDetail = RevisionListItem & { document: SheetDocument; results: SheetResults };
/** A revision in any state: `results` is null while its long run evaluates it. */
export type RevisionState = RevisionListItem & { document: SheetDocument; results: SheetResults | null };

async function usersById(ids: (string | null)[]): Promise<Map<string, PublicUser>> {
  const unique = [...new Set(ids.filter((id): id is string => Boolean(id)))];
  if (!unique.length) return new Map();
  const users = await User.findAll({ where: { id: unique } });
  return new Map(users.map((u) => [u.id, toPublicUser(u)]));
}

const iso = (date: Date | null) => (date ? new Date(date).toISOString() : null);

function reviewOf(revision: SheetRevision, people: Map<string, PublicUser>, pending: boolean): ReviewSummary {
  const person = (id: string | null) => (id ? people.get(id) ?? null : null);
  return {
    status: revision.reviewStatus,
    evaluating: pending,
    preparedBy: person(revision.authorId),
    preparedAt: new Date(revision.createdAt).toISOString(),
    requestedBy: person(revision.reviewRequestedBy),
    requestedAt: iso(revision.reviewRequestedAt),
    reviewer: person(revision.reviewerId),
    checkedBy: person(revision.checkedBy),
    checkedAt: iso(revision.checkedAt),
    approvedBy: person(revision.approvedBy),
    approvedAt: iso(revision.approvedAt),
    returnedBy: person(revision.returnedBy),
    returnedAt: iso(revision.returnedAt),
  };
}

const peopleOf = (r: SheetRevision) => [r.authorId, r.reviewRequestedBy, r.reviewerId, r.checkedBy, r.approvedBy, r.returnedBy];

/** Whether a loaded revision row still waits for its results (the list reads a computed flag instead). */
const isPending = (r: SheetRevision): boolean => {
  const flag = r.get('resultsPending' as never) as unknown;
  return typeof flag === 'boolean' ? flag : r.get('results') === null;
};

async function toListItems(sheetId: string, revisions: SheetRevision[]): Promise<RevisionListItem[]> {
  const pending = revisions.filter(isPending).map((r) => r.number);
  const [people, runs] = await Promise.all([usersById(revisions.flatMap(peopleOf)), latestRevisionRuns({ sheetId, numbers: pending })]);
  return revisions.map((r) => {
    const waiting = isPending(r);
    const run = waiting ? runs.get(r.number) ?? null : null;
    return {
      number: r.number,
      hash: r.hash,
      engineVersion: r.engineVersion,
      author: people.get(r.authorId) ?? null,
      message: r.message,
      createdAt: new Date(r.createdAt).toISOString(),
      review: reviewOf(r, people, waiting),
      evaluation: {
        status: !waiting ? 'done' : run && (run.status === 'queued' || run.status === 'running' || run.status === 'done') ? 'evaluating' : 'failed',
        run: run ? { id: run.id, status: run.status, progress: run.progress, ...(run.error ? { error: run.error } : {}) } : null,
      },
    };
  });
}

/** Every revision of a sheet, newest first, without documents. */
export async function listRevisionsBySheet({ sheetId }: { sheetId: string }): Promise<{ items: RevisionListItem[]; total: number }> {
  db();
  const revisions = await SheetRevision.findAll({
    where: { sheetId },
    attributes: { exclude: ['document', 'results'], include: [[literal('(results IS NULL)'), 'resultsPending']] },
    order: [['number', 'DESC']],
  });
  const items = await toListItems(sheetId, revisions);
  return { items, total: items.length };
}

/**
 * One revision with its document, in any state: `results` is null while its long run evaluates it.
 * 404 when the sheet has no such revision.
 */
export async function readRevision({ sheetId, number }: { sheetId: string; number: number }): Promise<RevisionState> {
  db();
  const revision = await SheetRevision.findOne({ where: { sheetId, number } });
  if (!revision) throw notFound(`Revision ${number}`);
  const [item] = await toListItems(sheetId, [revision]);
  if (!item) throw notFound(`Revision ${number}`);
  return { ...item, document: revision.document as SheetDocument, results: (revision.results as SheetResults | null) ?? null };
}

/**
 * One revision with its document and stored results; 404 when the sheet has no such revision, 409 while
 * its results are not stored yet (reports, CSV and records need them).
 */
export async function getRevision({ sheetId, number }: { sheetId: string; number: number }): Promise<RevisionDetail> {
  return requireStoredResults(await readRevision({ sheetId, number }));
}

/** The revision with its results, or 409 while its long run has not stored them. */
export function requireStoredResults(revision: RevisionState): RevisionDetail {
  if (revision.results === null) {
    const words = revision.evaluation.status === 'evaluating' ? 'is still being evaluated (a long run)' : 'has no results: its evaluation did not finish';
    throw conflict(`Revision ${revision.number} ${words}; its results are stored when its run finishes.`, {
      current: { number: revision.number, evaluation: revision.evaluation },
    });
  }
  return revision as RevisionDetail;
}

/** The review state of one revision (for the review bar). */
export async function getReviewSummary({ sheetId, number }: { sheetId: string; number: number }): Promise<ReviewSummary> {
  return (await readRevision({ sheetId, number })).review;
}

/** Whether a sheet has a revision of that number (a cheap check for pages, before anything streams). */
export async function revisionExists({ sheetId, number }: { sheetId: string; number: number }): Promise<boolean> {
  if (!Number.isSafeInteger(number) || number < 1 || number > 2_147_483_647) return false;
  const [row] = await db().query('SELECT 1 FROM sheet_revisions WHERE sheet_id = $1 AND number = $2', {
    bind: [sheetId, number],
    type: QueryTypes.SELECT,
  });
  return row !== undefined;
}

type Evaluated = { document: SheetDocument; hash: string; results: SheetResults; engineVersion: string };
/** A revision to write: `results` null when a long run will store them (CONTRACT §6b). */
type ToStore = Omit<Evaluated, 'results'> & { results: SheetResults | null };

/**
 * Validates and evaluates a document through the worker pool (outside any transaction), with the
 * datasets it refers to.
 */
export async function evaluateForRevision(input: unknown, userId?: string, datasets?: DatasetLookup): Promise<Evaluated> {
  const document = requireValidDocument(input);
  let results: SheetResults;
  try {
    results = await runEvaluate(document, userId ? { userId } : undefined, datasets);
  } catch (error) {
    if (error instanceof EngineError) {
      throw new AppError(error.code === 'limit_exceeded' ? 'limit_exceeded' : 'validation', `document: ${error.message}`);
    }
    throw error;
  }
  const hash = hashSheetDocument(document);
  return { document, hash, results, engineVersion: results.engine };
}

/**
 * Inside a revision's transaction: holds the team's row in share mode (a dataset delete takes it for
 * update, so the two are ordered) and checks that the team still holds every dataset the document refers
 * to: 400 unknown_dataset otherwise, since a revision must be reproducible.
 */
async function requireTeamDatasets({ teamId, document }: { teamId: string; document: unknown }, transaction: Transaction): Promise<void> {
  const hashes = datasetReferences(document);
  if (!hashes.length) return;
  await Team.findByPk(teamId, { transaction, lock: transaction.LOCK.SHARE, attributes: ['id'] });
  const held = await Dataset.findAll({ where: { teamId, sha256: hashes }, attributes: ['sha256'], transaction });
  const present = new Set(held.map((d) => d.sha256));
  requireKnownDatasets(hashes.filter((h) => !present.has(h)));
}

/** Writes revision n+1 inside a transaction that holds the sheet's row lock. */
async function insertRevision(
  {
    sheet,
    userId,
    baseRevision,
    evaluated,
    message,
  }: { sheet: Sheet; userId: string; baseRevision: number; evaluated: ToStore; message: string },
  transaction: Transaction,
): Promise<{ number: number; hash: string }> {
  if (sheet.archivedAt !== null) {
    throw conflict('This sheet is archived: no revision can be saved to it. Fork it to keep working on it.', {
      current: { number: sheet.headRevision, archived: true },
    });
  }
  if (sheet.headRevision !== baseRevision) {
    throw conflict(`Revision ${sheet.headRevision} was saved since you started from revision ${baseRevision}.`, {
      current: { number: sheet.headRevision },
    });
  }
  const number = baseRevision + 1;
  await SheetRevision.create(
    {
      sheetId: sheet.id,
      number,
      document: evaluated.document,
      hash: evaluated.hash,
      engineVersion: evaluated.engineVersion,
      results: evaluated.results,
      authorId: userId,
      message,
      reviewRequestedBy: null,
      reviewRequestedAt: null,
      reviewerId: null,
      checkedBy: null,
      checkedAt: null,
      approvedBy: null,
      approvedAt: null,
      returnedBy: null,
      returnedAt: null,
    },
    { transaction },
  );
  await sheet.update({ headRevision: number, updatedBy: userId }, { transaction });
  await recordAudit(
    {
      teamId: sheet.teamId,
      actorId: userId,
      action: 'revision.saved',
      subjectType: 'sheet',
      subjectId: sheet.id,
      details: { revision: number, hash: evaluated.hash, message, title: sheet.title },
    },
    transaction,
  );
  return { number, hash: evaluated.hash };
}

/**
 * Saves a new revision if `baseRevision` is still the head (0 for the first); otherwise 409 with the
 * current head and nothing written. Race-safe: the sheet's row is locked for the check and the write,
 * and the unique (sheet_id, number) constraint backs it up. A new revision starts unsigned.
 */
export async function saveRevision({
  sheetId,
  userId,
  baseRevision,
  document,
  message,
}: {
  sheetId: string;
  userId: string;
  baseRevision: number;
  document: unknown;
  message: string;
}): Promise<{ number: number; hash: string; evaluation?: 'evaluating'; run?: { id: string; status: RunRecord['status']; progress: number } }> {
  const owner = await Sheet.findByPk(sheetId, { attributes: ['id', 'teamId'] });
  if (!owner) throw notFound('Sheet');
  const valid = requireValidDocument(document);
  const { lookup, missing } = await resolveDocumentDatasets({ teamId: owner.teamId, document: valid });
  requireKnownDatasets(missing);
  // Over the synchronous cost limit (CONTRACT §6b): saved at once with its document and hash; a long run
  // stores its results when it finishes (at once when the same document was evaluated before).
  let evaluated: ToStore;
  let longRun = false;
  if (needsLongRun(valid, { datasetRows: (sha256) => lookup.get(sha256)?.rows.length })) {
    const hash = hashSheetDocument(valid);
    const cached = await findCachedRunResults({ documentHash: hash, engineVersion: ENGINE_VERSION });
    evaluated = { document: valid, hash, results: cached, engineVersion: ENGINE_VERSION };
    longRun = cached === null;
  } else {
    evaluated = await evaluateForRevision(valid, userId, lookup);
  }
  const sequelize = db();
  try {
    const { saved, run } = await sequelize.transaction(async (transaction) => {
      await requireTeamDatasets({ teamId: owner.teamId, document: evaluated.document }, transaction);
      const sheet = await Sheet.findByPk(sheetId, { transaction, lock: transaction.LOCK.UPDATE });
      if (!sheet) throw notFound('Sheet');
      const saved = await insertRevision({ sheet, userId, baseRevision, evaluated, message }, transaction);
      const run = longRun
        ? await insertRun(
            {
              sheetId,
              requesterId: userId,
              draftVersion: null,
              revisionNumber: saved.number,
              document: evaluated.document,
              documentHash: evaluated.hash,
              engineVersion: evaluated.engineVersion,
              cachedResults: null,
            },
            transaction,
          )
        : null;
      return { saved, run };
    });
    if (!run) return saved;
    await enqueueRun(run);
    return { ...saved, evaluation: 'evaluating', run: { id: run.id, status: run.status, progress: run.progress } };
  } catch (error) {
    if (error instanceof UniqueConstraintError) {
      const current = await Sheet.findByPk(sheetId);
      throw conflict('Another revision was saved at the same moment.', { current: { number: current?.headRevision ?? 0 } });
    }
    throw error;
  }
}

/**
 * A new sheet in the team whose draft and revision 1 hold the document exactly as imported. A bundle's
 * datasets (checked and re-hashed first) are created in the team in the same transaction (idempotent);
 * every dataset the document refers to must then be held by the team (400 unknown_dataset otherwise).
 */
export async function importSheet({
  teamId,
  userId,
  document,
  datasets = [],
  message = 'Imported from a file',
}: {
  teamId: string;
  userId: string;
  document: unknown;
  datasets?: { sha256: string; name: string; description?: string; kind: string; canonical: unknown }[];
  message?: string;
}): Promise<{ sheet: SheetRecord; revision: { number: number; hash: string }; results: SheetResults }> {
  const valid = requireValidDocument(document);
  // The bundle's datasets are checked and re-hashed before anything runs (400 naming datasets[i]).
  const items = checkBundleDatasets(datasets);
  const { lookup: held } = await resolveDocumentDatasets({ teamId, document: valid });
  const lookup = new Map(held);
  for (const item of items) if (!lookup.has(item.sha256)) lookup.set(item.sha256, item.dataset);
  requireKnownDatasets(datasetReferences(valid).filter((h) => !lookup.has(h)));
  const evaluated = await evaluateForRevision(valid, userId, lookup);
  const sequelize = db();
  return sequelize.transaction(async (transaction) => {
    await insertBundleDatasets({ teamId, userId, items }, transaction);
    await requireTeamDatasets({ teamId, document: evaluated.document }, transaction);
    const sheet = await insertSheet(
      { teamId, userId, document: evaluated.document, audit: { action: 'sheet.imported' } },
      transaction,
    );
    const revision = await insertRevision(
      { sheet, userId, baseRevision: 0, evaluated, message },
      transaction,
    );
    return { sheet: toSheetRecord(sheet), revision, results: evaluated.results };
  });
}
