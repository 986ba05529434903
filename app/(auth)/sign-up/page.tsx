import type { Metadata } from 'next';
import { SignUpForm } from '@/components/auth/sign-up-form';
import { safeNextPath } from '@/lib/http/next-path';

export const metadata: Metadata = { title: 'Create an account' };

export default async function SignUpPage({ searchParams }: { searchParams: Promise<Record<string, string | string[] | undefined>> }) {
  const params = await searchParams;
  const email = typeof params.email === 'string' ? params.email : undefined;
  return <SignUpForm next={safeNextPath(params.next)} email={email} />;
}
