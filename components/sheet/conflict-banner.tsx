'use client';

import { Button } from '@/components/ui/button';
import type { Conflict } from '@/lib/sheet/draft-state';

/** Someone else saved first (or this browser kept older edits): re-apply mine, or take theirs. */
export function ConflictBanner({ conflict, onReapply, onKeepTheirs }: { conflict: Conflict; onReapply: () => void; onKeepTheirs: () => void }) {
  return (
    <div role="alert" className="rounded-[4px] border border-oxide/60 bg-chalk p-3 text-[13px]" data-testid="conflict-banner">
      <p className="font-semibold text-oxide">
        <span aria-hidden="true">⚠ </span>
        {conflict.restored
          ? `This browser kept edits you had not saved, but the sheet has moved on to version ${conflict.serverVersion}.`
          : `Someone else saved this sheet (now version ${conflict.serverVersion}) while you were editing.`}
      </p>
      <p className="mt-1">Your edits are kept here. Re-apply them on top of the current version (block by block), or take the current version and drop yours.</p>
      <div className="mt-2 flex flex-wrap gap-2">
        <Button variant="primary" onClick={onReapply}>
          Re-apply my edits on version {conflict.serverVersion}
        </Button>
        <Button onClick={onKeepTheirs}>Keep their version</Button>
      </div>
    </div>
  );
}
