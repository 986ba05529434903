'use client';

import { useRouter } from 'next/navigation';
import { useState } from 'react';
import { Button } from '@/components/ui/button';
import { ErrorText } from '@/components/ui/error-text';
import { apiFetch, failureOf } from '@/lib/api-client';

export function AcceptInvitation({ token, teamName }: { token: string; teamName: string }) {
  const router = useRouter();
  const [error, setError] = useState<string | null>(null);
  const [pending, setPending] = useState(false);

  async function accept() {
    setPending(true);
    setError(null);
    try {
      await apiFetch(`/api/invitations/${encodeURIComponent(token)}/accept`, { method: 'POST' });
    } catch (error) {
      setError(failureOf(error, 'The invitation could not be accepted. Try again.').message);
      setPending(false);
      return;
    }
    router.replace('/sheets');
    router.refresh();
  }

  return (
    <div className="flex flex-col gap-3">
      <Button variant="primary" onClick={accept} disabled={pending}>
        {pending ? 'Joining…' : `Join ${teamName}`}
      </Button>
      {error ? (
        <ErrorText>{error}</ErrorText>
      ) : null}
    </div>
  );
}
