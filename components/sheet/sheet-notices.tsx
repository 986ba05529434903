'use client';

import { Button } from '@/components/ui/button';

/** A failed import, with the reason, until dismissed. */
export function ImportError({ message, onDismiss }: { message: string; onDismiss: () => void }) {
  return (
    <div role="alert" className="flex items-start justify-between gap-2 rounded-[4px] border border-oxide/60 bg-chalk px-3 py-2 text-[13px]" data-testid="import-error">
      <span>
        <span aria-hidden="true" className="text-oxide">✕ </span>
        {message}
      </span>
      <Button variant="subtle" size="inline" onClick={onDismiss} className="text-[12px]">
        Dismiss
      </Button>
    </div>
  );
}

/** The sheet's last notice (a deletion, a merge, a restore...), announced politely until dismissed. */
export function SheetNotice({ message, onDismiss }: { message: string; onDismiss: () => void }) {
  return (
    <div role="status" className="flex items-start justify-between gap-2 rounded-[4px] border border-rule bg-wash px-3 py-2 text-[13px]">
      <span>{message}</span>
      <Button variant="subtle" size="inline" onClick={onDismiss} className="text-[12px]">
        Dismiss
      </Button>
    </div>
  );
}
