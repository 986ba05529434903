/**
 * npm run load: load figures for a running app (a script, not a test). Loopback only.
 *
 *   DENUDATA_APP_URL=http://127.0.0.1:3000 npm run load [-- --duration 5 --connections 16]
 *
 * Signs in as the four demo accounts and as extra accounts it signs up (when sign-up is not rate
 * limited), spreads the connections over them so that per-user limits distort nothing, and prints,
 * for each route, requests per second with p50/p99 latency at full load, then p99 at a fixed
 * 100 requests per second. It says whether any answer was 429 (rate limits on) and counts
 * non-2xx answers. Every run is bounded in time: routes × (duration + fixed-rate duration).
 */
import autocannon from 'autocannon';

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
const DEMO_SHEET_ID = '0d3a7e10-5c2b-4f6a-8e1d-000000000001';

async function signIn(email: string, password: string): Promise<string | null> {
  const jar = new Map<string, string>();
  const keep = (response: Response) => {
    for (const line of response.headers.getSetCookie()) {
      const [pair] = line.split(';');
      const at = pair!.indexOf('=');
      jar.set(pair!.slice(0, at), pair!.slice(at + 1));
    }
  };
  const cookie = () => [...jar].map(([k, v]) => `${k}=${v}`).join('; ');
  const csrfResponse = await fetch(new URL('/api/auth/csrf', base));
  keep(csrfResponse);
  const { csrfToken } = (await csrfResponse.json()) as { csrfToken: string };
  const response = await fetch(new URL('/api/auth/callback/credentials', base), {
    method: 'POST',
    redirect: 'manual',
    headers: { 'content-type': 'application/x-www-form-urlencoded', cookie: cookie() },
    body: new URLSearchParams({ csrfToken, email, password, json: 'true' }).toString(),
  });
  keep(response);
  return [...jar.keys()].some((k) => k.includes('session-token')) ? cookie() : null;
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
function chainedDocument(blocks: number) {
  return {
    format: 'denudata-sheet@1',
    title: 'Load: 50-block chain',
    blocks: Array.from({ length: blocks }, (_, i) =>
      i === 0
        ? { id: 'b0', name: 'q0', type: 'quantities', inputs: { K: '0.004 m^2/yr', C: '-0.01 1/m' } }
        : { id: `b${i}`, name: `f${i}`, type: 'formula', inputs: { expr: i === 1 ? 'q0.K * q0.C to mm/yr' : `f${i - 1}.value * 1.001` } },
    ),
  };
}

interface Target {
  label: string;
  path: string;
  method?: 'GET' | 'POST';
  body?: string;
  /** Which accounts may make the request: the demo team's members, or anyone signed in. */
  who: 'none' | 'demo' | 'all';
}

const targets: Target[] = [
  { label: 'static file (floor)', path: '/fonts/JetBrainsMono-Regular.woff2', who: 'none' },
  { label: 'GET /api/teams (trivial, signed in)', path: '/api/teams', who: 'demo' },
  { label: 'GET /api/sheets/{id}', path: `/api/sheets/${DEMO_SHEET_ID}`, who: 'demo' },
  { label: 'GET /api/sheets', path: '/api/sheets', who: 'demo' },
  { label: 'POST /api/quick', path: '/api/quick', method: 'POST', body: JSON.stringify({ expr: 'scarp_age(2 m, 0, 25 deg, 1 m^2/kyr)', preview: true }), who: 'all' },
  { label: 'POST /api/evaluate (50 blocks)', path: '/api/evaluate', method: 'POST', body: JSON.stringify({ document: chainedDocument(50) }), who: 'all' },
  { label: 'sheet page HTML', path: `/sheets/${DEMO_SHEET_ID}`, who: 'demo' },
];

interface Figures {
  rps: number;
  p50: number;
  p99: number;
  non2xx: number;
  rateLimited: number;
}

async function measure(target: Target, cookies: string[], overallRate?: number): Promise<Figures> {
  let next = 0;
  let rateLimited = 0;
  const result = await autocannon({
    url: new URL(target.path, base).href,
    method: target.method ?? 'GET',
    body: target.body,
    headers: target.body ? { 'content-type': 'application/json' } : {},
    connections: CONNECTIONS,
    duration: DURATION,
    ...(overallRate ? { overallRate } : {}),
    setupClient: (client: { setHeaders: (headers: Record<string, string>) => void }) => {
      const headers: Record<string, string> = target.body ? { 'content-type': 'application/json' } : {};
      if (cookies.length > 0) headers.cookie = cookies[next++ % cookies.length]!;
      client.setHeaders(headers);
    },
  } as autocannon.Options);
  rateLimited = (result.statusCodeStats as Record<string, { count: number }> | undefined)?.['429']?.count ?? 0;
  return { rps: result.requests.average, p50: result.latency.p50, p99: result.latency.p99, non2xx: result.non2xx, rateLimited };
}

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

console.log(`load: ${base.origin}, ${CONNECTIONS} connections, ${DURATION} s per run; signed in as ${demo.length} demo and ${extra.length} new accounts`);
console.log('| route | rps | p50 ms | p99 ms | p99 ms at 100 rps | non-2xx |');
console.log('|---|---|---|---|---|---|');
let anyRateLimited = extra.length < EXTRA_ACCOUNTS;
for (const target of targets) {
  const cookies = target.who === 'none' ? [] : target.who === 'demo' ? demo : [...demo, ...extra];
  const full = await measure(target, cookies);
  const fixed = await measure(target, cookies, 100);
  if (full.rateLimited + fixed.rateLimited > 0) anyRateLimited = true;
  console.log(
    `| ${target.label} | ${full.rps.toFixed(0)} | ${full.p50} | ${full.p99} | ${fixed.p99} | ${full.non2xx + fixed.non2xx} |`,
  );
}
console.log(
  anyRateLimited
    ? 'load: rate limits were ON (a 429 was answered, or sign-up was limited): run the app with DENUDATA_RATE_LIMITS=off for throughput figures'
    : 'load: no answer was 429: rate limits were off or not reached',
);

// Account discovery by timing: the password-reset route must take the same time for any address.
async function medianResetMs(email: string): Promise<number> {
  const times: number[] = [];
  for (let i = 0; i < 9; i++) {
    const start = performance.now();
    await fetch(new URL('/api/password-reset', base), { method: 'POST', headers: { 'content-type': 'application/json' }, body: JSON.stringify({ email }) });
    times.push(performance.now() - start);
  }
  times.sort((a, b) => a - b);
  return times[4]!;
}
const known = await medianResetMs('viewer@demo.test');
const unknown = await medianResetMs(`nobody-${Date.now()}@example.test`);
console.log(`load: password-reset median ${known.toFixed(1)} ms for a known address, ${unknown.toFixed(1)} ms for an unknown one`);
