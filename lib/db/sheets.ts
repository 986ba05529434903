import 'server-only';
import type { Transaction } from 'sequelize';
import { conflict, notFound } from '@/lib/errors';
import { Sheet } from '@/models';
import { recordAudit } from './audit';
import { isUuid } from './ids';
import { db } from './index';
import { plainSelect } from './plain-select';

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

/** The columns of a SheetRecord (never the draft document, which can be large), for raw queries on `s`. */
export const RECORD_COLUMNS = `s.id, s.team_id, s.title, s.site_name, s.site_latitude, s.site_longitude, s.site_notes, s.draft_version,
  s.head_revision, s.archived_at, s.forked_from_sheet_id, s.forked_from_revision, s.created_at, s.updated_at`;

export type RecordRow = {
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

export function recordOfRow(row: RecordRow): SheetRecord {
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
  const [row] = await plainSelect<RecordRow>(`SELECT ${RECORD_COLUMNS} FROM sheets s WHERE s.id = $1`, [sheetId]);
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
