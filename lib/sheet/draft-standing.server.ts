import 'server-only';
import { hashSheetDocument, parseSheetDocument } from '@/lib/engine';
import { SheetRevision } from '@/models';
import { db } from '@/lib/db';
import { ByteBoundedLru } from '@/lib/cache/byte-bounded-lru';

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

/**
 * Document hashes of drafts by a digest of their stored text (the sheet page reads the SHA-256 of the draft's
 * jsonb text in its query): the same stored draft gives the same text, so its zod check and canonical hash
 * (about 1 % of a sheet page's server CPU) run once per draft, not once per request. Bounded: 4,096 drafts.
 */
const draftHashes = new ByteBoundedLru<string, { hash: string | null }>(4096, 4096, () => 1);

function draftHashOf(draftDocument: unknown): string | null {
  const parsed = parseSheetDocument(draftDocument);
  return parsed.ok ? hashSheetDocument(parsed.document) : null;
}

/**
 * The standing from revisions already read (the sheet page reads the last approved one in its own query).
 * `draftDigest`, when given, must be a digest of the stored draft's text (its hash is then kept under it).
 */
export function draftStandingOf(
  draftDocument: unknown,
  head: { number: number; hash: string } | null,
  approved: { number: number; hash: string } | null,
  draftDigest?: string,
): DraftStanding {
  if (!head) return { head: null, approved: null };
  let draftHash: string | null;
  if (draftDigest === undefined) draftHash = draftHashOf(draftDocument);
  else {
    const kept = draftHashes.get(draftDigest);
    draftHash = kept ? kept.hash : draftHashOf(draftDocument);
    if (!kept) draftHashes.set(draftDigest, { hash: draftHash });
  }
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
