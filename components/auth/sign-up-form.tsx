'use client';

import { signIn } from 'next-auth/react';
import Link from 'next/link';
import { useRouter } from 'next/navigation';
import { useState, type FormEvent } from 'react';
import { Button } from '@/components/ui/button';
import { Field } from '@/components/ui/field';

type FieldErrors = Partial<Record<'email' | 'password' | 'name' | 'form', string>>;

export function SignUpForm({ next, email }: { next: string; email?: string }) {
  const router = useRouter();
  const [errors, setErrors] = useState<FieldErrors>({});
  const [pending, setPending] = useState(false);

  async function onSubmit(event: FormEvent<HTMLFormElement>) {
    event.preventDefault();
    const form = new FormData(event.currentTarget);
    const body = {
      name: String(form.get('name') ?? ''),
      email: String(form.get('email') ?? ''),
      password: String(form.get('password') ?? ''),
    };
    setPending(true);
    setErrors({});
    const response = await fetch('/api/users', {
      method: 'POST',
      headers: { 'content-type': 'application/json' },
      body: JSON.stringify(body),
    });
    if (!response.ok) {
      const payload = (await response.json().catch(() => null)) as { error?: { message: string; field?: string } } | null;
      const message = payload?.error?.message ?? 'The account could not be created. Try again.';
      const field = payload?.error?.field;
      const short = field ? message.replace(`${field}: `, '') : message;
      setErrors(
        response.status === 409
          ? { email: 'An account with that e-mail address already exists. Sign in instead.' }
          : field === 'email' || field === 'password' || field === 'name'
            ? { [field]: short }
            : { form: message },
      );
      setPending(false);
      return;
    }
    await signIn('credentials', { email: body.email, password: body.password, redirect: false });
    router.replace(next);
    router.refresh();
  }

  return (
    <form onSubmit={onSubmit} className="flex flex-col gap-4" noValidate>
      <h1 className="text-[16px] font-semibold">Create an account</h1>
      <Field label="Name" name="name" autoComplete="name" required error={errors.name} autoFocus />
      <Field label="E-mail" name="email" type="email" autoComplete="email" required defaultValue={email} error={errors.email} />
      <Field
        label="Password"
        name="password"
        type="password"
        autoComplete="new-password"
        required
        hint="At least 10 characters."
        error={errors.password}
      />
      {errors.form ? (
        <p role="alert" className="text-[13px] text-oxide">
          {errors.form}
        </p>
      ) : null}
      <Button variant="primary" type="submit" disabled={pending}>
        {pending ? 'Creating…' : 'Create account'}
      </Button>
      <p className="text-[13px] text-slate">
        Already have an account?{' '}
        <Link className="text-river hover:underline" href="/sign-in">
          Sign in
        </Link>
      </p>
    </form>
  );
}
