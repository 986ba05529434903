import 'server-only';
import { QueryTypes, type Transaction } from 'sequelize';
import { conflict, notFound } from '@/lib/errors';
import { Sheet, type ReviewStatus } from '@/models';
import { recordAudit } from './audit';
import { isUuid } from './ids';
import { db } from './index';
import type { PublicUser } from './users';

export type SiteInput = { name: string; latitude?: number; longitude?: number; notes?: string };

export type SheetRecord = {
  id: string;
  teamId: string;
  title: string;
  site: SiteInput | null;
  draftVersion: number;
  headRevision: number;
  archived: boolean;
  forkedFromSheetId: string | null;
  forkedFromRevision: number | null;
  createdAt: string;
  updatedAt: string;
};

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

function siteOf(sheet: Sheet): SiteInput | null {
  if (!sheet.siteName) return null;
  return {
    name: sheet.siteName,
    ...(sheet.siteLatitude !== null ? { latitude: sheet.siteLatitude } : {}),
    ...(sheet.siteLongitude !== null ? { longitude: sheet.siteLongitude } : {}),
    ...(sheet.siteNotes ? { notes: sheet.siteNotes } : {}),
  };
}

export function siteColumns(site: SiteInput | null | undefined) {
  return {
    siteName: site?.name ?? null,
    siteLatitude: site?.latitude ?? null,
    siteLongitude: site?.longitude ?? null,
    siteNotes: site?.notes ?? null,
  };
}

export function toSheetRecord(sheet: Sheet): SheetRecord {
  return {
    id: sheet.id,
    teamId: sheet.teamId,
    title: sheet.title,
    site: siteOf(sheet),
    draftVersion: sheet.draftVersion,
    headRevision: sheet.headRevision,
    archived: sheet.archivedAt !== null,
    forkedFromSheetId: sheet.forkedFromSheetId,
    forkedFromRevision: sheet.forkedFromRevision,
    createdAt: sheet.createdAt.toISOString(),
    updatedAt: sheet.updatedAt.toISOString(),
  };
}

/** An empty sheet document with the given title and site. */
export function emptyDocument(title: string, site?: SiteInput | null) {
  return { format: 'denudata-sheet@1', title, ...(site ? { site } : {}), blocks: [] as unknown[] };
}

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

/** The columns of a SheetRecord (never the draft document, which can be large), for raw queries on `s`. */
const RECORD_COLUMNS = `s.id, s.team_id, s.title, s.site_name, s.site_latitude, s.site_longitude, s.site_notes, s.draft_version,
  s.head_revision, s.archived_at, s.forked_from_sheet_id, s.forked_from_revision, s.created_at, s.updated_at`;

type RecordRow = {
  id: string;
  team_id: string;
  title: string;
  site_name: string | null;
  site_latitude: number | null;
  site_longitude: number | null;
  site_notes: string | null;
  draft_version: number;
  head_revision: number;
  archived_at: Date | null;
  forked_from_sheet_id: string | null;
  forked_from_revision: number | null;
  created_at: Date;
  updated_at: Date;
};

function recordOfRow(row: RecordRow): SheetRecord {
  return {
    id: row.id,
    teamId: row.team_id,
    title: row.title,
    site: row.site_name
      ? {
          name: row.site_name,
          ...(row.site_latitude !== null ? { latitude: row.site_latitude } : {}),
          ...(row.site_longitude !== null ? { longitude: row.site_longitude } : {}),
          ...(row.site_notes ? { notes: row.site_notes } : {}),
        }
      : null,
    draftVersion: row.draft_version,
    headRevision: row.head_revision,
    archived: row.archived_at !== null,
    forkedFromSheetId: row.forked_from_sheet_id,
    forkedFromRevision: row.forked_from_revision,
    createdAt: new Date(row.created_at).toISOString(),
    updatedAt: new Date(row.updated_at).toISOString(),
  };
}

/** A sheet's record (no draft document), or null; one plain query, asked by every sheet route's guard. */
export async function findSheetRecord({ sheetId }: { sheetId: string }): Promise<SheetRecord | null> {
  if (!isUuid(sheetId)) return null;
  const [row] = await db().query<RecordRow>(`SELECT ${RECORD_COLUMNS} FROM sheets s WHERE s.id = $1`, {
    bind: [sheetId],
    type: QueryTypes.SELECT,
  });
  return row ? recordOfRow(row) : null;
}

/**
 * Inserts a sheet whose draft is `document`, its title and site taken from the document, and records the
 * audit entry, inside the caller's transaction. Creating, forking and importing a sheet all go through here.
 */
export async function insertSheet(
  {
    teamId,
    userId,
    document,
    forkedFrom = null,
    audit,
  }: {
    teamId: string;
    userId: string;
    document: { title: string; site?: SiteInput | null };
    forkedFrom?: { sheetId: string; revision: number | null } | null;
    audit: { action: string; details?: Record<string, unknown> };
  },
  transaction: Transaction,
): Promise<Sheet> {
  const sheet = await Sheet.create(
    {
      teamId,
      title: document.title,
      ...siteColumns(document.site),
      draftDocument: document,
      createdBy: userId,
      updatedBy: userId,
      forkedFromSheetId: forkedFrom?.sheetId ?? null,
      forkedFromRevision: forkedFrom?.revision ?? null,
      archivedAt: null,
    },
    { transaction },
  );
  await recordAudit(
    {
      teamId,
      actorId: userId,
      action: audit.action,
      subjectType: 'sheet',
      subjectId: sheet.id,
      details: audit.details ?? { title: document.title },
    },
    transaction,
  );
  return sheet;
}

/** A new sheet: an empty draft, or the given document as its draft. */
export async function createSheet({
  teamId,
  userId,
  title,
  site,
  document,
}: {
  teamId: string;
  userId: string;
  title: string;
  site?: SiteInput | null;
  document?: { title: string; site?: SiteInput };
}): Promise<SheetRecord> {
  const draft = document ?? emptyDocument(title, site);
  return db().transaction(async (transaction) =>
    toSheetRecord(await insertSheet({ teamId, userId, document: draft, audit: { action: 'sheet.created' } }, transaction)),
  );
}

export type SheetDetail = {
  sheet: SheetRecord & { createdBy: PublicUser | null; updatedBy: PublicUser | null };
  draft: { version: number; document: unknown };
  /** `evaluating` (only when true): the head's results are not stored yet (its long run evaluates it, CONTRACT §6b). */
  head: { number: number; hash: string; status: ReviewStatus; evaluating?: true } | null;
  /** sheetId and title are null when the source belongs to a team the reader is not in. */
  forkedFrom?: { sheetId: string | null; title: string | null; revision: number | null; visible: boolean };
  forks: { id: string; title: string; site: string | null; revision: number | null }[];
};

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
  const [row] = await db().query<
    RecordRow & {
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
    }
  >(
    `SELECT ${RECORD_COLUMNS}, s.draft_document,
            cu.id AS creator_id, cu.name AS creator_name, cu.email AS creator_email,
            uu.id AS updater_id, uu.name AS updater_name, uu.email AS updater_email,
            h.number AS head_number, h.hash AS head_hash, h.review_status AS head_status, (h.results IS NULL) AS head_evaluating,
            src.team_id AS source_team_id, src.title AS source_title,
            coalesce((SELECT json_agg(json_build_object('id', f.id, 'title', f.title, 'site', f.site_name, 'revision', f.forked_from_revision)
                                      ORDER BY f.created_at, f.id)
                        FROM sheets f
                       WHERE f.forked_from_sheet_id = s.id AND f.team_id = ANY($2::uuid[])), '[]'::json) AS forks
       FROM sheets s
       LEFT JOIN users cu ON cu.id = s.created_by
       LEFT JOIN users uu ON uu.id = s.updated_by
       LEFT JOIN sheet_revisions h ON h.sheet_id = s.id AND h.number = s.head_revision AND s.head_revision > 0
       LEFT JOIN sheets src ON src.id = s.forked_from_sheet_id
      WHERE s.id = $1`,
    { bind: [sheetId, visibleTeamIds.filter(isUuid)], type: QueryTypes.SELECT },
  );
  if (!row) throw notFound('Sheet');
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
  };
}

/** The audit action of a draft save. */
export const DRAFT_SAVED = 'draft.saved';

/**
 * Saves the working draft if nobody saved since `baseVersion`; otherwise 409 with the current version
 * and nothing written. An archived sheet's draft is not saved either (409, `current.archived`). The
 * sheet's title and site follow the document's.
 */
export async function saveDraft({
  sheetId,
  userId,
  baseVersion,
  document,
}: {
  sheetId: string;
  userId: string;
  baseVersion: number;
  document: { title: string; site?: SiteInput };
}): Promise<{ version: number }> {
  const sequelize = db();
  return sequelize.transaction(async (transaction) => {
    const [count] = await Sheet.update(
      {
        draftDocument: document,
        draftVersion: baseVersion + 1,
        title: document.title,
        ...siteColumns(document.site),
        updatedBy: userId,
      },
      { where: { id: sheetId, draftVersion: baseVersion, archivedAt: null }, transaction },
    );
    if (count === 0) {
      const current = await Sheet.findByPk(sheetId, { attributes: ['id', 'draftVersion', 'archivedAt'], transaction });
      if (!current) throw notFound('Sheet');
      if (current.archivedAt !== null) {
        throw conflict('This sheet is archived: its draft can no longer be saved. Fork it to keep working on it.', {
          current: { version: current.draftVersion, archived: true },
        });
      }
      throw conflict('The draft was saved by someone else since you loaded it.', {
        current: { version: current.draftVersion },
      });
    }
    // Every save is in the audit log; the team's activity feed leaves these out (they come every few seconds).
    const saved = await Sheet.findByPk(sheetId, { attributes: ['id', 'teamId'], transaction });
    await recordAudit(
      {
        teamId: saved!.teamId,
        actorId: userId,
        action: DRAFT_SAVED,
        subjectType: 'sheet',
        subjectId: sheetId,
        details: { version: baseVersion + 1, title: document.title },
      },
      transaction,
    );
    return { version: baseVersion + 1 };
  });
}

/** Archives a sheet that has revisions (still readable by link; once: again is a no-op); removes one that has none. */
export async function deleteSheet({ sheetId, userId }: { sheetId: string; userId: string }): Promise<'archived' | 'deleted'> {
  const sequelize = db();
  return sequelize.transaction(async (transaction) => {
    const sheet = await Sheet.findByPk(sheetId, { transaction, lock: transaction.LOCK.UPDATE });
    if (!sheet) throw notFound('Sheet');
    // Archiving an archived sheet again changes nothing and records nothing.
    if (sheet.archivedAt !== null) return 'archived';
    const outcome = sheet.headRevision > 0 ? 'archived' : 'deleted';
    if (outcome === 'archived') {
      await sheet.update({ archivedAt: new Date(), updatedBy: userId }, { transaction });
    } else {
      await sheet.destroy({ transaction });
    }
    await recordAudit(
      { teamId: sheet.teamId, actorId: userId, action: `sheet.${outcome}`, subjectType: 'sheet', subjectId: sheetId, details: { title: sheet.title } },
      transaction,
    );
    return outcome;
  });
}

/** The working draft of a sheet and its version (for evaluation). Added for the sheet workspace. */
export async function getSheetDraft({ sheetId }: { sheetId: string }): Promise<{ version: number; document: unknown }> {
  db();
  const sheet = await Sheet.findByPk(sheetId, { attributes: ['id', 'draftVersion', 'draftDocument'] });
  if (!sheet) throw notFound('Sheet');
  return { version: sheet.draftVersion, document: sheet.draftDocument };
}
