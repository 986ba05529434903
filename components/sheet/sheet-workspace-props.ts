import type { ReviewState } from '@/components/review/review-bar';
import type { ReviewNote } from '@/components/review/review-notes';
import type { SheetStatus } from '@/components/ui/status';
import type { PublicUser as Person } from '@/lib/db/users';
import type { DraftStanding } from '@/lib/sheet/draft-standing.server';
import type { SheetPreferences } from '@/lib/sheet/preferences';
import type { SheetDocument } from '@/lib/sheet/types';
import type { TeamRole as Role } from '@/models';
import type { ForkItem, ForkOrigin } from './sheet-header';
import type { RailPanel } from './side-rail';

/** What the sheet page's server part hands the workspace. */
export interface SheetWorkspaceProps {
  sheetId: string;
  /** The team the sheet belongs to (imports from this page go there). */
  teamId: string;
  draft: { version: number; document: SheetDocument };
  head: { number: number; hash: string; status: SheetStatus } | null;
  /** Sign-off of the head revision (null while the sheet has no revision). */
  review: ReviewState | null;
  /** Review actions on the head revision with their notes. */
  reviewNotes?: ReviewNote[];
  /** Whether the stored draft differs from the head and the last approved revision. */
  draftStanding?: DraftStanding;
  forkedFrom: ForkOrigin | null;
  /** The first forks (the server lists at most 200); forkCount counts them all. */
  forks: ForkItem[];
  forkCount?: number;
  /** Version of the block catalog the page was rendered with (fetched once: use-block-catalog.ts). */
  catalogVersion: string;
  canEdit: boolean;
  role: Role;
  user: { id: string; name: string };
  /** Members who may check a revision (owners and reviewers). */
  checkers: Person[];
  /** Teams the user may fork into (editor or owner there); empty: no fork. */
  forkTeams: { id: string; name: string }[];
  otherSheets: { id: string; title: string }[];
  /** Extra rail panels (comments, history...) added by later features. */
  extraPanels?: RailPanel[];
  /** The team's members (a comment can mention them). */
  members?: Person[];
  /** Display preferences stored beside the sheet (CONTRACT §6b). */
  preferences?: SheetPreferences;
}
