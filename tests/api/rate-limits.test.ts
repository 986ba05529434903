// Rate limits (CONTRACT §3) on the real app: two instances of the built app with limits on
// (DENUDATA_RATE_LIMITS=on; the shared test app runs with them off), on the same database, so every
// limit here is also shown to hold across instances. Each test sends its own client address
// (X-Forwarded-For, which the app takes as the client's) so the per-address limits of one test do not
// touch another's. The window's end is moved into the past in the shared table to show that a limit
// lifts when its window passes.
import { QueryTypes } from 'sequelize';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { closeSequelize, getSequelize } from '@/lib/db/sequelize';
import { fetchablePorts, startAppInstance, type AppInstance } from '../support/app-instance';
import { launchBrowser } from '../support/browser';
import { ApiClient, appUrl } from '../support/http';
import { sampleDocument } from '../support/sample-document';

// Moved past the ports fetch refuses: DENUDATA_TEST_PORT=3190 gave 4190, the sieve port, and every try "failed".
const basePort = fetchablePorts(Number(process.env.DENUDATA_TEST_PORT ?? '3100') + 1000, 2);
let a: AppInstance;
let b: AppInstance;

let counter = 0;
const address = () => `198.51.100.${(++counter % 250) + 1}, 10.9.${process.pid % 250}.${counter % 250}`;
const email = (label: string) => `${label}-${Date.now().toString(36)}-${++counter}@example.test`;

async function signUp(base: string, headers: Record<string, string>, who = email('limits')) {
  const client = new ApiClient(base, headers);
  const created = await client.post('/api/users', { email: who, password: 'long-enough-password', name: 'Limit Tester' });
  return { client, created, email: who };
}

/** Ends the current window of a limit's key in the shared table, as the passing of time would. */
async function endWindow(key: string) {
  await getSequelize().query('UPDATE rate_limits SET expire = $1 WHERE key = $2', { bind: [Date.now() - 1, key] });
}

/** Sets a key's count as if `points` events had happened in the current window (for limits of 50 and 120). */
async function fill(key: string, points: number, seconds: number) {
  await getSequelize().query(
    'INSERT INTO rate_limits (key, points, expire) VALUES ($1, $2, $3) ON CONFLICT (key) DO UPDATE SET points = $2, expire = $3',
    { bind: [key, points, Date.now() + seconds * 1000] },
  );
}

function expectLimited(answer: { status: number; body: any; headers?: Headers }, label: string) {
  expect(answer.status, label).toBe(429);
  expect(answer.body?.error?.code, label).toBe('rate_limited');
  expect(answer.body?.error?.message, label).toMatch(/Try again in \d+ (second|minute|hour)s?/);
  if (answer.headers) expect(Number(answer.headers.get('retry-after')), label).toBeGreaterThan(0);
}

/** One instance with rate limits on. */
const startInstance = (port: number) =>
  startAppInstance({ port, env: { DENUDATA_RATE_LIMITS: 'on', DENUDATA_APP_URL: `http://127.0.0.1:${port}` }, quiet: true });

beforeAll(async () => {
  const started = await Promise.allSettled([basePort, basePort + 1].map((port) => startInstance(port)));
  // One instance failing to start must not leave the other running: its job workers would take later suites'
  // mail and write links to its own address.
  const failed = started.find((result) => result.status === 'rejected');
  if (failed) {
    await Promise.all(started.map((result) => (result.status === 'fulfilled' ? result.value.stop() : undefined)));
    throw failed.reason;
  }
  [a, b] = started.map((result) => (result as PromiseFulfilledResult<AppInstance>).value) as [AppInstance, AppInstance];
}, 240_000);

afterAll(async () => {
  await Promise.all([a?.stop(), b?.stop()]);
  await closeSequelize();
});

describe('sign-in: 10 failures per account per 15 minutes', () => {
  it('should refuse the 11th attempt with 429 (the right password too) on either instance until the window passes', async () => {
    const headers = { 'x-forwarded-for': address() };
    const { email: who } = await signUp(a.origin, headers);
    for (let i = 0; i < 10; i++) {
      const attempt = await new ApiClient(i % 2 ? b.origin : a.origin, headers).signInAttempt(who, 'a-wrong-password');
      expect(attempt.signedIn, `attempt ${i + 1}`).toBe(false);
      expect(attempt.status, `attempt ${i + 1}`).not.toBe(429);
    }
    for (const base of [a.origin, b.origin]) {
      const wrong = await new ApiClient(base, headers).signInAttempt(who, 'a-wrong-password');
      expect(wrong.status).toBe(429);
      const right = await new ApiClient(base, headers).signInAttempt(who, 'long-enough-password');
      expect(right.status).toBe(429);
      expect(right.signedIn).toBe(false);
      expect(Number(right.retryAfter)).toBeGreaterThan(14 * 60);
      expect(Number(right.retryAfter)).toBeLessThanOrEqual(15 * 60);
      expect(right.body.error.code).toBe('rate_limited');
      // The sign-in form reads next-auth's url: error=rate_limited:<seconds> (components/auth/sign-in-form.tsx).
      expect(right.body.url).toMatch(/\/sign-in\?error=rate_limited:\d+$/);
    }
    // The sign-in form says plainly when to try again.
    const browser = await launchBrowser();
    try {
      const page = await browser.newPage({ extraHTTPHeaders: headers });
      await page.goto(`${a.origin}/sign-in`);
      await page.getByLabel('E-mail').fill(who);
      await page.getByLabel('Password').fill('long-enough-password');
      await page.getByRole('button', { name: 'Sign in' }).click();
      const message = page.locator('form [role="alert"]');
      await message.waitFor();
      expect(await message.textContent()).toMatch(/Too many failed sign-ins\. Try again in 1[45] minutes \(at \d\d:\d\d/);
    } finally {
      await browser.close();
    }
    await endWindow(`signInAccount:${who}`);
    expect((await new ApiClient(b.origin, headers).signInAttempt(who, 'long-enough-password')).signedIn).toBe(true);
  }, 120_000);
});

describe('sign-in: 50 failures per client address per 15 minutes', () => {
  it('should refuse any account from an address after 50 failures from it, and not another address', async () => {
    const headers = { 'x-forwarded-for': address() };
    const { email: who } = await signUp(a.origin, { 'x-forwarded-for': address() });
    // 50 failures against 10 different (unknown) accounts, 5 each: no account reaches its own limit.
    for (let i = 0; i < 50; i++) {
      const attempt = await new ApiClient(i % 2 ? b.origin : a.origin, headers).signInAttempt(`nobody-${i % 10}-${counter}@example.test`, 'wrong-password');
      expect(attempt.status, `failure ${i + 1}`).not.toBe(429);
    }
    const blocked = await new ApiClient(a.origin, headers).signInAttempt(who, 'long-enough-password');
    expect(blocked.status).toBe(429);
    expect((await new ApiClient(b.origin, { 'x-forwarded-for': address() }).signInAttempt(who, 'long-enough-password')).signedIn).toBe(true);
  }, 180_000);
});

describe('sign-up: 10 per address per hour', () => {
  it('should allow 10 sign-ups from an address across both instances and refuse the 11th with Retry-After', async () => {
    const headers = { 'x-forwarded-for': address() };
    for (let i = 0; i < 10; i++) expect((await signUp(i % 2 ? b.origin : a.origin, headers)).created.status, `sign-up ${i + 1}`).toBe(201);
    const refused = await signUp(a.origin, headers);
    expectLimited(refused.created, 'sign-up 11');
    expect(Number(refused.created.headers.get('retry-after'))).toBeGreaterThan(3500);
    expect((await signUp(b.origin, { 'x-forwarded-for': address() })).created.status).toBe(201);
  });

  it('should count by the peer the server saw, never by a peer header the client sends (lib/http/peer.ts)', async () => {
    // From loopback (a trusted peer, as a proxy on the same host would be) the forwarded address counts; a
    // client's own x-denudata-peer is replaced by the server, so the made-up 192.0.2.x never becomes the key.
    const forwarded = `10.77.${process.pid % 250}.${(Date.now() % 250) + 1}`;
    const spoofed = `192.0.2.${(Date.now() % 250) + 1}`;
    const { created } = await signUp(a.origin, { 'x-forwarded-for': forwarded, 'x-denudata-peer': spoofed });
    expect(created.status).toBe(201);
    const rows = await getSequelize().query<{ key: string; points: number }>('SELECT key, points FROM rate_limits WHERE key = ANY($1)', {
      bind: [[`signUpAddress:${forwarded}`, `signUpAddress:${spoofed}`]],
      type: QueryTypes.SELECT,
    });
    expect(rows).toEqual([{ key: `signUpAddress:${forwarded}`, points: 1 }]);
  });
});

describe('password-reset requests: 5 per e-mail and 20 per address per hour', () => {
  it('should refuse the 6th request for one address (any case) and leave other addresses alone', async () => {
    const target = email('reset');
    for (let i = 0; i < 5; i++) {
      const client = new ApiClient(i % 2 ? b.origin : a.origin, { 'x-forwarded-for': address() });
      expect((await client.post('/api/password-reset', { email: i === 3 ? target.toUpperCase() : target })).status, `request ${i + 1}`).toBe(202);
    }
    const sixth = await new ApiClient(a.origin, { 'x-forwarded-for': address() }).post('/api/password-reset', { email: target });
    expectLimited(sixth, 'reset 6');
  });

  it('should refuse the 21st request from one client address', async () => {
    const client = (base: string) => new ApiClient(base, { 'x-forwarded-for': '203.0.113.77' });
    const stamp = Date.now().toString(36);
    for (let i = 0; i < 20; i++) expect((await client(i % 2 ? b.origin : a.origin).post('/api/password-reset', { email: `r${i}-${stamp}@example.test` })).status).toBe(202);
    expectLimited(await client(a.origin).post('/api/password-reset', { email: `r21-${stamp}@example.test` }), 'reset 21');
  });
});

describe('invitations: 50 per team per day', () => {
  it('should count invitations per team and refuse the 51st with 429', async () => {
    const { client, created } = await signUp(a.origin, { 'x-forwarded-for': address() });
    await client.signIn(created.body.user.email, 'long-enough-password');
    const teamId = (await client.get('/api/teams')).body.items[0].id;
    expect((await client.post(`/api/teams/${teamId}/invitations`, { email: email('invitee'), role: 'viewer' })).status).toBe(201);
    const [row] = (await getSequelize().query('SELECT points FROM rate_limits WHERE key = $1', { bind: [`invitationTeam:${teamId}`] }))[0] as { points: number }[];
    expect(row!.points).toBe(1);
    // 49 more, as counted by the store (sending 49 e-mails adds nothing to the test).
    await fill(`invitationTeam:${teamId}`, 50, 24 * 3600);
    const refused = await client.post(`/api/teams/${teamId}/invitations`, { email: email('invitee'), role: 'viewer' });
    expectLimited(refused, 'invitation 51');
    expect(Number(refused.headers.get('retry-after'))).toBeGreaterThan(23 * 3600);
  });
});

describe('evaluations and quick calculations: 120 per user per minute', () => {
  it('should count quick calculations and evaluations together per user, on both instances, and refuse the 121st', async () => {
    const { created } = await signUp(a.origin, { 'x-forwarded-for': address() });
    const who = created.body.user;
    const onA = new ApiClient(a.origin, { 'x-forwarded-for': address() });
    const onB = new ApiClient(b.origin, { 'x-forwarded-for': address() });
    await onA.signIn(who.email, 'long-enough-password');
    await onB.signIn(who.email, 'long-enough-password');
    const sheetId = (await onA.post('/api/sheets', { title: 'Limited' })).body.sheet.id;
    const statuses: number[] = [];
    for (let i = 0; i < 120; i++) {
      const client = i % 2 ? onB : onA;
      const answer = i % 3 === 0 ? await client.post('/api/quick', { expr: `${i} m + 1 m`, preview: true }) : i % 3 === 1 ? await client.post('/api/evaluate', { document: sampleDocument() }) : await client.post(`/api/sheets/${sheetId}/evaluate`, {});
      statuses.push(answer.status);
    }
    // None of the first 120 is refused by the limit (on a loaded machine one may still hit the 5 s evaluation limit).
    expect(statuses.filter((status) => status === 429)).toEqual([]);
    expect(statuses.filter((status) => status === 200).length).toBeGreaterThanOrEqual(115);
    expectLimited(await onA.post('/api/quick', { expr: '1 m' }), 'quick 121');
    expectLimited(await onB.post('/api/evaluate', { document: sampleDocument() }), 'evaluate 122');
    expectLimited(await onA.post(`/api/sheets/${sheetId}/evaluate`, {}), 'sheet evaluate 123');
    await endWindow(`evaluationUser:${who.id}`);
    expect((await onB.post('/api/quick', { expr: '1 m' })).status).toBe(200);
  }, 180_000);
});

describe('the switch', () => {
  it('should leave the shared test app (DENUDATA_RATE_LIMITS=off) unlimited', async () => {
    const headers = { 'x-forwarded-for': address() };
    for (let i = 0; i < 12; i++) expect((await signUp(appUrl(), headers)).created.status).toBe(201);
  });
});
