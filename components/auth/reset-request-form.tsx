'use client';

import Link from 'next/link';
import { useState, type FormEvent } from 'react';
import { Button } from '@/components/ui/button';
import { Field } from '@/components/ui/field';
import { apiFetch, failureOf } from '@/lib/api-client';

/** Asks for a link to set a new password; the answer is the same whether or not the account exists. */
export function ResetRequestForm() {
  const [sent, setSent] = useState<string | null>(null);
  const [error, setError] = useState<string | undefined>();
  const [pending, setPending] = useState(false);

  async function onSubmit(event: FormEvent<HTMLFormElement>) {
    event.preventDefault();
    const email = String(new FormData(event.currentTarget).get('email') ?? '');
    setPending(true);
    setError(undefined);
    try {
      const answer = await apiFetch<{ message?: string } | null>('/api/password-reset', { body: { email } });
      setPending(false);
      setSent(answer?.message ?? 'Check your e-mail.');
    } catch (error) {
      setPending(false);
      setError(failureOf(error, 'That did not work. Try again.').message.replace(/^email: /, ''));
    }
  }

  if (sent) {
    return (
      <div className="flex flex-col gap-3" role="status">
        <h1 className="text-[16px] font-semibold">Check your e-mail</h1>
        <p className="text-[14px]">{sent}</p>
        <p className="text-[13px] text-slate">The link works once and expires in 1 hour.</p>
        <Link href="/sign-in" className="text-[13px] text-river hover:underline">
          Back to sign in
        </Link>
      </div>
    );
  }
  return (
    <form onSubmit={onSubmit} className="flex flex-col gap-4" noValidate>
      <h1 className="text-[16px] font-semibold">Set a new password</h1>
      <p className="text-[13px] text-slate">Enter the e-mail address of your account and we will send you a link.</p>
      <Field label="E-mail" name="email" type="email" autoComplete="email" required error={error} autoFocus />
      <Button type="submit" variant="primary" disabled={pending}>
        {pending ? 'Sending…' : 'Send the link'}
      </Button>
      <Link href="/sign-in" className="text-[13px] text-river hover:underline">
        Back to sign in
      </Link>
    </form>
  );
}
