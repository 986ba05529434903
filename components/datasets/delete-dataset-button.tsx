'use client';

import Link from 'next/link';
import { useRouter } from 'next/navigation';
import { useState } from 'react';
import { Button } from '@/components/ui/button';
import { ErrorText } from '@/components/ui/error-text';
import { ApiError, apiFetch, failureOf } from '@/lib/api-client';

type Use = { sheetId: string; title: string; revisions: number[]; draft: boolean };

/** Deletes a dataset nothing uses; a 409 lists the sheets that still refer to it. */
export function DeleteDatasetButton({ sha256, teamId, name }: { sha256: string; teamId: string; name: string }) {
  const router = useRouter();
  const [busy, setBusy] = useState(false);
  const [error, setError] = useState<{ message: string; usedBy?: Use[] } | null>(null);

  async function remove() {
    if (!window.confirm(`Delete “${name}”? Sheets can no longer refer to it.`)) return;
    setBusy(true);
    setError(null);
    try {
      await apiFetch(`/api/datasets/${sha256}?team=${teamId}`, { method: 'DELETE' });
    } catch (failure) {
      setBusy(false);
      const body = failure instanceof ApiError ? (failure.body as { usedBy?: Use[] } | null) : null;
      const status = failure instanceof ApiError ? failure.status : 0;
      setError({ message: failureOf(failure, `The dataset could not be deleted (HTTP ${status}).`).message, usedBy: body?.usedBy });
      return;
    }
    setBusy(false);
    router.push('/datasets');
    router.refresh();
  }

  return (
    <div className="flex flex-col gap-1">
      <Button variant="danger" onClick={remove} disabled={busy} className="self-start">
        {busy ? 'Deleting…' : 'Delete dataset'}
      </Button>
      {error ? (
        <ErrorText>
          {error.message}{' '}
          {error.usedBy?.map((use, i) => (
            <span key={use.sheetId}>
              {i > 0 ? ', ' : ''}
              <Link href={`/sheets/${use.sheetId}`} className="underline">
                {use.title}
              </Link>
            </span>
          ))}
        </ErrorText>
      ) : null}
    </div>
  );
}
