import type { Metadata } from 'next';
import { MembersPanel } from '@/components/team/members-panel';
import { describeActivity } from '@/lib/activity-words';
import { requirePageUser } from '@/lib/auth/page';
import { roleAllows } from '@/lib/auth/permissions';
import { listActivityByTeam } from '@/lib/db/activity';
import { listMembersByTeam, listPendingInvitationsByTeam } from '@/lib/db/members';
import { formatMinute } from '@/lib/format/dates';

export const metadata: Metadata = { title: 'Team' };

export default async function TeamPage() {
  const { user, current } = await requirePageUser();
  if (!current) return <p className="text-slate">You are not a member of any team yet.</p>;
  const canManage = roleAllows(current.role, 'manage_members');
  const [members, invitations, activity] = await Promise.all([
    listMembersByTeam({ teamId: current.id }),
    canManage ? listPendingInvitationsByTeam({ teamId: current.id }) : Promise.resolve([]),
    listActivityByTeam({ teamId: current.id, limit: 60 }),
  ]);
  return (
    <div className="grid gap-6 lg:grid-cols-[minmax(0,3fr)_minmax(0,2fr)]">
      <div className="flex flex-col gap-4">
        <div>
          <h1 className="text-[20px] font-semibold tracking-tight">{current.name}</h1>
          <p className="text-[13px] text-slate">Your role: {current.role}</p>
        </div>
        <MembersPanel teamId={current.id} members={members.items} invitations={invitations} canManage={canManage} currentUserId={user.id} />
      </div>
      <section aria-labelledby="activity-heading" className="flex flex-col gap-2">
        <h2 id="activity-heading" className="text-[15px] font-semibold">
          Activity
        </h2>
        {activity.length === 0 ? (
          <p className="text-[13px] text-slate">Nothing yet.</p>
        ) : (
          <ol className="flex flex-col divide-y divide-rule rounded-[4px] border border-rule bg-chalk text-[13px]">
            {activity.map((a) => (
              <li key={a.id} className="px-3 py-2">
                <span className="font-medium">{a.actor?.name ?? 'Someone'}</span> {describeActivity(a)}
                <time dateTime={a.createdAt} className="num block text-[12px] text-slate">
                  {formatMinute(a.createdAt)} UTC
                </time>
              </li>
            ))}
          </ol>
        )}
      </section>
    </div>
  );
}
