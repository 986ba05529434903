import type { Metadata } from 'next';
import Link from 'next/link';
import { getServerSession } from 'next-auth';
import { AcceptInvitation } from '@/components/team/accept-invitation';
import { authOptions } from '@/lib/auth/options';
import { ROLE_LABELS } from '@/lib/auth/permissions';
import { getInvitationPreview } from '@/lib/db/invitations';
import { getUserById } from '@/lib/db/users';
import { formatDay } from '@/lib/format/dates';

export const metadata: Metadata = { title: 'Team invitation' };

const CLOSED: Record<'used' | 'expired' | 'unknown', string> = {
  used: 'This invitation has already been used.',
  expired: 'This invitation has expired (invitations last 7 days).',
  unknown: 'This invitation link is not valid.',
};

export default async function InvitationPage({ params }: { params: Promise<{ token: string }> }) {
  const { token } = await params;
  const preview = token.length >= 20 && token.length <= 100 ? await getInvitationPreview({ token }) : ({ state: 'unknown' } as const);
  if (preview.state !== 'open') {
    return (
      <div className="flex flex-col gap-3">
        <h1 className="text-[16px] font-semibold">Invitation</h1>
        <p className="text-[14px]">{CLOSED[preview.state]}</p>
        <p className="text-[13px] text-slate">Ask the team owner to send a new one.</p>
      </div>
    );
  }
  const session = await getServerSession(authOptions);
  const user = session?.user?.id ? await getUserById({ id: session.user.id }) : null;
  const here = `/invitations/${encodeURIComponent(token)}`;
  return (
    <div className="flex flex-col gap-4">
      <h1 className="text-[16px] font-semibold">Join {preview.teamName}</h1>
      <p className="text-[14px]">
        {preview.invitedBy} invited <strong>{preview.email}</strong> to the team as <strong>{ROLE_LABELS[preview.role]}</strong>.
      </p>
      {user && user.email === preview.email ? (
        <AcceptInvitation token={token} teamName={preview.teamName} />
      ) : user ? (
        <p role="alert" className="text-[13px] text-clay">
          <span aria-hidden="true">⚠ </span>
          You are signed in as {user.email}. Sign out, then sign in as {preview.email} to accept.
        </p>
      ) : preview.accountExists ? (
        <Link href={`/sign-in?next=${encodeURIComponent(here)}`} className="text-[14px] text-river hover:underline">
          Sign in as {preview.email} to accept
        </Link>
      ) : (
        <div className="flex flex-col gap-2 text-[14px]">
          <Link href={`/sign-up?email=${encodeURIComponent(preview.email)}&next=${encodeURIComponent(here)}`} className="text-river hover:underline">
            Create an account for {preview.email}, then accept
          </Link>
          <Link href={`/sign-in?next=${encodeURIComponent(here)}`} className="text-[13px] text-slate hover:underline">
            I already have an account
          </Link>
        </div>
      )}
      <p className="text-[12px] text-slate">The invitation expires on {formatDay(preview.expiresAt)}.</p>
    </div>
  );
}
