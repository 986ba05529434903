// The role × route matrix: every API route and method, as owner, editor, reviewer and viewer of a team,
// as a member of another team and anonymously, with the exact status each must get. The expected status
// comes from the roles table (lib/auth/permissions.ts PERMISSIONS, CONTRACT §5) and the route list
// below: the action a route needs decides 2xx or 403; another team's member gets 404 (the contract
// hides other teams' sheets and teams), anonymous 401; a method a route does not serve is 405 for all.
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { PERMISSIONS, type TeamAction } from '@/lib/auth/permissions';
import { closeSequelize } from '@/lib/db/sequelize';
import { createUserWithTeam } from '@/lib/db/users';
import { Membership } from '@/models';
import { closeEvaluationPool } from '@/lib/evaluation/pool';
import { ApiClient } from '../support/http';
import { makeTeam, type Role } from '../support/review-fixtures';
import { sampleDocument } from '../support/sample-document';

type Who = Role | 'outsider' | 'anonymous';
const WHO: Who[] = ['owner', 'editor', 'reviewer', 'viewer', 'outsider', 'anonymous'];

type Ctx = { teamId: string; ids: Record<Role | 'outsider', string>; fresh: () => Promise<Fixture>; shared: Fixture };
type Fixture = { sheetId: string; commentId: string };
type Call = { path: string; body?: unknown };

/**
 * A route and method: `action` is the team action it needs (null: any signed-in user, 'public': anyone);
 * `scope` says what an outsider lacks ('team': another team's sheet or team, 404; 'user': nothing).
 */
type RouteCase = {
  method: string;
  route: string;
  action: TeamAction | null | 'public';
  scope: 'team' | 'user';
  ok: number;
  /** Needs a sheet of its own (the call changes it). */
  fresh?: boolean;
  /** Prepares the sheet (e.g. a review already requested), then builds the request. */
  call: (ctx: Ctx, who: Who, fixture: Fixture) => Promise<Call> | Call;
};

let counter = 0;
const unique = (label: string) => `${label}-${Date.now().toString(36)}-${++counter}@example.test`;

const ROUTES: RouteCase[] = [
  { method: 'GET', route: '/api/teams', action: null, scope: 'user', ok: 200, call: () => ({ path: '/api/teams' }) },
  { method: 'POST', route: '/api/teams', action: null, scope: 'user', ok: 201, call: () => ({ path: '/api/teams', body: { name: 'Matrix side team' } }) },
  { method: 'PUT', route: '/api/teams/current', action: 'read', scope: 'team', ok: 200, call: (c) => ({ path: '/api/teams/current', body: { teamId: c.teamId } }) },
  { method: 'GET', route: '/api/teams/{teamId}/members', action: 'read', scope: 'team', ok: 200, call: (c) => ({ path: `/api/teams/${c.teamId}/members` }) },
  { method: 'POST', route: '/api/teams/{teamId}/invitations', action: 'manage_members', scope: 'team', ok: 201, call: (c) => ({ path: `/api/teams/${c.teamId}/invitations`, body: { email: unique('invitee'), role: 'viewer' } }) },
  { method: 'PATCH', route: '/api/teams/{teamId}/members/{userId}', action: 'manage_members', scope: 'team', ok: 200, call: (c) => ({ path: `/api/teams/${c.teamId}/members/${c.ids.viewer}`, body: { role: 'viewer' } }) },
  { method: 'DELETE', route: '/api/teams/{teamId}/members/{userId}', action: 'manage_members', scope: 'team', ok: 200, call: async (c) => {
    // A member of its own for each case, so the owner's removal changes nothing the other cases use.
    const { user } = await createUserWithTeam({ email: unique('member'), password: 'long-enough-password', name: 'Passing Member' });
    await Membership.create({ teamId: c.teamId, userId: user.id, role: 'viewer' });
    return { path: `/api/teams/${c.teamId}/members/${user.id}` };
  } },
  { method: 'GET', route: '/api/sheets', action: 'read', scope: 'team', ok: 200, call: (c) => ({ path: `/api/sheets?team=${c.teamId}` }) },
  { method: 'POST', route: '/api/sheets', action: 'edit', scope: 'team', ok: 201, call: (c) => ({ path: '/api/sheets', body: { title: 'Matrix sheet', teamId: c.teamId } }) },
  { method: 'POST', route: '/api/sheets/import', action: 'edit', scope: 'team', ok: 201, call: (c) => ({ path: '/api/sheets/import', body: { document: sampleDocument(), teamId: c.teamId } }) },
  { method: 'GET', route: '/api/sheets/{id}', action: 'read', scope: 'team', ok: 200, call: (_c, _w, f) => ({ path: `/api/sheets/${f.sheetId}` }) },
  { method: 'DELETE', route: '/api/sheets/{id}', action: 'edit', scope: 'team', ok: 200, fresh: true, call: (_c, _w, f) => ({ path: `/api/sheets/${f.sheetId}` }) },
  { method: 'PUT', route: '/api/sheets/{id}/draft', action: 'edit', scope: 'team', ok: 200, fresh: true, call: async (c, _w, f) => {
    const owner = await client(c, 'owner');
    const version = (await owner.get(`/api/sheets/${f.sheetId}`)).body.draft.version;
    return { path: `/api/sheets/${f.sheetId}/draft`, body: { baseVersion: version, document: sampleDocument({ K: '0.005 m^2/yr' }) } };
  } },
  { method: 'POST', route: '/api/sheets/{id}/evaluate', action: 'read', scope: 'team', ok: 200, call: (_c, _w, f) => ({ path: `/api/sheets/${f.sheetId}/evaluate`, body: {} }) },
  { method: 'POST', route: '/api/sheets/{id}/evaluate (unsaved document)', action: 'read', scope: 'team', ok: 200, call: (_c, _w, f) => ({ path: `/api/sheets/${f.sheetId}/evaluate`, body: { document: sampleDocument({ K: '0.004 m^2/yr' }) } }) },
  { method: 'GET', route: '/api/sheets/{id}/preferences', action: 'read', scope: 'team', ok: 200, call: (_c, _w, f) => ({ path: `/api/sheets/${f.sheetId}/preferences` }) },
  { method: 'PUT', route: '/api/sheets/{id}/preferences', action: 'edit', scope: 'team', ok: 200, call: (_c, _w, f) => ({ path: `/api/sheets/${f.sheetId}/preferences`, body: { significantFigures: 5 } }) },
  { method: 'GET', route: '/api/sheets/{id}/revisions', action: 'read', scope: 'team', ok: 200, call: (_c, _w, f) => ({ path: `/api/sheets/${f.sheetId}/revisions` }) },
  { method: 'POST', route: '/api/sheets/{id}/revisions', action: 'edit', scope: 'team', ok: 201, fresh: true, call: (_c, _w, f) => ({ path: `/api/sheets/${f.sheetId}/revisions`, body: { baseRevision: 1, document: sampleDocument({ K: '0.006 m^2/yr' }), message: 'Second' } }) },
  { method: 'GET', route: '/api/sheets/{id}/revisions/{n}', action: 'read', scope: 'team', ok: 200, call: (_c, _w, f) => ({ path: `/api/sheets/${f.sheetId}/revisions/1` }) },
  { method: 'GET', route: '/api/sheets/{id}/export', action: 'read', scope: 'team', ok: 200, call: (_c, _w, f) => ({ path: `/api/sheets/${f.sheetId}/export` }) },
  { method: 'GET', route: '/api/compare', action: 'read', scope: 'team', ok: 200, call: (_c, _w, f) => ({ path: `/api/compare?from=${f.sheetId}:1&to=${f.sheetId}:1` }) },
  { method: 'POST', route: '/api/sheets/{id}/fork', action: 'edit', scope: 'team', ok: 201, call: (_c, _w, f) => ({ path: `/api/sheets/${f.sheetId}/fork`, body: { title: 'Matrix fork' } }) },
  { method: 'GET', route: '/api/sheets/{id}/comments', action: 'read', scope: 'team', ok: 200, call: (_c, _w, f) => ({ path: `/api/sheets/${f.sheetId}/comments` }) },
  { method: 'POST', route: '/api/sheets/{id}/comments', action: 'comment', scope: 'team', ok: 201, call: (_c, _w, f) => ({ path: `/api/sheets/${f.sheetId}/comments`, body: { blockId: 'b-hill', revision: 1, body: 'Matrix comment' } }) },
  { method: 'PATCH', route: '/api/comments/{id}', action: 'comment', scope: 'team', ok: 200, call: (_c, _w, f) => ({ path: `/api/comments/${f.commentId}`, body: { resolved: false } }) },
  { method: 'POST', route: '/api/sheets/{id}/review (request)', action: 'request_review', scope: 'team', ok: 200, fresh: true, call: (c, _w, f) => ({ path: `/api/sheets/${f.sheetId}/review`, body: { action: 'request', revision: 1, reviewerId: c.ids.reviewer } }) },
  { method: 'POST', route: '/api/sheets/{id}/review (check)', action: 'check', scope: 'team', ok: 200, fresh: true, call: async (c, who, f) => {
    // Requested by the editor; the author (owner) may not check their own revision, so a revision saved by the editor.
    const editor = await client(c, 'editor');
    const saved = await editor.post(`/api/sheets/${f.sheetId}/revisions`, { baseRevision: 1, document: sampleDocument({ K: '0.007 m^2/yr' }), message: 'By the editor' });
    expect(saved.status).toBe(201);
    const reviewerId = who === 'owner' ? c.ids.owner : c.ids.reviewer;
    expect((await editor.post(`/api/sheets/${f.sheetId}/review`, { action: 'request', revision: 2, reviewerId })).status).toBe(200);
    return { path: `/api/sheets/${f.sheetId}/review`, body: { action: 'check', revision: 2 } };
  } },
  { method: 'POST', route: '/api/sheets/{id}/review (approve)', action: 'approve', scope: 'team', ok: 200, fresh: true, call: async (c, _who, f) => {
    const editor = await client(c, 'editor');
    const reviewer = await client(c, 'reviewer');
    expect((await editor.post(`/api/sheets/${f.sheetId}/revisions`, { baseRevision: 1, document: sampleDocument({ K: '0.008 m^2/yr' }), message: 'By the editor' })).status).toBe(201);
    expect((await editor.post(`/api/sheets/${f.sheetId}/review`, { action: 'request', revision: 2, reviewerId: c.ids.reviewer })).status).toBe(200);
    expect((await reviewer.post(`/api/sheets/${f.sheetId}/review`, { action: 'check', revision: 2 })).status).toBe(200);
    return { path: `/api/sheets/${f.sheetId}/review`, body: { action: 'approve', revision: 2 } };
  } },
  { method: 'POST', route: '/api/evaluate', action: null, scope: 'user', ok: 200, call: () => ({ path: '/api/evaluate', body: { document: sampleDocument() } }) },
  { method: 'POST', route: '/api/quick', action: null, scope: 'user', ok: 200, call: () => ({ path: '/api/quick', body: { expr: '2 m + 30 cm' } }) },
  { method: 'GET', route: '/api/quick/recent', action: null, scope: 'user', ok: 200, call: () => ({ path: '/api/quick/recent' }) },
  { method: 'POST', route: '/api/block-name', action: null, scope: 'user', ok: 200, call: () => ({ path: '/api/block-name', body: { name: 'ridge' } }) },
  { method: 'POST', route: '/api/password-reset', action: 'public', scope: 'user', ok: 202, call: () => ({ path: '/api/password-reset', body: { email: unique('reset') } }) },
  { method: 'GET', route: '/api/catalog', action: 'public', scope: 'user', ok: 200, call: () => ({ path: '/api/catalog' }) },
  { method: 'POST', route: '/api/users', action: 'public', scope: 'user', ok: 201, call: () => ({ path: '/api/users', body: { email: unique('signup'), password: 'long-enough-password', name: 'Matrix Person' } }) },
];

/** Methods each path serves (from the list above), so every other method of the path is checked for 405. */
const PATHS: { path: (c: Ctx, f: Fixture) => string; route: string }[] = [
  { route: '/api/teams', path: () => '/api/teams' },
  { route: '/api/teams/current', path: () => '/api/teams/current' },
  { route: '/api/teams/{teamId}/members', path: (c) => `/api/teams/${c.teamId}/members` },
  { route: '/api/teams/{teamId}/invitations', path: (c) => `/api/teams/${c.teamId}/invitations` },
  { route: '/api/teams/{teamId}/members/{userId}', path: (c) => `/api/teams/${c.teamId}/members/${c.ids.viewer}` },
  { route: '/api/sheets', path: () => '/api/sheets' },
  { route: '/api/sheets/import', path: () => '/api/sheets/import' },
  { route: '/api/sheets/{id}', path: (_c, f) => `/api/sheets/${f.sheetId}` },
  { route: '/api/sheets/{id}/draft', path: (_c, f) => `/api/sheets/${f.sheetId}/draft` },
  { route: '/api/sheets/{id}/preferences', path: (_c, f) => `/api/sheets/${f.sheetId}/preferences` },
  { route: '/api/sheets/{id}/revisions', path: (_c, f) => `/api/sheets/${f.sheetId}/revisions` },
  { route: '/api/sheets/{id}/revisions/{n}', path: (_c, f) => `/api/sheets/${f.sheetId}/revisions/1` },
  { route: '/api/compare', path: () => '/api/compare' },
  { route: '/api/quick', path: () => '/api/quick' },
  { route: '/api/evaluate', path: () => '/api/evaluate' },
  { route: '/api/catalog', path: () => '/api/catalog' },
];
const SERVED: Record<string, string[]> = {};
for (const r of ROUTES) (SERVED[r.route.replace(/ \(.*\)$/, '')] ??= []).push(r.method);

function expected(route: RouteCase, who: Who): number {
  if (route.action === 'public') return route.ok;
  if (who === 'anonymous') return 401;
  if (route.action === null) return route.ok;
  if (who === 'outsider') return route.scope === 'team' ? 404 : route.ok;
  return (PERMISSIONS[route.action] as readonly string[]).includes(who) ? route.ok : 403;
}

const clients = new Map<Who, ApiClient>();
async function client(_c: Ctx, who: Who): Promise<ApiClient> {
  return clients.get(who)!;
}

let ctx: Ctx;

beforeAll(async () => {
  const team = await makeTeam();
  const emails: Record<string, string> = {};
  const ids = { outsider: team.outsider.id } as Record<Role | 'outsider', string>;
  for (const role of ['owner', 'editor', 'reviewer', 'viewer'] as const) {
    emails[role] = team.people[role].email;
    ids[role] = team.people[role].id;
  }
  emails.outsider = team.outsider.email;
  for (const who of WHO) {
    const c = new ApiClient();
    if (who !== 'anonymous') expect(await c.signIn(emails[who]!, 'long-enough-password')).toBe(true);
    clients.set(who, c);
  }
  const owner = clients.get('owner')!;
  const fresh = async (): Promise<Fixture> => {
    const created = await owner.post('/api/sheets', { title: 'Matrix sheet', teamId: team.teamId });
    expect(created.status).toBe(201);
    const sheetId = created.body.sheet.id;
    expect((await owner.post(`/api/sheets/${sheetId}/revisions`, { baseRevision: 0, document: sampleDocument(), message: 'First' })).status).toBe(201);
    const comment = await owner.post(`/api/sheets/${sheetId}/comments`, { blockId: 'b-hill', revision: 1, body: 'Matrix note' });
    expect(comment.status).toBe(201);
    return { sheetId, commentId: comment.body.comment.id };
  };
  ctx = { teamId: team.teamId, ids, fresh, shared: await fresh() };
});

afterAll(async () => {
  await closeEvaluationPool();
  await closeSequelize();
});

describe('the role × route matrix', () => {
  it('should cover every route, method and person (about 200 cases)', () => {
    const served = ROUTES.length * WHO.length;
    const refused = PATHS.reduce((n, p) => n + ['GET', 'POST', 'PUT', 'PATCH', 'DELETE'].filter((m) => !SERVED[p.route]?.includes(m)).length, 0) * WHO.length;
    expect(served + refused).toBeGreaterThanOrEqual(200);
  });

  for (const route of ROUTES) {
    it(`${route.method} ${route.route}: ${WHO.map((w) => `${w} ${expected(route, w)}`).join(', ')}`, async () => {
      const got: Record<string, number> = {};
      const want: Record<string, number> = {};
      for (const who of WHO) {
        const fixture = route.fresh ? await ctx.fresh() : ctx.shared;
        const call = await route.call(ctx, who, fixture);
        const answer = await clients.get(who)!.request(route.method, call.path, call.body);
        got[who] = answer.status;
        want[who] = expected(route, who);
        if (answer.status >= 400) expect(typeof answer.body?.error?.code, `${route.route} as ${who}`).toBe('string');
      }
      expect(got).toEqual(want);
    });
  }

  it('should answer 405 in the contract shape to every method a path does not serve, for everyone', async () => {
    const got: string[] = [];
    const want: string[] = [];
    for (const p of PATHS) {
      for (const method of ['GET', 'POST', 'PUT', 'PATCH', 'DELETE'].filter((m) => !SERVED[p.route]?.includes(m))) {
        for (const who of WHO) {
          const answer = await clients.get(who)!.request(method, p.path(ctx, ctx.shared), method === 'GET' ? undefined : {});
          got.push(`${method} ${p.route} as ${who}: ${answer.status} ${answer.body?.error?.code}`);
          want.push(`${method} ${p.route} as ${who}: 405 method_not_allowed`);
        }
      }
    }
    expect(got).toEqual(want);
    expect(got.length).toBeGreaterThanOrEqual(60);
  });
});
