'use client';

import { useRouter } from 'next/navigation';
import { useCallback, useRef, useState, type ChangeEvent } from 'react';
import { ApiError, apiFetch } from '@/lib/api-client';

/** Export of the head revision as a JSON file, and import of a sheet file into the team (a new sheet). */
export function useSheetTransfer({ sheetId, teamId }: { sheetId: string; teamId: string }) {
  const router = useRouter();
  const [transferError, setTransferError] = useState<string | null>(null);
  const importRef = useRef<HTMLInputElement>(null);

  const exportHead = useCallback(() => {
    const link = document.createElement('a');
    link.href = `/api/sheets/${sheetId}/export`;
    link.download = '';
    document.body.appendChild(link);
    link.click();
    link.remove();
  }, [sheetId]);

  const importFile = useCallback(
    async (event: ChangeEvent<HTMLInputElement>) => {
      const file = event.target.files?.[0];
      event.target.value = '';
      if (!file) return;
      setTransferError(null);
      let parsed: unknown;
      try {
        parsed = JSON.parse(await file.text());
      } catch {
        setTransferError(`“${file.name}” is not a JSON file, so it cannot be imported.`);
        return;
      }
      try {
        const body = await apiFetch<{ sheet: { id: string } }>('/api/sheets/import', { body: { document: parsed, teamId } });
        router.push(`/sheets/${body.sheet.id}`);
      } catch (error) {
        if (!(error instanceof ApiError) || error.status === 0) {
          setTransferError('The server could not be reached; nothing was imported. Try again.');
          return;
        }
        setTransferError(`“${file.name}” was not imported: ${error.code === 'error' ? `the server answered ${error.status}` : error.message}.`);
      }
    },
    [router, teamId],
  );

  /** Opens the browser's file chooser of the hidden import input. */
  const chooseImport = useCallback(() => importRef.current?.click(), []);

  return { transferError, setTransferError, importRef, importFile, chooseImport, exportHead };
}
