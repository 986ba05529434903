import 'server-only';
import { notFound } from '@/lib/errors';
import type { ReviewStatus } from '@/models';
import { isUuid } from './ids';
import { plainSelect } from './plain-select';
import { RECORD_COLUMNS, recordOfRow, type RecordRow, type SheetRecord } from './sheets';
import type { PublicUser } from './users';

export type SheetDetail = {
  sheet: SheetRecord & { createdBy: PublicUser | null; updatedBy: PublicUser | null };
  draft: { version: number; document: unknown };
  /** `evaluating` (only when true): the head's results are not stored yet (its long run evaluates it, CONTRACT §6b). */
  head: { number: number; hash: string; status: ReviewStatus; evaluating?: true } | null;
  /** sheetId and title are null when the source belongs to a team the reader is not in. */
  forkedFrom?: { sheetId: string | null; title: string | null; revision: number | null; visible: boolean };
  /** The first MAX_LISTED_FORKS forks (oldest first); forkCount counts them all. */
  forks: { id: string; title: string; site: string | null; revision: number | null }[];
  forkCount: number;
};

/** At most this many forks are listed with a sheet (a popular sheet may be forked any number of times). */
export const MAX_LISTED_FORKS = 200;

/** The columns of a sheet detail row (sheet `s`, head revision `h`; `$2` holds the reader's team ids). */
export type DetailRow = RecordRow & {
  draft_document: unknown;
  creator_id: string | null;
  creator_name: string | null;
  creator_email: string | null;
  updater_id: string | null;
  updater_name: string | null;
  updater_email: string | null;
  head_number: number | null;
  head_hash: string | null;
  head_status: ReviewStatus | null;
  head_evaluating: boolean | null;
  source_team_id: string | null;
  source_title: string | null;
  forks: { id: string; title: string; site: string | null; revision: number | null }[];
  fork_count: number;
};

/** The select list of the detail query; the sheet page's query adds columns to it (lib/db/sheet-page.ts). */
export const DETAIL_SELECT = `SELECT ${RECORD_COLUMNS}, s.draft_document,
            cu.id AS creator_id, cu.name AS creator_name, cu.email AS creator_email,
            uu.id AS updater_id, uu.name AS updater_name, uu.email AS updater_email,
            h.number AS head_number, h.hash AS head_hash, h.review_status AS head_status, (h.results IS NULL) AS head_evaluating,
            src.team_id AS source_team_id, src.title AS source_title,
            coalesce((SELECT json_agg(json_build_object('id', f.id, 'title', f.title, 'site', f.site_name, 'revision', f.forked_from_revision)
                                      ORDER BY f.created_at, f.id)
                        FROM (SELECT f.id, f.title, f.site_name, f.forked_from_revision, f.created_at
                                FROM sheets f
                               WHERE f.forked_from_sheet_id = s.id AND f.team_id = ANY($2::uuid[])
                               ORDER BY f.created_at, f.id
                               LIMIT ${MAX_LISTED_FORKS}) f), '[]'::json) AS forks,
            (SELECT count(*)::int FROM sheets f WHERE f.forked_from_sheet_id = s.id AND f.team_id = ANY($2::uuid[])) AS fork_count`;

/** The tables of the detail query: `$1` is the sheet's id. */
export const DETAIL_FROM = `FROM sheets s
       LEFT JOIN users cu ON cu.id = s.created_by
       LEFT JOIN users uu ON uu.id = s.updated_by
       LEFT JOIN sheet_revisions h ON h.sheet_id = s.id AND h.number = s.head_revision AND s.head_revision > 0
       LEFT JOIN sheets src ON src.id = s.forked_from_sheet_id
      WHERE s.id = $1`;

/** A detail row as the reader may see it. */
export function detailOfRow(row: DetailRow, visibleTeamIds: string[]): SheetDetail {
  const person = (id: string | null, name: string | null, email: string | null): PublicUser | null =>
    id ? { id, name: name!, email: email! } : null;
  const record = recordOfRow(row);
  const sourceVisible = row.source_team_id !== null && visibleTeamIds.includes(row.source_team_id);
  return {
    sheet: {
      ...record,
      // The source of a fork is named only to a reader who can see it.
      forkedFromSheetId: sourceVisible ? record.forkedFromSheetId : null,
      createdBy: person(row.creator_id, row.creator_name, row.creator_email),
      updatedBy: person(row.updater_id, row.updater_name, row.updater_email),
    },
    draft: { version: row.draft_version, document: row.draft_document },
    head:
      row.head_number !== null
        ? { number: row.head_number, hash: row.head_hash!, status: row.head_status!, ...(row.head_evaluating ? { evaluating: true as const } : {}) }
        : null,
    ...(row.forked_from_sheet_id
      ? {
          forkedFrom: {
            sheetId: sourceVisible ? row.forked_from_sheet_id : null,
            title: sourceVisible ? row.source_title : null,
            revision: row.forked_from_revision,
            visible: sourceVisible,
          },
        }
      : {}),
    forks: row.forks.map((f) => ({ id: f.id, title: f.title, site: f.site, revision: f.revision })),
    forkCount: row.fork_count,
  };
}

/**
 * Everything the sheet page and `GET /api/sheets/{id}` show; forks from other teams are left out, and a
 * source sheet the reader cannot see is named by nothing but the revision it was forked at (neither its
 * id nor its title). One plain query (forks in a subquery).
 */
export async function getSheetDetail({
  sheetId,
  visibleTeamIds,
}: {
  sheetId: string;
  visibleTeamIds: string[];
}): Promise<SheetDetail> {
  if (!isUuid(sheetId)) throw notFound('Sheet');
  const [row] = await plainSelect<DetailRow>(`${DETAIL_SELECT}
       ${DETAIL_FROM}`, [sheetId, visibleTeamIds.filter(isUuid)]);
  if (!row) throw notFound('Sheet');
  return detailOfRow(row, visibleTeamIds);
}
