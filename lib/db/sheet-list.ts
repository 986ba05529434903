import 'server-only';
import { QueryTypes } from 'sequelize';
import type { ReviewStatus } from '@/models';
import { db } from './index';
import type { PublicUser } from './users';

export type SheetListItem = {
  id: string;
  title: string;
  site: string | null;
  revision: number;
  status: ReviewStatus | 'draft';
  updatedAt: string;
  author: PublicUser | null;
};

export type SheetSort = 'updated' | 'title' | 'site' | 'revision' | 'status';

const SORT_SQL: Record<SheetSort, string> = {
  updated: 's.updated_at',
  title: 'lower(s.title)',
  site: 'lower(coalesce(s.site_name, \'\'))',
  revision: 's.head_revision',
  status: "coalesce(r.review_status::text, 'draft')",
};

/** Sheets per page of the list when the caller does not say (the API's `limit`, the index page). */
export const SHEET_PAGE_SIZE = 100;
/** The most a caller may ask for at once: a team may hold any number of sheets, an answer may not. */
export const MAX_SHEET_PAGE_SIZE = 200;

/**
 * A team's visible sheets (archived ones left out), searchable by title and site, sortable, one page at a
 * time: `total` counts every match, `items` holds at most `limit` of them from `offset` on (the order ends
 * with the id, so pages neither repeat nor skip a sheet while nothing changes).
 */
export async function listSheetsByTeam({
  teamId,
  q,
  sort = 'updated',
  descending,
  status,
  limit = SHEET_PAGE_SIZE,
  offset = 0,
}: {
  teamId: string;
  q?: string;
  sort?: SheetSort;
  descending?: boolean;
  status?: ReviewStatus | 'draft';
  limit?: number;
  offset?: number;
}): Promise<{ items: SheetListItem[]; total: number }> {
  const sequelize = db();
  const direction = (descending ?? sort === 'updated') ? 'DESC' : 'ASC';
  const pageSize = Math.min(Math.max(1, Math.trunc(limit)), MAX_SHEET_PAGE_SIZE);
  const from = Math.max(0, Math.trunc(offset));
  const where = `s.team_id = :teamId AND s.archived_at IS NULL
        AND (:q = '' OR s.title ILIKE :pattern OR coalesce(s.site_name, '') ILIKE :pattern)
        AND (:status = '' OR coalesce(r.review_status::text, 'draft') = :status)`;
  const replacements = {
    teamId,
    q: q?.trim() ?? '',
    pattern: `%${(q ?? '').trim().replace(/[\\%_]/g, (c) => `\\${c}`)}%`,
    status: status ?? '',
  };
  const rows = await sequelize.query<{
    id: string;
    title: string;
    site_name: string | null;
    head_revision: number;
    status: string;
    updated_at: Date;
    author_id: string | null;
    author_name: string | null;
    author_email: string | null;
    total: string;
  }>(
    `SELECT s.id, s.title, s.site_name, s.head_revision, coalesce(r.review_status::text, 'draft') AS status,
            s.updated_at, u.id AS author_id, u.name AS author_name, u.email AS author_email, count(*) OVER () AS total
       FROM sheets s
       LEFT JOIN sheet_revisions r ON r.sheet_id = s.id AND r.number = s.head_revision
       LEFT JOIN users u ON u.id = coalesce(s.updated_by, s.created_by)
      WHERE ${where}
      ORDER BY ${SORT_SQL[sort]} ${direction}, s.id
      LIMIT :limit OFFSET :offset`,
    { type: QueryTypes.SELECT, replacements: { ...replacements, limit: pageSize, offset: from } },
  );
  const items = rows.map((row) => ({
    id: row.id,
    title: row.title,
    site: row.site_name,
    revision: row.head_revision,
    status: row.status as SheetListItem['status'],
    updatedAt: new Date(row.updated_at).toISOString(),
    author: row.author_id ? { id: row.author_id, name: row.author_name!, email: row.author_email! } : null,
  }));
  // A page past the end has no row to carry the count: ask for it alone.
  const total = rows[0]
    ? Number(rows[0].total)
    : from === 0
      ? 0
      : Number(
          (
            await sequelize.query<{ total: string }>(
              `SELECT count(*) AS total FROM sheets s
                 LEFT JOIN sheet_revisions r ON r.sheet_id = s.id AND r.number = s.head_revision
                WHERE ${where}`,
              { type: QueryTypes.SELECT, replacements },
            )
          )[0]?.total ?? 0,
        );
  return { items, total };
}
