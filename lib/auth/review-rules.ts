import type { ReviewStatus, TeamRole } from '@/models';
import { roleAllows, type TeamAction } from './permissions';

// The sign-off rules in one place (CONTRACT §5 roles, common practice of independent checking), used by the
// server (lib/db/review.ts, the review route) and by the review bar and the palette, which only shape their
// buttons with them: the server checks again. Pure and client-safe (type-only imports).

export const REVIEW_ACTIONS = ['request', 'check', 'return', 'approve'] as const;
export type ReviewAction = (typeof REVIEW_ACTIONS)[number];

/** The team right each review action needs (the permissions table). */
export const REVIEW_RIGHT: Record<ReviewAction, TeamAction> = { request: 'request_review', check: 'check', return: 'check', approve: 'approve' };

/** Which statuses each action may start from. */
export const REVIEW_FROM: Record<ReviewAction, readonly ReviewStatus[]> = {
  request: ['unsigned', 'returned'],
  check: ['in_review'],
  return: ['in_review', 'checked'],
  approve: ['checked'],
};

/** Why an action is refused, in the order the server checks: role, head, author, checker, evaluating, status. */
export type ReviewRefusal = 'role' | 'not_head' | 'author' | 'checker' | 'evaluating' | 'status';

/** The revision's side of the rules (the server checks the role separately, through REVIEW_RIGHT). */
export interface RevisionSituation {
  actorId: string;
  /** The revision's author (who prepared it). */
  authorId: string | null;
  /** Who checked it, if anyone. */
  checkedById: string | null;
  status: ReviewStatus;
  /** Its results are not stored yet (a long run evaluates it, CONTRACT §6b): no check can be asked for. */
  evaluating?: boolean;
  isHead: boolean;
}

export interface ReviewSituation extends RevisionSituation {
  role: TeamRole;
}

/** Null when the revision allows the actor the action now, else the first rule it breaks (role not considered). */
export function revisionRefusal(action: ReviewAction, s: RevisionSituation): Exclude<ReviewRefusal, 'role'> | null {
  if (!s.isHead) return 'not_head';
  if (action !== 'request' && s.authorId !== null && s.authorId === s.actorId) return 'author';
  if (action === 'approve' && s.checkedById !== null && s.checkedById === s.actorId) return 'checker';
  if (action === 'request' && s.evaluating) return 'evaluating';
  if (!REVIEW_FROM[action].includes(s.status)) return 'status';
  return null;
}

/** Null when the actor may take the action now, else the first rule it breaks. */
export function reviewRefusal(action: ReviewAction, s: ReviewSituation): ReviewRefusal | null {
  if (!roleAllows(s.role, REVIEW_RIGHT[action])) return 'role';
  return revisionRefusal(action, s);
}

/** The review actions the actor may take now. */
export function allowedReviewActions(s: ReviewSituation): ReviewAction[] {
  return REVIEW_ACTIONS.filter((action) => reviewRefusal(action, s) === null);
}
