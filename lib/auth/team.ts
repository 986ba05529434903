import 'server-only';
import { notFound } from '@/lib/errors';
import { getCurrentTeam } from '@/lib/db/teams';
import type { TeamAction } from './permissions';
import { requireTeamRole } from './guard';
import { sessionLookedUp } from './session';

/** The team a request acts on: the one named, else the user's current team, checked for the action. */
export async function resolveTeam({
  userId,
  teamId,
  action,
}: {
  userId: string;
  teamId?: string;
  action: TeamAction;
}): Promise<{ teamId: string }> {
  const id = teamId ?? (await currentTeamId(userId));
  if (!id) throw notFound('Team');
  await requireTeamRole({ userId, teamId: id, action });
  return { teamId: id };
}

/** The caller's current team from this request's session look-up, else a query. */
async function currentTeamId(userId: string): Promise<string | undefined> {
  const context = await sessionLookedUp()?.catch(() => null);
  if (context && context.user.id === userId) return context.current?.id;
  return (await getCurrentTeam({ userId }))?.id;
}
