import 'server-only';
import { notFound } from '@/lib/errors';
import { getCurrentTeam } from '@/lib/db/teams';
import type { TeamAction } from './permissions';
import { requireTeamRole } from './guard';

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
  const id = teamId ?? (await getCurrentTeam({ userId }))?.id;
  if (!id) throw notFound('Team');
  await requireTeamRole({ userId, teamId: id, action });
  return { teamId: id };
}
