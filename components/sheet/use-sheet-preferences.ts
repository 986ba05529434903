'use client';

import { useCallback, useState } from 'react';
import { apiFetch } from '@/lib/api-client';
import type { SheetPreferences } from '@/lib/sheet/preferences';

/**
 * The sheet's display preferences (significant figures, the SI column). A change applies to this view at
 * once; owners and editors also store it for the sheet, and a failure to store it says so in the notice.
 */
export function useSheetPreferences({
  sheetId,
  canEdit,
  stored,
  setNotice,
}: {
  sheetId: string;
  canEdit: boolean;
  stored: SheetPreferences;
  setNotice: (notice: string) => void;
}) {
  const [prefs, setPrefs] = useState<SheetPreferences>(stored);
  const changePrefs = useCallback(
    (change: Partial<SheetPreferences>) => {
      setPrefs((p) => ({ ...p, ...change }));
      if (canEdit) {
        apiFetch(`/api/sheets/${sheetId}/preferences`, { method: 'PUT', body: change }).catch(() =>
          setNotice('The display setting could not be stored for the sheet; it applies to this view only.'),
        );
      }
    },
    [canEdit, sheetId, setNotice],
  );
  return { prefs, changePrefs };
}
