/**
 * npm run load: load figures for a running app (a script, not a test). Loopback only.
 *
 *   DENUDATA_APP_URL=http://127.0.0.1:3000 npm run load [-- --duration 5 --connections 16 --only <route label part>]
 *
 * Signs in as the four demo accounts and as extra accounts it signs up (when sign-up is not rate
 * limited), spreads the connections over them so that per-user limits distort nothing, and prints,
 * for each route, requests per second with p50/p99 latency at full load (autocannon), then p99 at a fixed
 * 100 requests per second, measured open loop (`openLoop` in load-support.mts). First it finds out whether rate limits are on (eleven wrong passwords for
 * one made-up account: the eleventh is 429 only when they are) and says so; it counts non-2xx answers,
 * prints the machine's load average before and after (figures on a busy machine are not comparable
 * with a quiet one's) and ends with the password-reset medians for a known and an unknown address.
 * Each route is warmed up for 2 s first (not recorded). Every run is bounded in time: routes ×
 * (2 s + duration + fixed-rate duration).
 */
import os from 'node:os';
import autocannon from 'autocannon';
import { LOAD_TARGETS, openLoop, signIn as signInAt, type LoadTarget } from './load-support.mjs';

const base = new URL(process.env.DENUDATA_APP_URL ?? 'http://127.0.0.1:3000');
if (!['127.0.0.1', 'localhost', '[::1]'].includes(base.hostname)) {
  console.error('load: only an app on this machine (127.0.0.1, localhost or [::1]) may be loaded');
  process.exit(2);
}
const argument = (name: string, fallback: number) => {
  const index = process.argv.indexOf(`--${name}`);
  const value = index >= 0 ? Number(process.argv[index + 1]) : fallback;
  return Number.isFinite(value) && value > 0 ? Math.min(value, name === 'duration' ? 30 : 64) : fallback;
};
const DURATION = argument('duration', 5);
const CONNECTIONS = argument('connections', 16);
const EXTRA_ACCOUNTS = 12;

const signIn = (email: string, password: string) => signInAt(base, email, password);

/** Whether rate limits are on: the 11th wrong password for one account is 429 only when they are. */
async function rateLimitsOn(): Promise<boolean> {
  const email = `load-probe-${Date.now()}@example.test`;
  for (let i = 0; i < 11; i++) {
    const csrfResponse = await fetch(new URL('/api/auth/csrf', base));
    const cookie = csrfResponse.headers.getSetCookie().map((line) => line.split(';')[0]).join('; ');
    const { csrfToken } = (await csrfResponse.json()) as { csrfToken: string };
    const response = await fetch(new URL('/api/auth/callback/credentials', base), {
      method: 'POST',
      redirect: 'manual',
      headers: { 'content-type': 'application/x-www-form-urlencoded', cookie },
      body: new URLSearchParams({ csrfToken, email, password: 'not-the-password', json: 'true' }).toString(),
    });
    await response.arrayBuffer();
    if (response.status === 429) return true;
  }
  return false;
}

async function signUp(index: number): Promise<string | null> {
  const email = `load-${Date.now()}-${index}@example.test`;
  const password = 'load-test-password';
  const response = await fetch(new URL('/api/users', base), {
    method: 'POST',
    headers: { 'content-type': 'application/json' },
    body: JSON.stringify({ email, password, name: `Load ${index}` }),
  });
  if (response.status !== 201) return null;
  return signIn(email, password);
}

/** A 50-block chained sheet: a quantity, then formulas each using the one before. */
const targets = LOAD_TARGETS;

interface Figures {
  rps: number;
  p50: number;
  p99: number;
  non2xx: number;
  rateLimited: number;
}

async function measure(target: LoadTarget, cookies: string[], duration = DURATION): Promise<Figures> {
  let next = 0;
  let rateLimited = 0;
  const result = await autocannon({
    url: new URL(target.path, base).href,
    method: target.method ?? 'GET',
    body: target.body,
    ...(target.unique ? { idReplacement: true } : {}),
    headers: target.body ? { 'content-type': 'application/json' } : {},
    connections: CONNECTIONS,
    duration,
    setupClient: (client: { setHeaders: (headers: Record<string, string>) => void }) => {
      const headers: Record<string, string> = target.body ? { 'content-type': 'application/json' } : {};
      if (cookies.length > 0) headers.cookie = cookies[next++ % cookies.length]!;
      client.setHeaders(headers);
    },
  } as autocannon.Options);
  rateLimited = (result.statusCodeStats as Record<string, { count: number }> | undefined)?.['429']?.count ?? 0;
  return { rps: result.requests.average, p50: result.latency.p50, p99: result.latency.p99, non2xx: result.non2xx, rateLimited };
}

const limitsOn = await rateLimitsOn();
const demo = (await Promise.all(['owner', 'editor', 'reviewer', 'viewer'].map((role) => signIn(`${role}@demo.test`, 'demo-password')))).filter(
  (c): c is string => c !== null,
);
if (demo.length === 0) {
  console.error(`load: could not sign in to ${base.origin} as the demo accounts (is the app running with the demo data?)`);
  process.exit(1);
}
const extra: string[] = [];
for (let i = 0; i < EXTRA_ACCOUNTS; i++) {
  const cookie = await signUp(i);
  if (!cookie) break;
  extra.push(cookie);
}

const loadAverage = () => os.loadavg().map((v) => v.toFixed(1)).join(' ');
console.log(`load: ${base.origin}, ${CONNECTIONS} connections, ${DURATION} s per run; signed in as ${demo.length} demo and ${extra.length} new accounts`);
console.log(`load: ${new Date().toISOString()}, Node.js ${process.versions.node}, ${os.availableParallelism()} cores, load average ${loadAverage()} (1, 5, 15 min) before`);
console.log(
  limitsOn
    ? 'load: rate limits are ON (the 11th wrong password for one account was refused 429): figures are distorted; serve the app with DENUDATA_RATE_LIMITS=off'
    : 'load: rate limits are OFF (11 wrong passwords for one account, none refused)',
);
console.log('| route | rps | p50 ms | p99 ms | p99 ms at 100 rps | non-2xx |');
console.log('|---|---|---|---|---|---|');
let anyRateLimited = false;
const only = process.argv.includes('--only') ? process.argv[process.argv.indexOf('--only') + 1] ?? '' : '';
for (const target of targets.filter((t) => t.label.includes(only))) {
  const cookies = target.who === 'none' ? [] : target.who === 'demo' ? demo : [...demo, ...extra];
  await measure(target, cookies, 2); // warm-up (worker threads, module loading), not recorded
  const full = await measure(target, cookies);
  const fixed = await openLoop(new URL(target.path, base), { rate: 100, seconds: DURATION, method: target.method, body: target.body, unique: target.unique, cookies });
  if (full.rateLimited + fixed.rateLimited > 0) anyRateLimited = true;
  console.log(
    `| ${target.label} | ${full.rps.toFixed(0)} | ${full.p50} | ${full.p99} | ${fixed.p99} | ${full.non2xx + fixed.non2xx} |`,
  );
}
console.log(
  anyRateLimited
    ? 'load: some answers above were 429 (rate limited or too many evaluations in flight): those routes\' figures are distorted'
    : 'load: no answer above was 429',
);
console.log(`load: load average ${loadAverage()} (1, 5, 15 min) after`);

// Account discovery by timing: the password-reset route must take the same time for any address. The
// requests alternate between the two addresses, with a pause after each, so the queued job a known
// address starts (it runs in the app's process right after the answer) never lands on one side only.
const resetTimes: Record<'known' | 'unknown', number[]> = { known: [], unknown: [] };
const unknownAddress = `nobody-${Date.now()}@example.test`;
for (let i = 0; i < 9; i++) {
  for (const [side, email] of [['known', 'viewer@demo.test'], ['unknown', unknownAddress]] as const) {
    const start = performance.now();
    const response = await fetch(new URL('/api/password-reset', base), { method: 'POST', headers: { 'content-type': 'application/json' }, body: JSON.stringify({ email }) });
    await response.arrayBuffer();
    resetTimes[side].push(performance.now() - start);
    await new Promise((resolve) => setTimeout(resolve, 300));
  }
}
const median = (values: number[]) => [...values].sort((a, b) => a - b)[Math.floor(values.length / 2)]!;
console.log(
  `load: password-reset median ${median(resetTimes.known).toFixed(1)} ms for a known address, ${median(resetTimes.unknown).toFixed(1)} ms for an unknown one (9 each, alternating)`,
);
