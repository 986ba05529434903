import 'server-only';
import { badRequest, notFound } from '@/lib/errors';
import { Sheet, SheetPreference, SheetRevision } from '@/models';
import { copyDatasetsToTeam } from './dataset-bundles';
import { db } from './index';
import { insertSheet, toSheetRecord, type SheetRecord, type SiteInput } from './sheets';

/**
 * Forks a sheet (for a new site, typically) into a team: the new sheet's draft is the chosen revision's
 * document (default: the head revision, or the source's draft when it has none) with the new title and
 * site. It records where it came from; it has no revision of its own yet. A fork into another team copies
 * the datasets the document refers to. The source's display preferences (significant figures, SI column)
 * come along, so the fork reads as the source did.
 */
export async function forkSheet({
  sourceSheetId,
  teamId,
  userId,
  title,
  site,
  revision,
}: {
  sourceSheetId: string;
  teamId: string;
  userId: string;
  title: string;
  site?: SiteInput | null;
  revision?: number;
}): Promise<{ sheet: SheetRecord; forkedFrom: { sheetId: string; revision: number | null } }> {
  const sequelize = db();
  return sequelize.transaction(async (transaction) => {
    const source = await Sheet.findByPk(sourceSheetId, { transaction });
    if (!source) throw notFound('Sheet');
    const number = revision ?? (source.headRevision > 0 ? source.headRevision : null);
    let document: Record<string, unknown>;
    if (number !== null) {
      const row = await SheetRevision.findOne({ where: { sheetId: sourceSheetId, number }, attributes: ['document'], transaction });
      if (!row) throw badRequest(`revision: this sheet has no revision ${number}`, 'revision');
      document = row.document as Record<string, unknown>;
    } else {
      document = source.draftDocument as Record<string, unknown>;
    }
    // Into another team: the datasets the document refers to come along (same sha256, name and
    // description); the team quota applies, and a 409 leaves nothing forked.
    await copyDatasetsToTeam({ fromTeamId: source.teamId, toTeamId: teamId, document, userId }, transaction);
    const keptSite = site === undefined ? (document.site as SiteInput | undefined) : site ?? undefined;
    const { site: _dropped, ...rest } = document;
    void _dropped;
    const forked = { ...rest, title, ...(keptSite ? { site: keptSite } : {}) };
    const sheet = await insertSheet(
      {
        teamId,
        userId,
        document: forked as { title: string; site?: SiteInput },
        forkedFrom: { sheetId: sourceSheetId, revision: number },
        audit: {
          action: 'sheet.forked',
          details: { title, site: keptSite?.name ?? null, fromSheetId: sourceSheetId, fromTitle: source.title, fromRevision: number },
        },
      },
      transaction,
    );
    const preferences = await SheetPreference.findByPk(sourceSheetId, { transaction });
    if (preferences) {
      await SheetPreference.create(
        { sheetId: sheet.id, significantFigures: preferences.significantFigures, siFolded: preferences.siFolded, updatedBy: userId },
        { transaction },
      );
    }
    return { sheet: toSheetRecord(sheet), forkedFrom: { sheetId: sourceSheetId, revision: number } };
  });
}
