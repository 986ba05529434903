// Fixtures for the revision, review, comment and team suites: a team with one person in each role
// and a small valid sheet, written straight through lib/db (real PostgreSQL).
import { Membership, Team } from '@/models';
import { db } from '@/lib/db';
import { createSheet } from '@/lib/db/sheets';
import { createUserWithTeam, type PublicUser } from '@/lib/db/users';
import { sampleDocument } from './sample-document';

export { sampleDocument };

export type Role = 'owner' | 'editor' | 'reviewer' | 'viewer';

let counter = 0;
const unique = () => `${Date.now().toString(36)}-${process.pid}-${++counter}`;

export async function makeTeam(): Promise<{ teamId: string; people: Record<Role, PublicUser>; outsider: PublicUser }> {
  db();
  const tag = unique();
  const people = {} as Record<Role, PublicUser>;
  for (const role of ['owner', 'editor', 'reviewer', 'viewer'] as const) {
    const { user } = await createUserWithTeam({ email: `${role}-${tag}@example.test`, password: 'long-enough-password', name: `${role[0].toUpperCase()}${role.slice(1)} ${tag.replace(/[^a-z]/g, '')}` });
    people[role] = user;
  }
  const { user: outsider } = await createUserWithTeam({ email: `outsider-${tag}@example.test`, password: 'long-enough-password', name: 'Outsider Person' });
  const team = await Team.create({ name: `Review team ${tag}` });
  for (const role of ['owner', 'editor', 'reviewer', 'viewer'] as const) {
    await Membership.create({ teamId: team.id, userId: people[role].id, role });
  }
  return { teamId: team.id, people, outsider };
}

export async function makeSheet(teamId: string, userId: string, document = sampleDocument()) {
  return createSheet({ teamId, userId, title: document.title, site: document.site, document });
}
