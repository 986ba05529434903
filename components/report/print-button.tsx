'use client';

import { Button } from '@/components/ui/button';

/** Opens the browser's print dialog (hidden when printing, like every button). */
export function PrintButton() {
  return (
    <Button variant="quiet" size="bare" onClick={() => window.print()} className="rounded-[4px] px-2 py-1 text-[13px]">
      Print
    </Button>
  );
}
