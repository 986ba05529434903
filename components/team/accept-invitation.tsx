'use client';

import { useRouter } from 'next/navigation';
import { useState } from 'react';
import { Button } from '@/components/ui/button';
import { ErrorText } from '@/components/ui/error-text';

export function AcceptInvitation({ token, teamName }: { token: string; teamName: string }) {
  const router = useRouter();
  const [error, setError] = useState<string | null>(null);
  const [pending, setPending] = useState(false);

  async function accept() {
    setPending(true);
    setError(null);
    const response = await fetch(`/api/invitations/${encodeURIComponent(token)}/accept`, { method: 'POST' });
    if (response.ok) {
      router.replace('/sheets');
      router.refresh();
      return;
    }
    const payload = (await response.json().catch(() => null)) as { error?: { message: string } } | null;
    setError(payload?.error?.message ?? 'The invitation could not be accepted. Try again.');
    setPending(false);
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
