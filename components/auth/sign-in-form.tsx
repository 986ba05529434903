'use client';

import { signIn } from 'next-auth/react';
import Link from 'next/link';
import { useRouter } from 'next/navigation';
import { useState, type FormEvent } from 'react';
import { Button } from '@/components/ui/button';
import { Field } from '@/components/ui/field';
import { ErrorText } from '@/components/ui/error-text';

/** What went wrong, in words: too many attempts (with when to try again) or a wrong e-mail or password. */
export function signInErrorMessage(error: string | null | undefined): string {
  const limited = /^rate_limited:(\d+)$/.exec(error ?? '');
  if (limited) {
    const seconds = Number(limited[1]);
    const minutes = Math.ceil(seconds / 60);
    const wait = seconds < 60 ? `${seconds} second${seconds === 1 ? '' : 's'}` : `${minutes} minute${minutes === 1 ? '' : 's'}`;
    const at = new Date(Date.now() + seconds * 1000).toLocaleTimeString([], { hour: '2-digit', minute: '2-digit' });
    return `Too many failed sign-ins. Try again in ${wait} (at ${at}).`;
  }
  return 'That e-mail and password do not match an account.';
}

export function SignInForm({ next }: { next: string }) {
  const router = useRouter();
  const [error, setError] = useState<string | null>(null);
  const [pending, setPending] = useState(false);

  async function onSubmit(event: FormEvent<HTMLFormElement>) {
    event.preventDefault();
    const form = new FormData(event.currentTarget);
    setPending(true);
    setError(null);
    const result = await signIn('credentials', {
      email: String(form.get('email') ?? ''),
      password: String(form.get('password') ?? ''),
      redirect: false,
    });
    setPending(false);
    if (!result || result.error) {
      setError(signInErrorMessage(result?.error));
      return;
    }
    router.replace(next);
    router.refresh();
  }

  return (
    <form onSubmit={onSubmit} className="flex flex-col gap-4" noValidate>
      <h1 className="text-[16px] font-semibold">Sign in</h1>
      <Field label="E-mail" name="email" type="email" autoComplete="email" required autoFocus />
      <Field label="Password" name="password" type="password" autoComplete="current-password" required />
      {error ? (
        <ErrorText>{error}</ErrorText>
      ) : null}
      <Button variant="primary" type="submit" disabled={pending}>
        {pending ? 'Signing in…' : 'Sign in'}
      </Button>
      <div className="flex justify-between text-[13px]">
        <Link className="text-river underline-offset-2 hover:underline" href={`/sign-up${next !== '/sheets' ? `?next=${encodeURIComponent(next)}` : ''}`}>
          Create an account
        </Link>
        <Link className="text-river underline-offset-2 hover:underline" href="/reset-password">
          Forgot your password?
        </Link>
      </div>
    </form>
  );
}
