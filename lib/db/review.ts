import 'server-only';
import { badRequest, conflict, forbidden, notFound } from '@/lib/errors';
import { roleAllows } from '@/lib/auth/permissions';
import { revisionRefusal, type ReviewAction } from '@/lib/auth/review-rules';
import { Membership, Sheet, SheetRevision, User, type ReviewStatus } from '@/models';
import { recordAudit } from './audit';
import { recordReviewEvent } from './review-events';
import { db } from './index';
import { toPublicUser, type PublicUser } from './users';

export type { ReviewAction } from '@/lib/auth/review-rules';

export type ReviewOutcome = {
  status: ReviewStatus;
  preparedBy: PublicUser | null;
  checkedBy: PublicUser | null;
  approvedBy: PublicUser | null;
  at: string;
};

/** Who should hear about the action, for the caller to e-mail after the commit. */
export type ReviewNotice = {
  sheet: { id: string; title: string };
  revision: number;
  action: ReviewAction;
  actor: PublicUser;
  recipients: PublicUser[];
  message?: string;
};

const STATUS_WORDS: Record<ReviewStatus, string> = {
  unsigned: 'not yet reviewed',
  in_review: 'awaiting a check',
  checked: 'checked',
  approved: 'approved',
  returned: 'returned for changes',
};

/**
 * Applies one review action to the head revision of a sheet. The caller has already checked the role's
 * general right (request_review, check, approve); here: only the head can be reviewed (409), the author
 * can neither check, return nor approve (403), the checker cannot approve (403), and each action starts
 * only from the statuses above (409; approve needs a checked revision).
 */
export async function applyReviewAction({
  sheetId,
  actorId,
  action,
  revision,
  reviewerId,
  message,
}: {
  sheetId: string;
  actorId: string;
  action: ReviewAction;
  revision: number;
  reviewerId?: string;
  message?: string;
}): Promise<{ outcome: ReviewOutcome; notice: ReviewNotice }> {
  const sequelize = db();
  return sequelize.transaction(async (transaction) => {
    const sheet = await Sheet.findByPk(sheetId, { transaction, lock: transaction.LOCK.UPDATE });
    if (!sheet) throw notFound('Sheet');
    const row = await SheetRevision.findOne({ where: { sheetId, number: revision }, transaction, lock: transaction.LOCK.UPDATE });
    if (!row) throw notFound(`Revision ${revision}`);
    if (revision !== sheet.headRevision) {
      throw conflict(`Only the newest revision (${sheet.headRevision}) can be reviewed.`, { current: { number: sheet.headRevision } });
    }
    const refusal = revisionRefusal(action, {
      actorId,
      authorId: row.authorId,
      checkedById: row.checkedBy ?? null,
      status: row.reviewStatus as ReviewStatus,
      evaluating: row.results === null,
      isHead: true,
    });
    if (refusal === 'author') {
      throw forbidden('The author of a revision cannot check, return or approve it: another person must.');
    }
    if (refusal === 'checker') {
      throw forbidden('The person who checked a revision cannot also approve it.');
    }
    if (refusal === 'evaluating') {
      // CONTRACT §6b: a revision saved over the cost limit has no results until its long run stores them.
      throw conflict(`Revision ${revision} is still being evaluated: ask for a check when its results are stored.`, {
        current: { number: revision, status: row.reviewStatus, evaluating: true },
      });
    }
    if (refusal === 'status') {
      const needs = action === 'approve' ? 'Only a checked revision can be approved' : `This revision cannot be ${action === 'request' ? 'sent for review' : action === 'check' ? 'checked' : 'returned'} now`;
      throw conflict(`${needs}: revision ${revision} is ${STATUS_WORDS[row.reviewStatus as ReviewStatus]}.`, {
        current: { number: revision, status: row.reviewStatus },
      });
    }

    const now = new Date();
    const recipients: string[] = [];
    if (action === 'request') {
      if (!reviewerId) throw badRequest('reviewerId: choose who should check this revision', 'reviewerId');
      const membership = await Membership.findOne({ where: { teamId: sheet.teamId, userId: reviewerId }, transaction });
      if (!membership || !roleAllows(membership.role, 'check')) {
        throw badRequest('reviewerId: the reviewer must be a team member who may check (owner or reviewer)', 'reviewerId');
      }
      if (reviewerId === row.authorId) {
        throw badRequest('reviewerId: the author of a revision cannot check it; choose someone else', 'reviewerId');
      }
      await row.update(
        {
          reviewStatus: 'in_review',
          reviewRequestedBy: actorId,
          reviewRequestedAt: now,
          reviewerId,
          checkedBy: null,
          checkedAt: null,
          returnedBy: null,
          returnedAt: null,
        },
        { transaction },
      );
      recipients.push(reviewerId);
    } else if (action === 'check') {
      await row.update({ reviewStatus: 'checked', checkedBy: actorId, checkedAt: now }, { transaction });
      recipients.push(row.reviewRequestedBy ?? row.authorId, row.authorId);
    } else if (action === 'return') {
      await row.update(
        { reviewStatus: 'returned', returnedBy: actorId, returnedAt: now, checkedBy: null, checkedAt: null },
        { transaction },
      );
      recipients.push(row.reviewRequestedBy ?? row.authorId, row.authorId);
    } else {
      await row.update({ reviewStatus: 'approved', approvedBy: actorId, approvedAt: now }, { transaction });
      recipients.push(row.reviewRequestedBy ?? row.authorId, row.authorId);
      if (row.checkedBy) recipients.push(row.checkedBy);
    }

    await recordReviewEvent(
      { sheetId, revision, action, actorId, reviewerId: action === 'request' ? reviewerId : null, message },
      transaction,
    );
    await recordAudit(
      {
        teamId: sheet.teamId,
        actorId,
        action: `review.${action}`,
        subjectType: 'revision',
        subjectId: `${sheetId}:${revision}`,
        details: {
          sheetId,
          title: sheet.title,
          revision,
          status: row.reviewStatus,
          ...(reviewerId && action === 'request' ? { reviewerId } : {}),
          ...(message ? { message } : {}),
        },
      },
      transaction,
    );

    const ids = [...new Set([row.authorId, row.checkedBy, row.approvedBy, actorId, ...recipients].filter((id): id is string => Boolean(id)))];
    const users = new Map((await User.findAll({ where: { id: ids }, transaction })).map((u) => [u.id, toPublicUser(u)]));
    const person = (id: string | null) => (id ? users.get(id) ?? null : null);
    return {
      outcome: {
        status: row.reviewStatus,
        preparedBy: person(row.authorId),
        checkedBy: person(row.checkedBy),
        approvedBy: person(row.approvedBy),
        at: now.toISOString(),
      },
      notice: {
        sheet: { id: sheet.id, title: sheet.title },
        revision,
        action,
        actor: person(actorId)!,
        recipients: [...new Set(recipients)].filter((id) => id !== actorId).map(person).filter((p): p is PublicUser => p !== null),
        ...(message ? { message } : {}),
      },
    };
  });
}
