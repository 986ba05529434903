/**
 * What the two load scripts share (scripts/load.mts and scripts/load-compare.mts): signing in through
 * next-auth's credentials route, the 50-block chained sheet, and the routes they measure.
 */
import { Agent, request } from 'node:http';

export const DEMO_SHEET_ID = '0d3a7e10-5c2b-4f6a-8e1d-000000000001';

/** The session cookie header of an account, or null when the sign-in is refused. */
export async function signIn(base: URL, email: string, password: string): Promise<string | null> {
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

/** A sheet of a quantities block and a chain of formula blocks, each reading the previous one. */
export function chainedDocument(blocks: number, title = 'Load: 50-block chain') {
  return {
    format: 'denudata-sheet@1',
    title,
    blocks: Array.from({ length: blocks }, (_, i) =>
      i === 0
        ? { id: 'b0', name: 'q0', type: 'quantities', inputs: { K: '0.004 m^2/yr', C: '-0.01 1/m' } }
        : { id: `b${i}`, name: `f${i}`, type: 'formula', inputs: { expr: i === 1 ? 'q0.K * q0.C to mm/yr' : `f${i - 1}.value * 1.001` } },
    ),
  };
}

export interface LoadTarget {
  label: string;
  path: string;
  method?: 'GET' | 'POST';
  body?: string;
  /** Which accounts may make the request: none (signed out), the demo team's members, or anyone signed in. */
  who: 'none' | 'demo' | 'all';
  /** autocannon replaces `[<id>]` in the body with a new id per request (a body never sent before). */
  unique?: boolean;
}

/** The routes issue 8's load figures name, in the order they are measured. */
export const LOAD_TARGETS: LoadTarget[] = [
  { label: 'static file (floor)', path: '/fonts/JetBrainsMono-Regular.woff2', who: 'none' },
  { label: 'GET /api/teams (trivial, signed in)', path: '/api/teams', who: 'demo' },
  { label: 'GET /api/sheets/{id}', path: `/api/sheets/${DEMO_SHEET_ID}`, who: 'demo' },
  { label: 'GET /api/sheets', path: '/api/sheets', who: 'demo' },
  { label: 'POST /api/quick', path: '/api/quick', method: 'POST', body: JSON.stringify({ expr: 'scarp_age(2 m, 0, 25 deg, 1 m^2/kyr)', preview: true }), who: 'all' },
  { label: 'POST /api/evaluate (50 blocks)', path: '/api/evaluate', method: 'POST', body: JSON.stringify({ document: chainedDocument(50) }), who: 'all' },
  // The same evaluation work, but each body's text is new (its title carries a request id), so no answer is reused.
  {
    label: 'POST /api/evaluate (50 blocks, new text each time)',
    path: '/api/evaluate',
    method: 'POST',
    body: JSON.stringify({ document: chainedDocument(50, 'Load: 50-block chain [<id>]') }),
    who: 'all',
    unique: true,
  },
  { label: 'sheet page HTML', path: `/sheets/${DEMO_SHEET_ID}`, who: 'demo' },
];

export interface OpenLoopFigures {
  p50: number;
  p99: number;
  /** Answers that were not 2xx (and requests that failed outright). */
  non2xx: number;
  rateLimited: number;
  count: number;
}

/**
 * Latency at a fixed request rate, measured open loop: request k is due at start + k / rate and is sent when
 * due, whatever the earlier ones are doing (keep-alive sockets, at most `sockets` at once; a request that must
 * wait for a socket waits on the clock). Latency runs from the due time to the end of the answer's body, so a
 * slow answer is never hidden by sending less (the "coordinated omission" correction of wrk2; common practice
 * in load testing). autocannon's own fixed rate (`overallRate`) is not used for this: spread over 16
 * connections it sends in bursts, and against a plain Node.js server answering in well under a millisecond it
 * reported a p99 of 31–51 ms at 100 requests/s, where this measures about 6 ms (DEVELOPERS.md, "Load figures").
 */
export async function openLoop(
  url: URL,
  options: { rate: number; seconds: number; method?: string; body?: string; unique?: boolean; cookies: string[]; sockets?: number; warmupSeconds?: number },
): Promise<OpenLoopFigures> {
  const agent = new Agent({ keepAlive: true, maxSockets: options.sockets ?? 64 });
  // The first requests (1 s by default) are sent at the same rate but not recorded: they open the sockets and
  // meet whatever the server still does after the full-load slice before (wrk2 likewise leaves out its
  // calibration period). The recorded part is the steady state at the rate.
  const warmup = Math.round(options.rate * (options.warmupSeconds ?? 1));
  const total = warmup + Math.max(1, Math.round(options.rate * options.seconds));
  const interval = 1000 / options.rate;
  const latencies: number[] = [];
  let non2xx = 0;
  let rateLimited = 0;
  const start = performance.now() + 20;
  const one = (k: number, due: number) =>
    new Promise<void>((resolve) => {
      const body = options.body === undefined ? undefined : options.unique ? options.body.replace('[<id>]', `${Date.now().toString(36)}-${k}`) : options.body;
      const headers: Record<string, string> = {};
      if (body !== undefined) headers['content-type'] = 'application/json';
      if (options.cookies.length > 0) headers.cookie = options.cookies[k % options.cookies.length]!;
      const finish = (status: number) => {
        if (k < warmup) return resolve();
        latencies.push(performance.now() - due);
        if (status < 200 || status > 299) non2xx += 1;
        if (status === 429) rateLimited += 1;
        resolve();
      };
      const req = request(url, { method: options.method ?? 'GET', headers, agent }, (response) => {
        response.resume();
        response.on('end', () => finish(response.statusCode ?? 0));
        response.on('error', () => finish(0));
      });
      req.on('error', () => finish(0));
      req.end(body);
    });
  const pending: Promise<void>[] = [];
  for (let k = 0; k < total; k++) {
    const due = start + k * interval;
    const wait = due - performance.now();
    if (wait > 0) await new Promise((resolve) => setTimeout(resolve, wait));
    pending.push(one(k, due));
  }
  await Promise.all(pending);
  agent.destroy();
  latencies.sort((a, b) => a - b);
  const at = (q: number) => latencies[Math.min(latencies.length - 1, Math.ceil(q * latencies.length) - 1)]!;
  return { p50: Math.round(at(0.5) * 10) / 10, p99: Math.round(at(0.99) * 10) / 10, non2xx, rateLimited, count: latencies.length };
}
