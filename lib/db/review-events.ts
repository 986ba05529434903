import 'server-only';
import { QueryTypes, type Transaction } from 'sequelize';
import { db } from './index';
import type { PublicUser } from './users';

export type ReviewEventAction = 'request' | 'check' | 'return' | 'approve';

/** One review action with its note: who, when, on which revision. */
export type ReviewEvent = {
  id: string;
  revision: number;
  action: ReviewEventAction;
  by: PublicUser | null;
  reviewer: PublicUser | null;
  message: string;
  at: string;
};

/** The most events read for one sheet (newest kept). */
export const MAX_REVIEW_EVENTS = 500;

/** Appends one review event inside the review action's transaction. */
export async function recordReviewEvent(
  {
    sheetId,
    revision,
    action,
    actorId,
    reviewerId,
    message,
  }: { sheetId: string; revision: number; action: ReviewEventAction; actorId: string; reviewerId?: string | null; message?: string },
  transaction: Transaction,
): Promise<void> {
  await db().query(
    `INSERT INTO review_events (sheet_id, revision, action, actor_id, reviewer_id, message)
     VALUES (:sheetId, :revision, :action, :actorId, :reviewerId, :message)`,
    {
      type: QueryTypes.INSERT,
      replacements: { sheetId, revision, action, actorId, reviewerId: reviewerId ?? null, message: (message ?? '').slice(0, 2000) },
      transaction,
    },
  );
}

type Row = {
  id: string;
  revision: number;
  action: ReviewEventAction;
  message: string;
  created_at: Date;
  actor_id: string | null;
  actor_name: string | null;
  actor_email: string | null;
  reviewer_id: string | null;
  reviewer_name: string | null;
  reviewer_email: string | null;
};

/** Review events of a sheet (or of one revision, or of some revisions), oldest first; at most the newest MAX_REVIEW_EVENTS. */
export async function listReviewEvents({ sheetId, revision, revisions }: { sheetId: string; revision?: number; revisions?: number[] }): Promise<ReviewEvent[]> {
  if (revisions && revisions.length === 0) return [];
  const rows = await db().query<Row>(
    `SELECT * FROM (
       SELECT e.id, e.revision, e.action, e.message, e.created_at,
              a.id AS actor_id, a.name AS actor_name, a.email AS actor_email,
              r.id AS reviewer_id, r.name AS reviewer_name, r.email AS reviewer_email
         FROM review_events e
         LEFT JOIN users a ON a.id = e.actor_id
         LEFT JOIN users r ON r.id = e.reviewer_id
        WHERE e.sheet_id = :sheetId ${revision === undefined ? '' : 'AND e.revision = :revision'} ${revisions ? 'AND e.revision IN (:revisions)' : ''}
        ORDER BY e.created_at DESC, e.id DESC
        LIMIT :limit) newest
     ORDER BY created_at, id`,
    { type: QueryTypes.SELECT, replacements: { sheetId, revision: revision ?? null, revisions: revisions ?? null, limit: MAX_REVIEW_EVENTS } },
  );
  return rows.map((r) => ({
    id: String(r.id),
    revision: r.revision,
    action: r.action,
    by: r.actor_id ? { id: r.actor_id, name: r.actor_name!, email: r.actor_email! } : null,
    reviewer: r.reviewer_id ? { id: r.reviewer_id, name: r.reviewer_name!, email: r.reviewer_email! } : null,
    message: r.message,
    at: new Date(r.created_at).toISOString(),
  }));
}
