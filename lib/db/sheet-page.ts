import 'server-only';
import { notFound } from '@/lib/errors';
import type { ReviewStatus, TeamRole } from '@/models';
import { draftStandingOf, type DraftStanding } from '@/lib/sheet/draft-standing.server';
import { DEFAULT_SHEET_PREFERENCES, type SheetPreferences } from '@/lib/sheet/preferences';
import { isUuid } from './ids';
import { db } from './index';
import { plainSelect } from './plain-select';
import { ROLE_ORDER, type MemberItem } from './members';
import { MAX_REVIEW_EVENTS, type ReviewEvent, type ReviewEventAction } from './review-events';
import type { ReviewSummary } from './revisions';
import { DETAIL_FROM, DETAIL_SELECT, detailOfRow, type DetailRow, type SheetDetail } from './sheet-detail';
import type { PublicUser } from './users';

/**
 * Everything the sheet page reads about its sheet, in one query (it took nine: the detail, the team's
 * sheets, its members, the head's review summary (two), its review events, the last approved revision,
 * the preferences). Each part equals what its own function answers (getSheetDetail, listSheetsByTeam's
 * default order, listMembersByTeam, getReviewSummary, listReviewEvents, getDraftStanding,
 * latestApprovedRevision, getSheetPreferences; tests/db/sheet-page.test.ts compares them on real data).
 */
export type SheetPageData = {
  detail: SheetDetail;
  /** The team's sheets that are not archived, newest change first (ids and titles: the page's switcher): the
   * MAX_TEAM_SHEETS most recently updated (the palette's "Open sheet" commands; the index lists them all). */
  teamSheets: { id: string; title: string }[];
  /** The team's members, owners first, then by name (listMembersByTeam's order). */
  members: Omit<MemberItem, 'joinedAt'>[];
  /** The head revision's review state, or null without a revision. */
  review: ReviewSummary | null;
  /** The head revision's review events, oldest first (at most MAX_REVIEW_EVENTS, the newest). */
  reviewEvents: ReviewEvent[];
  /** The newest approved revision's number, or null. */
  approvedRevision: number | null;
  draftStanding: DraftStanding;
  preferences: SheetPreferences;
};

type PersonJson = { id: string; name: string; email: string };
type PageRow = DetailRow & {
  team_sheets: { id: string; title: string }[];
  members: { role: TeamRole; id: string; name: string; email: string }[];
  head_author_id: string | null;
  head_created_at: Date | null;
  head_review_requested_by: string | null;
  head_review_requested_at: Date | null;
  head_reviewer_id: string | null;
  head_checked_by: string | null;
  head_checked_at: Date | null;
  head_approved_by: string | null;
  head_approved_at: Date | null;
  head_returned_by: string | null;
  head_returned_at: Date | null;
  head_people: PersonJson[];
  review_events: {
    id: string;
    revision: number;
    action: ReviewEventAction;
    message: string;
    /** The timestamp as PostgreSQL's text, parsed below as a timestamptz column is. */
    created_at: string;
    actor: PersonJson | null;
    reviewer: PersonJson | null;
  }[];
  approved: { number: number; hash: string } | null;
  preferences: { significantFigures: number; siFolded: boolean } | null;
  /** SHA-256 of the stored draft's jsonb text: the key of the draft's document hash (draftStandingOf). */
  draft_digest: string;
};

/** At most this many of the team's sheets come with a sheet page (a team may hold any number). */
export const MAX_TEAM_SHEETS = 200;

const PAGE_SELECT = `${DETAIL_SELECT},
            coalesce((SELECT json_agg(json_build_object('id', o.id, 'title', o.title) ORDER BY o.updated_at DESC, o.id)
                        FROM (SELECT o.id, o.title, o.updated_at
                                FROM sheets o
                               WHERE o.team_id = s.team_id AND o.archived_at IS NULL
                               ORDER BY o.updated_at DESC, o.id
                               LIMIT ${MAX_TEAM_SHEETS}) o), '[]'::json) AS team_sheets,
            coalesce((SELECT json_agg(json_build_object('role', m.role, 'id', mu.id, 'name', mu.name, 'email', mu.email) ORDER BY m.id)
                        FROM memberships m JOIN users mu ON mu.id = m.user_id
                       WHERE m.team_id = s.team_id), '[]'::json) AS members,
            h.author_id AS head_author_id, h.created_at AS head_created_at,
            h.review_requested_by AS head_review_requested_by, h.review_requested_at AS head_review_requested_at,
            h.reviewer_id AS head_reviewer_id, h.checked_by AS head_checked_by, h.checked_at AS head_checked_at,
            h.approved_by AS head_approved_by, h.approved_at AS head_approved_at,
            h.returned_by AS head_returned_by, h.returned_at AS head_returned_at,
            coalesce((SELECT json_agg(json_build_object('id', p.id, 'name', p.name, 'email', p.email))
                        FROM users p
                       WHERE p.id IN (h.author_id, h.review_requested_by, h.reviewer_id, h.checked_by, h.approved_by, h.returned_by)), '[]'::json) AS head_people,
            coalesce((SELECT json_agg(json_build_object(
                               'id', e.id::text, 'revision', e.revision, 'action', e.action, 'message', e.message, 'created_at', e.created_at::text,
                               'actor', CASE WHEN a.id IS NULL THEN NULL ELSE json_build_object('id', a.id, 'name', a.name, 'email', a.email) END,
                               'reviewer', CASE WHEN r.id IS NULL THEN NULL ELSE json_build_object('id', r.id, 'name', r.name, 'email', r.email) END)
                             ORDER BY e.created_at, e.id)
                        FROM (SELECT * FROM review_events
                               WHERE sheet_id = s.id AND revision = h.number
                               ORDER BY created_at DESC, id DESC
                               LIMIT ${MAX_REVIEW_EVENTS}) e
                        LEFT JOIN users a ON a.id = e.actor_id
                        LEFT JOIN users r ON r.id = e.reviewer_id), '[]'::json) AS review_events,
            (SELECT json_build_object('number', v.number, 'hash', v.hash)
               FROM sheet_revisions v
              WHERE v.sheet_id = s.id AND v.review_status = 'approved'
              ORDER BY v.number DESC
              LIMIT 1) AS approved,
            encode(sha256(convert_to(s.draft_document::text, 'UTF8')), 'hex') AS draft_digest,
            (SELECT json_build_object('significantFigures', sp.significant_figures, 'siFolded', sp.si_folded)
               FROM sheet_preferences sp
              WHERE sp.sheet_id = s.id) AS preferences`;

const iso = (date: Date | string | null) => (date === null ? null : new Date(date).toISOString());

/** The head revision's review state from the row's head columns (getReviewSummary's answer). */
function reviewOfRow(row: PageRow): ReviewSummary | null {
  if (row.head_number === null) return null;
  const people = new Map(row.head_people.map((p) => [p.id, { id: p.id, name: p.name, email: p.email } satisfies PublicUser]));
  const person = (id: string | null) => (id ? people.get(id) ?? null : null);
  return {
    status: row.head_status as ReviewStatus,
    evaluating: row.head_evaluating === true,
    preparedBy: person(row.head_author_id),
    preparedAt: iso(row.head_created_at)!,
    requestedBy: person(row.head_review_requested_by),
    requestedAt: iso(row.head_review_requested_at),
    reviewer: person(row.head_reviewer_id),
    checkedBy: person(row.head_checked_by),
    checkedAt: iso(row.head_checked_at),
    approvedBy: person(row.head_approved_by),
    approvedAt: iso(row.head_approved_at),
    returnedBy: person(row.head_returned_by),
    returnedAt: iso(row.head_returned_at),
  };
}

/** The sheet page's data (see SheetPageData); 404 when there is no such sheet. */
export async function getSheetPageData({ sheetId, visibleTeamIds }: { sheetId: string; visibleTeamIds: string[] }): Promise<SheetPageData> {
  if (!isUuid(sheetId)) throw notFound('Sheet');
  const sequelize = db();
  const [row] = await plainSelect<PageRow>(`${PAGE_SELECT}
       ${DETAIL_FROM}`, [sheetId, visibleTeamIds.filter(isUuid)]);
  if (!row) throw notFound('Sheet');
  const detail = detailOfRow(row, visibleTeamIds);
  // The events' times went through json as text: parsed by the connection's own timestamptz parser, so
  // they are the same Date a timestamptz column gives (listReviewEvents reads them as a column).
  const parseTimestamp = (sequelize.connectionManager as unknown as { getTypeParser(oid: number): (text: string) => Date | string }).getTypeParser(1184);
  const person = (p: PersonJson | null): PublicUser | null => (p ? { id: p.id, name: p.name, email: p.email } : null);
  const members = row.members
    .map((m) => ({ user: { id: m.id, name: m.name, email: m.email }, role: m.role }))
    .sort((a, b) => ROLE_ORDER[a.role] - ROLE_ORDER[b.role] || a.user.name.localeCompare(b.user.name));
  const approved = row.approved ? { number: row.approved.number, hash: row.approved.hash } : null;
  return {
    detail,
    teamSheets: row.team_sheets.map((t) => ({ id: t.id, title: t.title })),
    members,
    review: reviewOfRow(row),
    reviewEvents: row.review_events.map((e) => ({
      id: String(e.id),
      revision: e.revision,
      action: e.action,
      by: person(e.actor),
      reviewer: person(e.reviewer),
      message: e.message,
      at: new Date(parseTimestamp(e.created_at)).toISOString(),
    })),
    approvedRevision: approved?.number ?? null,
    draftStanding: draftStandingOf(detail.draft.document, detail.head, approved, row.draft_digest),
    preferences: row.preferences
      ? { significantFigures: row.preferences.significantFigures, siFolded: row.preferences.siFolded }
      : { ...DEFAULT_SHEET_PREFERENCES },
  };
}
