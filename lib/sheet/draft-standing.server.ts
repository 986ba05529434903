import 'server-only';
import { hashSheetDocument, parseSheetDocument } from '@/lib/engine';
import { SheetRevision } from '@/models';
import { db } from '@/lib/db';

/** Whether the draft differs from the head revision and from the last approved one (by document hash). */
export type DraftStanding = {
  head: { number: number; differs: boolean } | null;
  approved: { number: number; differs: boolean } | null;
};

/** The stored draft compared with the head and the last approved revision of a sheet. */
export async function getDraftStanding({
  sheetId,
  draftDocument,
  head,
}: {
  sheetId: string;
  draftDocument: unknown;
  head: { number: number; hash: string } | null;
}): Promise<DraftStanding> {
  if (!head) return { head: null, approved: null };
  db();
  const approved = await SheetRevision.findOne({
    where: { sheetId, reviewStatus: 'approved' },
    attributes: ['number', 'hash'],
    order: [['number', 'DESC']],
  });
  return draftStandingOf(draftDocument, head, approved ? { number: approved.number, hash: approved.hash } : null);
}

/** The standing from revisions already read (the sheet page reads the last approved one in its own query). */
export function draftStandingOf(
  draftDocument: unknown,
  head: { number: number; hash: string } | null,
  approved: { number: number; hash: string } | null,
): DraftStanding {
  if (!head) return { head: null, approved: null };
  const parsed = parseSheetDocument(draftDocument);
  const draftHash = parsed.ok ? hashSheetDocument(parsed.document) : null;
  return {
    head: { number: head.number, differs: draftHash !== head.hash },
    approved: approved ? { number: approved.number, differs: draftHash !== approved.hash } : null,
  };
}

/** The latest approved revision's number, or null. */
export async function latestApprovedRevision({ sheetId }: { sheetId: string }): Promise<number | null> {
  db();
  const approved = await SheetRevision.findOne({ where: { sheetId, reviewStatus: 'approved' }, attributes: ['number'], order: [['number', 'DESC']] });
  return approved?.number ?? null;
}
