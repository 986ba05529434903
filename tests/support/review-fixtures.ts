// Fixtures for the revision, review, comment, fork and team suites: a team with one person in each role
// and a small valid sheet, written straight through lib/db (real PostgreSQL).
import { afterAll, beforeAll } from 'vitest';
import { Membership, Team } from '@/models';
import { db } from '@/lib/db';
import { closeSequelize } from '@/lib/db/sequelize';
import { closeEvaluationPool } from '@/lib/evaluation/pool';
import { AppError } from '@/lib/errors';
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
    const { user } = await createUserWithTeam({ email: `${role}-${tag}@example.test`, password: 'long-enough-password', name: `${role.charAt(0).toUpperCase()}${role.slice(1)} ${tag.replace(/[^a-z]/g, '')}` });
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

export type TeamFixture = Awaited<ReturnType<typeof makeTeam>>;

// Registers the suite's hooks: a fresh team before the tests, and closing the database
// (and the evaluation worker pool, when the suite evaluates sheets) after them.
// Read teamId / people / outsider inside tests or later hooks, never at collection time.
export function useTeamFixture(options: { closePool?: boolean } = {}): TeamFixture {
  let team: TeamFixture | undefined;
  beforeAll(async () => {
    team = await makeTeam();
  });
  afterAll(async () => {
    if (options.closePool) await closeEvaluationPool();
    await closeSequelize();
  });
  const current = (): TeamFixture => {
    if (!team) throw new Error('the team fixture is read before its beforeAll hook ran');
    return team;
  };
  return {
    get teamId() {
      return current().teamId;
    },
    get people() {
      return current().people;
    },
    get outsider() {
      return current().outsider;
    },
  };
}

// Awaits a promise that must fail with an AppError and returns that error (anything else is rethrown).
export async function rejection(promise: Promise<unknown>): Promise<AppError> {
  try {
    await promise;
  } catch (error) {
    if (error instanceof AppError) return error;
    throw error;
  }
  throw new Error('expected the promise to be rejected');
}
