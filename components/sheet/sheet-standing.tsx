'use client';

import { ReviewBar, type ReviewController, type ReviewState } from '@/components/review/review-bar';
import type { ReviewNote } from '@/components/review/review-notes';
import type { SheetStatus } from '@/components/ui/status';
import { UncertaintySettings } from '@/components/uncertainty/uncertainty-settings';
import type { PublicUser as Person } from '@/lib/db/users';
import type { DraftStanding } from '@/lib/sheet/draft-standing.server';
import type { SheetPreferences } from '@/lib/sheet/preferences';
import type { SheetDocument, UncertaintySettingsData } from '@/lib/sheet/types';
import type { TeamRole as Role } from '@/models';
import { DisplaySettings } from './display-settings';
import { DraftStandingNote } from './draft-standing';

/**
 * The sheet header's lower part: display and uncertainty settings, what the reader's role allows, how the
 * draft stands against the revisions, and the head revision's sign-off bar.
 */
export function SheetStanding({
  sheetId,
  doc,
  canEdit,
  canComment,
  role,
  userId,
  prefs,
  onPrefsChange,
  onUncertaintyChange,
  draftStanding,
  head,
  review,
  reviewNotes,
  reviewActions,
  checkers,
}: {
  sheetId: string;
  doc: SheetDocument;
  canEdit: boolean;
  canComment: boolean;
  role: Role;
  userId: string;
  prefs: SheetPreferences;
  onPrefsChange: (change: Partial<SheetPreferences>) => void;
  onUncertaintyChange: (settings: UncertaintySettingsData) => void;
  draftStanding?: DraftStanding;
  head: { number: number; hash: string; status: SheetStatus } | null;
  review: ReviewState | null;
  reviewNotes: ReviewNote[];
  reviewActions: ReviewController;
  checkers: Person[];
}) {
  return (
    <>
      <DisplaySettings preferences={prefs} shared={canEdit} onChange={onPrefsChange} />
      <UncertaintySettings doc={doc} canEdit={canEdit} onChange={onUncertaintyChange} />
      {!canEdit ? (
        <p className="text-[12px] text-slate">
          You are a {role} in this team: fields are read-only. You can evaluate{canComment ? ', comment' : ''} and read everything.
        </p>
      ) : null}
      {draftStanding ? <DraftStandingNote sheetId={sheetId} standing={draftStanding} /> : null}
      {head && review ? (
        <ReviewBar
          key={head.number}
          sheetId={sheetId}
          revision={head.number}
          isHead
          review={review}
          role={role}
          userId={userId}
          checkers={checkers}
          controller={reviewActions}
          notes={reviewNotes}
          draftDiffers={draftStanding?.head?.differs ?? false}
        />
      ) : (
        <p className="text-[12px] text-slate">
          No revision yet: sign-off (prepared, checked, approved) starts when a revision is saved.
        </p>
      )}
    </>
  );
}
