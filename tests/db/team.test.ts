import { beforeAll, describe, expect, it } from 'vitest';
import { db } from '@/lib/db';
import { acceptInvitation, createInvitation, getInvitationPreview } from '@/lib/db/invitations';
import { listMembersByTeam, removeMember, updateMemberRole } from '@/lib/db/members';
import { completePasswordReset, createPasswordReset } from '@/lib/db/password-resets';
import { hashToken } from '@/lib/db/tokens';
import { createUserWithTeam, verifyCredentials } from '@/lib/db/users';
import { Invitation, PasswordReset } from '@/models';
import { makeTeam, rejection, useTeamFixture } from '../support/review-fixtures';

describe('team members (lib/db/members)', () => {
  const team = useTeamFixture();

  it('should keep at least one owner: demoting or removing the last owner is 409 and changes nothing', async () => {
    const demote = await rejection(updateMemberRole({ teamId: team.teamId, actorId: team.people.owner.id, userId: team.people.owner.id, role: 'editor' }));
    expect(demote.status).toBe(409);
    expect(demote.message).toMatch(/at least one owner/);
    const remove = await rejection(removeMember({ teamId: team.teamId, actorId: team.people.owner.id, userId: team.people.owner.id }));
    expect(remove.status).toBe(409);
    const members = await listMembersByTeam({ teamId: team.teamId });
    expect(members.items.find((m) => m.user.id === team.people.owner.id)?.role).toBe('owner');
  });

  it('should change roles and remove members when another owner remains', async () => {
    await updateMemberRole({ teamId: team.teamId, actorId: team.people.owner.id, userId: team.people.editor.id, role: 'owner' });
    await updateMemberRole({ teamId: team.teamId, actorId: team.people.editor.id, userId: team.people.owner.id, role: 'viewer' });
    await removeMember({ teamId: team.teamId, actorId: team.people.editor.id, userId: team.people.viewer.id });
    const members = await listMembersByTeam({ teamId: team.teamId });
    expect(members.items.map((m) => [m.user.id, m.role])).toEqual([
      [team.people.editor.id, 'owner'],
      [team.people.reviewer.id, 'reviewer'],
      [team.people.owner.id, 'viewer'],
    ]);
  });
});

describe('invitations (lib/db/invitations)', () => {
  let teamId: string;
  let owner: { id: string };
  beforeAll(async () => {
    db();
    const team = await makeTeam();
    teamId = team.teamId;
    owner = team.people.owner;
  });

  it('should store only the SHA-256 of a 32-byte token, accept once for the invited address, then refuse with 400', async () => {
    const email = `invitee-${Date.now()}@example.test`;
    const created = await createInvitation({ teamId, invitedBy: owner.id, email, role: 'reviewer' });
    expect(Buffer.from(created.token, 'base64url')).toHaveLength(32);
    const row = await Invitation.findByPk(created.invitation.id);
    expect(row?.tokenHash).toBe(hashToken(created.token));
    expect(row?.tokenHash).not.toContain(created.token);
    expect(new Date(row!.expiresAt).getTime() - Date.now()).toBeGreaterThan(7 * 24 * 3600_000 - 60_000);

    const stranger = await createUserWithTeam({ email: `stranger-${Date.now()}@example.test`, password: 'long-enough-password', name: 'Stranger' });
    const wrongPerson = await rejection(acceptInvitation({ token: created.token, user: stranger.user }));
    expect(wrongPerson.status).toBe(403);

    const invitee = await createUserWithTeam({ email, password: 'long-enough-password', name: 'Invitee' });
    expect((await getInvitationPreview({ token: created.token })).state).toBe('open');
    const accepted = await acceptInvitation({ token: created.token, user: invitee.user });
    expect(accepted).toMatchObject({ teamId, role: 'reviewer' });
    expect((await listMembersByTeam({ teamId })).items.some((m) => m.user.id === invitee.user.id && m.role === 'reviewer')).toBe(true);

    const again = await rejection(acceptInvitation({ token: created.token, user: invitee.user }));
    expect(again.status).toBe(400);
    expect(again.message).toMatch(/already been used/);
    expect((await getInvitationPreview({ token: created.token })).state).toBe('used');
  });

  it('should refuse an expired invitation with 400 and a plain message', async () => {
    const email = `late-${Date.now()}@example.test`;
    const created = await createInvitation({ teamId, invitedBy: owner.id, email, role: 'viewer' });
    await Invitation.update({ expiresAt: new Date(Date.now() - 1000) }, { where: { id: created.invitation.id } });
    const late = await createUserWithTeam({ email, password: 'long-enough-password', name: 'Late' });
    const error = await rejection(acceptInvitation({ token: created.token, user: late.user }));
    expect(error.status).toBe(400);
    expect(error.message).toBe('This invitation has expired. Ask the team owner for a new one.');
    expect((await listMembersByTeam({ teamId })).items.some((m) => m.user.id === late.user.id)).toBe(false);
  });

  it('should refuse to invite someone who is already a member (409)', async () => {
    const team = await makeTeam();
    const error = await rejection(createInvitation({ teamId: team.teamId, invitedBy: team.people.owner.id, email: team.people.viewer.email.toUpperCase(), role: 'editor' }));
    expect(error.status).toBe(409);
  });
});

describe('password resets (lib/db/password-resets)', () => {
  it('should return nothing for an unknown address', async () => {
    expect(await createPasswordReset({ email: 'nobody-here@example.test' })).toBeNull();
  });

  it('should set the new password once; a second use and an expired token are 400', async () => {
    const email = `forgetful-${Date.now()}@example.test`;
    await createUserWithTeam({ email, password: 'the-old-password', name: 'Forgetful' });
    const reset = await createPasswordReset({ email: email.toUpperCase() });
    expect(reset?.email).toBe(email);
    const row = await PasswordReset.findOne({ where: { tokenHash: hashToken(reset!.token) } });
    expect(new Date(row!.expiresAt).getTime() - Date.now()).toBeLessThanOrEqual(3600_000);
    expect(new Date(row!.expiresAt).getTime() - Date.now()).toBeGreaterThan(3500_000);

    await completePasswordReset({ token: reset!.token, password: 'the-new-password' });
    expect(await verifyCredentials({ email, password: 'the-new-password' })).toMatchObject({ email });
    expect(await verifyCredentials({ email, password: 'the-old-password' })).toBeNull();
    const reuse = await rejection(completePasswordReset({ token: reset!.token, password: 'a-third-password' }));
    expect(reuse.status).toBe(400);
    expect(await verifyCredentials({ email, password: 'a-third-password' })).toBeNull();

    const second = await createPasswordReset({ email });
    await PasswordReset.update({ expiresAt: new Date(Date.now() - 1000) }, { where: { tokenHash: hashToken(second!.token) } });
    const expired = await rejection(completePasswordReset({ token: second!.token, password: 'a-fourth-password' }));
    expect(expired.status).toBe(400);
    expect(expired.message).toMatch(/used or has expired/);
  });
});
