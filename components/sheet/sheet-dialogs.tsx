'use client';

import dynamic from 'next/dynamic';
import { useRouter } from 'next/navigation';
import { sameJson } from '@/lib/sheet/merge';
import type { SheetDocument } from '@/lib/sheet/types';

// The dialogs load when first opened, so their code stays out of the page's first download.
const SaveRevisionDialog = dynamic(() => import('@/components/history/save-revision-dialog').then((m) => m.SaveRevisionDialog), { ssr: false });
const ForkDialog = dynamic(() => import('@/components/history/fork-dialog').then((m) => m.ForkDialog), { ssr: false });

export type SheetDialog = 'save' | 'fork' | null;

/** The sheet page's dialogs: save a revision (editors) and fork (where the reader may fork to). */
export function SheetDialogs({
  dialog,
  onClose,
  sheetId,
  doc,
  canEdit,
  canFork,
  headNumber,
  forkTeams,
  forkRevision,
  apply,
  setNotice,
  onHeadSaved,
}: {
  dialog: SheetDialog;
  onClose: () => void;
  sheetId: string;
  doc: SheetDocument;
  canEdit: boolean;
  canFork: boolean;
  /** The newest revision's number (0 while none). */
  headNumber: number;
  forkTeams: { id: string; name: string }[];
  /** The revision a fork starts from (the head the page was loaded with). */
  forkRevision?: number;
  apply: (next: SheetDocument) => void;
  setNotice: (notice: string) => void;
  /** A revision was saved with this number. */
  onHeadSaved: (number: number) => void;
}) {
  const router = useRouter();
  const onRevisionSaved = (saved: { number: number; hash: string; evaluating?: boolean }, savedDocument: unknown) => {
    onHeadSaved(saved.number);
    // After a 409 the saved document is the user's edits re-applied on the newest revision: the draft follows it.
    if (!sameJson(savedDocument, doc)) apply(savedDocument as SheetDocument);
    setNotice(
      saved.evaluating
        ? `Saved revision r${saved.number} (${saved.hash.slice(0, 10)}). It is too costly to evaluate at once: a long run stores its results (see the revision page); a check can be asked for after that.`
        : `Saved revision r${saved.number} (${saved.hash.slice(0, 10)}). It starts unsigned: ask for a check in the sign-off bar.`,
    );
    router.refresh();
  };
  if (dialog === 'save' && canEdit) {
    return <SaveRevisionDialog open onClose={onClose} sheetId={sheetId} baseRevision={headNumber} document={doc} onSaved={onRevisionSaved} />;
  }
  if (dialog === 'fork' && canFork) {
    return <ForkDialog open onClose={onClose} sheetId={sheetId} sourceTitle={doc.title} revision={forkRevision} teams={forkTeams} />;
  }
  return null;
}
