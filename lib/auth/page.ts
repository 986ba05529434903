import 'server-only';
import { redirect } from 'next/navigation';
import type { PublicUser } from '@/lib/db/users';
import type { TeamSummary } from '@/lib/db/teams';
import { getSessionContext } from './session';

/** For pages: the signed-in user and their teams, or a redirect to sign-in (looked up once per request). */
export async function requirePageUser(): Promise<{ user: PublicUser; teams: TeamSummary[]; current: TeamSummary | null }> {
  const context = await getSessionContext();
  if (!context) redirect('/sign-in');
  return context;
}
