import 'server-only';
import { literal, QueryTypes } from 'sequelize';
import { conflict, notFound } from '@/lib/errors';
import type { SheetDocument, SheetResults } from '@/lib/engine';
import { SheetRevision, User, type ReviewStatus } from '@/models';
import { appendRawMembers } from '@/lib/http/json-text';
import { db } from './index';
import { latestRevisionRuns, type RunRecord } from './runs';
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

/** Revisions per page of the history when the caller does not say (the API's `limit`, the history page). */
export const REVISION_PAGE_SIZE = 100;
/** The most a caller may ask for at once: a sheet may hold any number of revisions, an answer may not. */
export const MAX_REVISION_PAGE_SIZE = 500;

/**
 * A sheet's revisions, newest first, without documents, one page at a time: `total` counts them all, `items`
 * holds at most `limit` from `offset` on (revision numbers are unique, so pages neither repeat nor skip one).
 */
export async function listRevisionsBySheet({
  sheetId,
  limit = REVISION_PAGE_SIZE,
  offset = 0,
}: {
  sheetId: string;
  limit?: number;
  offset?: number;
}): Promise<{ items: RevisionListItem[]; total: number }> {
  db();
  const [revisions, total] = await Promise.all([
    SheetRevision.findAll({
      where: { sheetId },
      attributes: { exclude: ['document', 'results'], include: [[literal('(results IS NULL)'), 'resultsPending']] },
      order: [['number', 'DESC']],
      limit: Math.min(Math.max(1, Math.trunc(limit)), MAX_REVISION_PAGE_SIZE),
      offset: Math.max(0, Math.trunc(offset)),
    }),
    SheetRevision.count({ where: { sheetId } }),
  ]);
  const items = await toListItems(sheetId, revisions);
  return { items, total };
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
 * `readRevision`'s answer as JSON text, for the API: the document and results are spliced in as PostgreSQL writes
 * them (`jsonb::text`), never parsed and serialised again in the app. A results document may be up to 16 MB:
 * parsing and writing a 26 MB JSON text took 480–550 ms of the main thread on this machine, during which every
 * other request waits, and any reader could repeat it. Measured on a revision with 0.3 MB of results (eight
 * 20,000-node profile evolutions): 9 → 5 ms of CPU, 91 → 45 ms per read. The same values as
 * `JSON.stringify(await readRevision(…))`, with the same keys in the same order.
 */
export async function readRevisionJson({ sheetId, number }: { sheetId: string; number: number }): Promise<string> {
  db();
  const revision = await SheetRevision.findOne({
    where: { sheetId, number },
    attributes: {
      exclude: ['document', 'results'],
      include: [
        [literal('(results IS NULL)'), 'resultsPending'],
        [literal('document::text'), 'documentText'],
        [literal('results::text'), 'resultsText'],
      ],
    },
  });
  if (!revision) throw notFound(`Revision ${number}`);
  const [item] = await toListItems(sheetId, [revision]);
  if (!item) throw notFound(`Revision ${number}`);
  const documentText = revision.get('documentText' as never) as unknown as string;
  const resultsText = (revision.get('resultsText' as never) as unknown as string | null) ?? 'null';
  return appendRawMembers(item, [
    ['document', documentText],
    ['results', resultsText],
  ]);
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
