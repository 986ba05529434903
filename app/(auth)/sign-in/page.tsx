import type { Metadata } from 'next';
import { SignInForm } from '@/components/auth/sign-in-form';
import { safeNextPath } from '@/lib/http/next-path';

export const metadata: Metadata = { title: 'Sign in' };

export default async function SignInPage({ searchParams }: { searchParams: Promise<Record<string, string | string[] | undefined>> }) {
  const params = await searchParams;
  return <SignInForm next={safeNextPath(params.callbackUrl ?? params.next)} />;
}
