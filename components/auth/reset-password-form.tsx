'use client';

import Link from 'next/link';
import { useState, type FormEvent } from 'react';
import { Button } from '@/components/ui/button';
import { Field } from '@/components/ui/field';
import { apiFetch, failureOf } from '@/lib/api-client';

/** Sets a new password with the token from the e-mailed link. */
export function ResetPasswordForm({ token }: { token: string }) {
  const [done, setDone] = useState(false);
  const [errors, setErrors] = useState<{ password?: string; confirm?: string; form?: string }>({});
  const [pending, setPending] = useState(false);

  async function onSubmit(event: FormEvent<HTMLFormElement>) {
    event.preventDefault();
    const form = new FormData(event.currentTarget);
    const password = String(form.get('password') ?? '');
    if (password !== String(form.get('confirm') ?? '')) {
      setErrors({ confirm: 'The two passwords differ.' });
      return;
    }
    setPending(true);
    setErrors({});
    try {
      await apiFetch(`/api/password-reset/${encodeURIComponent(token)}`, { body: { password } });
    } catch (error) {
      setPending(false);
      const { message, field } = failureOf(error, 'That did not work. Try again.');
      setErrors(field === 'password' ? { password: message.replace(/^password: /, '') } : { form: message });
      return;
    }
    setPending(false);
    setDone(true);
  }

  if (done) {
    return (
      <div className="flex flex-col gap-3" role="status">
        <h1 className="text-[16px] font-semibold">Password set</h1>
        <p className="text-[14px]">Your new password is in place.</p>
        <Link href="/sign-in" className="text-[13px] text-river hover:underline">
          Sign in
        </Link>
      </div>
    );
  }
  return (
    <form onSubmit={onSubmit} className="flex flex-col gap-4" noValidate>
      <h1 className="text-[16px] font-semibold">Choose a new password</h1>
      <Field label="New password" name="password" type="password" autoComplete="new-password" required hint="At least 10 characters." error={errors.password} autoFocus />
      <Field label="Repeat it" name="confirm" type="password" autoComplete="new-password" required error={errors.confirm} />
      {errors.form ? (
        <p role="alert" className="text-[13px] text-oxide">
          <span aria-hidden="true">✕ </span>
          {errors.form}{' '}
          <Link href="/reset-password" className="underline">
            Ask for a new link
          </Link>
        </p>
      ) : null}
      <Button type="submit" variant="primary" disabled={pending}>
        {pending ? 'Saving…' : 'Set the password'}
      </Button>
    </form>
  );
}
