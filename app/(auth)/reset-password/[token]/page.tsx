import type { Metadata } from 'next';
import Link from 'next/link';
import { ResetPasswordForm } from '@/components/auth/reset-password-form';
import { isPasswordResetOpen } from '@/lib/db/password-resets';

export const metadata: Metadata = { title: 'Choose a new password' };

export default async function ResetPasswordPage({ params }: { params: Promise<{ token: string }> }) {
  const { token } = await params;
  const open = token.length >= 20 && token.length <= 100 && (await isPasswordResetOpen({ token }));
  if (!open) {
    return (
      <div className="flex flex-col gap-3">
        <h1 className="text-[16px] font-semibold">This link no longer works</h1>
        <p className="text-[14px]">A link to set a new password works once and expires after 1 hour.</p>
        <Link href="/reset-password" className="text-[13px] text-river hover:underline">
          Ask for a new link
        </Link>
      </div>
    );
  }
  return <ResetPasswordForm token={token} />;
}
