import 'server-only';
import { getServerSession } from 'next-auth';
import { redirect } from 'next/navigation';
import { getSessionUser, type PublicUser } from '@/lib/db/users';
import { listTeamsForUser, type TeamSummary } from '@/lib/db/teams';
import { authOptions } from './options';

/** For pages: the signed-in user and their teams, or a redirect to sign-in. */
export async function requirePageUser(): Promise<{ user: PublicUser; teams: TeamSummary[]; current: TeamSummary | null }> {
  const session = await getServerSession(authOptions);
  const user = session?.user?.id ? await getSessionUser({ id: session.user.id, signedInAt: session.signedInAt }) : null;
  if (!user) redirect('/sign-in');
  const teams = await listTeamsForUser({ userId: user.id });
  return { user, teams, current: teams.find((t) => t.current) ?? null };
}
