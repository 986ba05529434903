'use client';

import { CommentsPanel } from '@/components/comments/comments-panel';
import type { PublicUser as Person } from '@/lib/db/users';
import type { CatalogType, SheetBlock } from '@/lib/sheet/types';
import { HelpPanel } from './help-panel';
import type { RailPanel } from './side-rail';

/** The side rail's panels about the selected block: its help, and its comments (with the open count). */
export function blockRailPanels({
  sheetId,
  block,
  type,
  standingCaution,
  openComments,
  revision,
  userId,
  canComment,
  teamId,
  members,
}: {
  teamId: string;
  members: Person[];
  sheetId: string;
  block: SheetBlock | null;
  type: CatalogType | null;
  standingCaution: string;
  openComments: number;
  revision: number;
  userId: string;
  canComment: boolean;
}): RailPanel[] {
  return [
    { id: 'help', title: 'Help', render: () => <HelpPanel block={block} type={type} standingCaution={standingCaution} /> },
    {
      id: 'comments',
      title: openComments ? `Comments (${openComments})` : 'Comments',
      render: () =>
        block ? (
          <CommentsPanel
            key={block.id}
            sheetId={sheetId}
            blockId={block.id}
            blockName={block.name}
            revision={revision}
            userId={userId}
            canComment={canComment}
            teamId={teamId}
            members={members}
          />
        ) : (
          <p className="text-[13px] text-slate">Select a block to read and write its comments.</p>
        ),
    },
  ];
}
