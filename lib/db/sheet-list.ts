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

/** A team's visible sheets (archived ones left out), searchable by title and site, sortable. */
export async function listSheetsByTeam({
  teamId,
  q,
  sort = 'updated',
  descending,
  status,
}: {
  teamId: string;
  q?: string;
  sort?: SheetSort;
  descending?: boolean;
  status?: ReviewStatus | 'draft';
}): Promise<{ items: SheetListItem[]; total: number }> {
  const sequelize = db();
  const direction = (descending ?? sort === 'updated') ? 'DESC' : 'ASC';
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
  }>(
    `SELECT s.id, s.title, s.site_name, s.head_revision, coalesce(r.review_status::text, 'draft') AS status,
            s.updated_at, u.id AS author_id, u.name AS author_name, u.email AS author_email
       FROM sheets s
       LEFT JOIN sheet_revisions r ON r.sheet_id = s.id AND r.number = s.head_revision
       LEFT JOIN users u ON u.id = coalesce(s.updated_by, s.created_by)
      WHERE s.team_id = :teamId AND s.archived_at IS NULL
        AND (:q = '' OR s.title ILIKE :pattern OR coalesce(s.site_name, '') ILIKE :pattern)
        AND (:status = '' OR coalesce(r.review_status::text, 'draft') = :status)
      ORDER BY ${SORT_SQL[sort]} ${direction}, s.id`,
    {
      type: QueryTypes.SELECT,
      replacements: {
        teamId,
        q: q?.trim() ?? '',
        pattern: `%${(q ?? '').trim().replace(/[\\%_]/g, (c) => `\\${c}`)}%`,
        status: status ?? '',
      },
    },
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
  return { items, total: items.length };
}
