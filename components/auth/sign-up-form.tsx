'use client';

import { signIn } from 'next-auth/react';
import Link from 'next/link';
import { useRouter } from 'next/navigation';
import { useState, type FormEvent } from 'react';
import { Button } from '@/components/ui/button';
import { Field } from '@/components/ui/field';
import { apiFetch, failureOf } from '@/lib/api-client';

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
    try {
      await apiFetch('/api/users', { body });
    } catch (error) {
      const { status, message, field } = failureOf(error, 'The account could not be created. Try again.');
      const short = field ? message.replace(`${field}: `, '') : message;
      setErrors(
        status === 409
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
