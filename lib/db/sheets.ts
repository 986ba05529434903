import 'server-only';
import { Op, QueryTypes, type Transaction } from 'sequelize';
import { conflict, notFound } from '@/lib/errors';
import { Sheet, SheetRevision, User, type ReviewStatus } from '@/models';
import { recordAudit } from './audit';
import { isUuid } from './ids';
import { db } from './index';
import { toPublicUser, type PublicUser } from './users';

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

export async function findSheetRecord({ sheetId }: { sheetId: string }): Promise<SheetRecord | null> {
  db();
  if (!isUuid(sheetId)) return null;
  const sheet = await Sheet.findByPk(sheetId);
  return sheet ? toSheetRecord(sheet) : null;
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
  forkedFrom?: { sheetId: string; title: string | null; revision: number | null; visible: boolean };
  forks: { id: string; title: string; site: string | null; revision: number | null }[];
};

/** Everything the sheet page and `GET /api/sheets/{id}` show; forks from other teams are left out. */
export async function getSheetDetail({
  sheetId,
  visibleTeamIds,
}: {
  sheetId: string;
  visibleTeamIds: string[];
}): Promise<SheetDetail> {
  db();
  const sheet = await Sheet.findByPk(sheetId, {
    include: [
      { model: User, as: 'creator' },
      { model: User, as: 'updater' },
    ],
  });
  if (!sheet) throw notFound('Sheet');
  const withUsers = sheet as Sheet & { creator?: User | null; updater?: User | null };
  const [head, source, forks] = await Promise.all([
    sheet.headRevision > 0 ? SheetRevision.findOne({ where: { sheetId, number: sheet.headRevision } }) : null,
    sheet.forkedFromSheetId ? Sheet.findByPk(sheet.forkedFromSheetId) : null,
    Sheet.findAll({
      where: { forkedFromSheetId: sheetId, teamId: { [Op.in]: visibleTeamIds } },
      order: [['createdAt', 'ASC']],
    }),
  ]);
  const sourceVisible = source ? visibleTeamIds.includes(source.teamId) : false;
  return {
    sheet: {
      ...toSheetRecord(sheet),
      createdBy: withUsers.creator ? toPublicUser(withUsers.creator) : null,
      updatedBy: withUsers.updater ? toPublicUser(withUsers.updater) : null,
    },
    draft: { version: sheet.draftVersion, document: sheet.draftDocument },
    head: head ? { number: head.number, hash: head.hash, status: head.reviewStatus, ...(head.results === null ? { evaluating: true as const } : {}) } : null,
    ...(sheet.forkedFromSheetId
      ? {
          forkedFrom: {
            sheetId: sheet.forkedFromSheetId,
            title: sourceVisible ? source!.title : null,
            revision: sheet.forkedFromRevision,
            visible: sourceVisible,
          },
        }
      : {}),
    forks: forks.map((f) => ({ id: f.id, title: f.title, site: f.siteName, revision: f.forkedFromRevision })),
  };
}

/** The audit action of a draft save. */
export const DRAFT_SAVED = 'draft.saved';

/**
 * Saves the working draft if nobody saved since `baseVersion`; otherwise 409 with the current version
 * and nothing written. The sheet's title and site follow the document's.
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
      { where: { id: sheetId, draftVersion: baseVersion }, transaction },
    );
    if (count === 0) {
      const current = await Sheet.findByPk(sheetId, { transaction });
      if (!current) throw notFound('Sheet');
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

/** Archives a sheet that has revisions (still readable by link); removes one that has none. */
export async function deleteSheet({ sheetId, userId }: { sheetId: string; userId: string }): Promise<'archived' | 'deleted'> {
  const sequelize = db();
  return sequelize.transaction(async (transaction) => {
    const sheet = await Sheet.findByPk(sheetId, { transaction, lock: transaction.LOCK.UPDATE });
    if (!sheet) throw notFound('Sheet');
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
