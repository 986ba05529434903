'use client';

import Link from 'next/link';
import { useRouter } from 'next/navigation';
import { useState } from 'react';
import { Button } from '@/components/ui/button';
import { ErrorText } from '@/components/ui/error-text';

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
    const response = await fetch(`/api/datasets/${sha256}?team=${teamId}`, { method: 'DELETE' });
    setBusy(false);
    if (response.status === 204) {
      router.push('/datasets');
      router.refresh();
      return;
    }
    const body = (await response.json().catch(() => null)) as { error?: { message: string }; usedBy?: Use[] } | null;
    setError({ message: body?.error?.message ?? `The dataset could not be deleted (HTTP ${response.status}).`, usedBy: body?.usedBy });
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
