'use client';

import { useRouter } from 'next/navigation';
import { useState, type FormEvent } from 'react';
import { Button } from '@/components/ui/button';
import { Field } from '@/components/ui/field';
import type { TeamRole as Role } from '@/models';
import { ApiError, apiFetch, type ApiRequest } from '@/lib/api-client';
import { formatDay } from '@/lib/format/dates';
import type { PublicUser as Person } from '@/lib/db/users';

type Member = { user: Person; role: Role; joinedAt: string };
type Pending = { id: string; email: string; role: Role; expiresAt: string };

const ROLES: { value: Role; label: string; help: string }[] = [
  { value: 'owner', label: 'Owner', help: 'everything, including members and approval' },
  { value: 'editor', label: 'Editor', help: 'edits sheets, saves revisions, asks for review' },
  { value: 'reviewer', label: 'Reviewer', help: 'comments, checks or returns revisions' },
  { value: 'viewer', label: 'Viewer', help: 'reads and exports' },
];

/** What the team routes answer: the contract's error shape, or an invitation with its delivery state. */
type TeamResponse = {
  error?: { message: string };
  mailDelivered?: boolean;
  invitation?: { email: string };
  link?: string;
} | null;

async function send(url: string, method: ApiRequest['method'], body?: unknown): Promise<{ ok: boolean; data: TeamResponse }> {
  try {
    return { ok: true, data: await apiFetch<TeamResponse>(url, { method, body }) };
  } catch (error) {
    // The contract's error body (a network failure has none: the callers' own words are shown).
    return { ok: false, data: error instanceof ApiError ? (error.body as TeamResponse) : null };
  }
}

/** Members and roles; owners change roles, remove people and invite by e-mail. */
export function MembersPanel({
  teamId,
  members,
  invitations,
  canManage,
  currentUserId,
}: {
  teamId: string;
  members: Member[];
  invitations: Pending[];
  canManage: boolean;
  currentUserId: string;
}) {
  const router = useRouter();
  const [message, setMessage] = useState<{ tone: 'ok' | 'error'; text: string; link?: string } | null>(null);
  const [inviteError, setInviteError] = useState<string | undefined>();
  const [busy, setBusy] = useState(false);

  async function changeRole(member: Member, role: Role) {
    setBusy(true);
    const { ok, data } = await send(`/api/teams/${teamId}/members/${member.user.id}`, 'PATCH', { role });
    setBusy(false);
    setMessage(ok ? { tone: 'ok', text: `${member.user.name} is now ${role}.` } : { tone: 'error', text: data?.error?.message ?? 'The role could not be changed.' });
    router.refresh();
  }

  async function remove(member: Member) {
    if (!window.confirm(`Remove ${member.user.name} (${member.user.email}) from the team?`)) return;
    setBusy(true);
    const { ok, data } = await send(`/api/teams/${teamId}/members/${member.user.id}`, 'DELETE');
    setBusy(false);
    setMessage(ok ? { tone: 'ok', text: `${member.user.name} was removed.` } : { tone: 'error', text: data?.error?.message ?? 'The member could not be removed.' });
    router.refresh();
  }

  async function invite(event: FormEvent<HTMLFormElement>) {
    event.preventDefault();
    const formElement = event.currentTarget;
    const form = new FormData(formElement);
    setBusy(true);
    setInviteError(undefined);
    const { ok, data } = await send(`/api/teams/${teamId}/invitations`, 'POST', { email: String(form.get('email') ?? ''), role: String(form.get('role') ?? 'viewer') });
    setBusy(false);
    if (!ok) {
      setInviteError((data?.error?.message ?? 'The invitation could not be made.').replace(/^email: /, ''));
      return;
    }
    formElement.reset();
    const address = data?.invitation?.email ?? String(form.get('email') ?? '');
    setMessage(
      data?.mailDelivered
        ? { tone: 'ok', text: `Invitation e-mailed to ${address}.` }
        : { tone: 'error', text: `The invitation was made, but the e-mail could not be sent. Pass this link to ${address}:`, link: data?.link },
    );
    router.refresh();
  }

  return (
    <section aria-labelledby="members-heading" className="flex flex-col gap-3">
      <h2 id="members-heading" className="text-[15px] font-semibold">
        Members <span className="num text-slate">({members.length})</span>
      </h2>
      {message ? (
        <p role={message.tone === 'error' ? 'alert' : 'status'} className={`text-[13px] ${message.tone === 'error' ? 'text-oxide' : 'text-moss'}`}>
          <span aria-hidden="true">{message.tone === 'error' ? '✕ ' : '✓ '}</span>
          {message.text}
          {message.link ? <code className="num ml-1 break-all">{message.link}</code> : null}
        </p>
      ) : null}
      <div className="overflow-x-auto rounded-[4px] border border-rule bg-chalk">
        <table className="w-full border-collapse text-[13px]">
          <thead>
            <tr className="border-b border-rule text-left text-[12px] text-slate">
              <th scope="col" className="px-3 py-2 font-medium">Name</th>
              <th scope="col" className="px-3 py-2 font-medium">E-mail</th>
              <th scope="col" className="px-3 py-2 font-medium">Role</th>
              <th scope="col" className="px-3 py-2 font-medium">Joined</th>
              {canManage ? <th scope="col" className="px-3 py-2 font-medium"><span className="sr-only">Actions</span></th> : null}
            </tr>
          </thead>
          <tbody>
            {members.map((m) => (
              <tr key={m.user.id} className="border-b border-rule last:border-0" data-member={m.user.email}>
                <td className="px-3 py-2 font-medium">
                  {m.user.name}
                  {m.user.id === currentUserId ? <span className="ml-1 text-[12px] text-slate">(you)</span> : null}
                </td>
                <td className="px-3 py-2">{m.user.email}</td>
                <td className="px-3 py-2">
                  {canManage ? (
                    <>
                      <label htmlFor={`role-${m.user.id}`} className="sr-only">
                        Role of {m.user.name}
                      </label>
                      <select
                        id={`role-${m.user.id}`}
                        value={m.role}
                        disabled={busy}
                        onChange={(e) => changeRole(m, e.target.value as Role)}
                        className="h-7 rounded-[3px] border border-rule bg-chalk px-1.5 text-[13px]"
                      >
                        {ROLES.map((r) => (
                          <option key={r.value} value={r.value}>
                            {r.label}
                          </option>
                        ))}
                      </select>
                    </>
                  ) : (
                    ROLES.find((r) => r.value === m.role)?.label
                  )}
                </td>
                <td className="num px-3 py-2">{formatDay(m.joinedAt)}</td>
                {canManage ? (
                  <td className="px-3 py-2 text-right">
                    <Button variant="danger" disabled={busy} onClick={() => remove(m)} aria-label={`Remove ${m.user.name}`}>
                      Remove
                    </Button>
                  </td>
                ) : null}
              </tr>
            ))}
          </tbody>
        </table>
      </div>
      <ul className="text-[12px] text-slate">
        {ROLES.map((r) => (
          <li key={r.value}>
            <strong className="font-medium text-basalt">{r.label}</strong>: {r.help}
          </li>
        ))}
      </ul>

      {canManage ? (
        <>
          <form onSubmit={invite} className="flex flex-wrap items-end gap-2 rounded-[4px] border border-rule bg-chalk p-3" noValidate aria-labelledby="invite-heading">
            <h3 id="invite-heading" className="w-full text-[14px] font-semibold">
              Invite someone
            </h3>
            <div className="w-72">
              <Field label="E-mail" name="email" type="email" required error={inviteError} />
            </div>
            <div className="flex flex-col gap-1">
              <label htmlFor="invite-role" className="text-[13px] font-medium">
                Role
              </label>
              <select id="invite-role" name="role" defaultValue="viewer" className="h-9 rounded-[3px] border border-rule bg-chalk px-2 text-[14px]">
                {ROLES.map((r) => (
                  <option key={r.value} value={r.value}>
                    {r.label}
                  </option>
                ))}
              </select>
            </div>
            <Button type="submit" variant="primary" disabled={busy} className="h-9">
              Send invitation
            </Button>
            <p className="w-full text-[12px] text-slate">The link works once and expires in 7 days.</p>
          </form>
          {invitations.length ? (
            <div>
              <h3 className="text-[14px] font-semibold">Open invitations</h3>
              <ul className="text-[13px]">
                {invitations.map((i) => (
                  <li key={i.id}>
                    {i.email} · {i.role} · <span className="text-slate">expires {formatDay(i.expiresAt)}</span>
                  </li>
                ))}
              </ul>
            </div>
          ) : null}
        </>
      ) : null}
    </section>
  );
}
