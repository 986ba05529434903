/**
 * Writing revisions: a document validated and evaluated (or sent to a long run when over the cost limit,
 * CONTRACT §6b), saved as the sheet's next immutable revision, and whole sheets imported from a document,
 * bundle or record.
 */
import 'server-only';
import { UniqueConstraintError, type Transaction } from 'sequelize';
import { AppError, conflict, notFound } from '@/lib/errors';
import { ENGINE_VERSION, EngineError, hashSheetDocument, needsLongRun, type SheetDocument, type SheetResults } from '@/lib/engine';
import { requireValidDocument } from '@/lib/sheet/evaluation.server';
import { runEvaluate } from '@/lib/evaluation/pool';
import type { DatasetLookup } from '@/lib/engine/dataset';
import { datasetReferences } from '@/lib/datasets/references';
import { Dataset, Sheet, SheetRevision, Team } from '@/models';
import { recordAudit } from './audit';
import { checkBundleDatasets, insertBundleDatasets } from './dataset-bundles';
import { requireKnownDatasets, resolveDocumentDatasets } from './datasets';
import { db } from './index';
import { findCachedRunResults, insertRun, type RunRecord } from './runs';
import { enqueueRun } from '@/lib/jobs/runs';
import { insertSheet, toSheetRecord, type SheetRecord } from './sheets';

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
              cachedFrom: null,
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
