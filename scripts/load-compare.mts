/**
 * Two builds of the app side by side, by server CPU time per request (a measuring tool, not a test).
 * Loopback only. Each app must be served by `next start` with DENUDATA_RATE_LIMITS=off on the same
 * database (the demo data); the server process is found by its listening port (Linux /proc and `ss`).
 *
 *   npx tsx scripts/load-compare.mts --a http://127.0.0.1:3411 --b http://127.0.0.1:3412 \
 *     [--slices 3] [--seconds 4] [--connections 16] [--only <route label part>]
 *
 * For each route: a 2 s warm-up on each side, then alternating slices (A, B, A, B, …) of full load; per
 * slice the server process's user + system CPU time (all threads, from /proc/<pid>/stat) divided by the
 * requests answered. CPU per request is far less sensitive to other work on a shared machine than
 * requests per second, which is printed beside it. Medians over the slices. Then, per side, p99 latency at a
 * fixed 100 requests per second, open loop (`--fixed-seconds`, default 5; 0 leaves it out).
 * With a baseline build as A (an earlier commit served from its own worktree and database), this is the
 * issue-8 comparison "against today" made in one run on one machine.
 * On two cores the load generator and PostgreSQL share the CPU with the server under test, which pulls every
 * rps ratio below its CPU ratio. To measure the server alone, serve both apps with `taskset -c 0`, move
 * PostgreSQL to the other core (`taskset -a -p -c 1 <pid>` for each of its processes) and run this script
 * with `taskset -c 1` (DEVELOPERS.md, "Ninth session").
 */
import { execFileSync } from 'node:child_process';
import { readFileSync } from 'node:fs';
import os from 'node:os';
import autocannon from 'autocannon';
import { LOAD_TARGETS, openLoop, signIn as signInAt } from './load-support.mjs';

const arg = (name: string, fallback?: string) => {
  const index = process.argv.indexOf(`--${name}`);
  return index >= 0 ? process.argv[index + 1] : fallback;
};
const sides = { A: new URL(arg('a', 'http://127.0.0.1:3411')!), B: new URL(arg('b', 'http://127.0.0.1:3412')!) };
for (const url of Object.values(sides)) {
  if (!['127.0.0.1', 'localhost'].includes(url.hostname)) throw new Error('only an app on this machine may be loaded');
}
const SLICES = Math.min(Number(arg('slices', '3')), 10);
const SECONDS = Math.min(Number(arg('seconds', '4')), 15);
const CONNECTIONS = Math.min(Number(arg('connections', '16')), 64);
const ONLY = arg('only', '')!;
const FIXED_SECONDS = Math.min(Number(arg('fixed-seconds', '5')), 15);
const TICKS = Number(execFileSync('getconf', ['CLK_TCK']).toString().trim()) || 100;

/** The pid listening on the URL's port. */
function pidOf(url: URL): number {
  const out = execFileSync('ss', ['-ltnpH', `sport = :${url.port}`]).toString();
  const match = /pid=(\d+)/.exec(out);
  if (!match) throw new Error(`nothing listens on ${url.port}`);
  return Number(match[1]);
}
/** User + system CPU time of a process (all threads), in ms. */
function cpuMs(pid: number): number {
  const stat = readFileSync(`/proc/${pid}/stat`, 'utf8');
  const fields = stat.slice(stat.lastIndexOf(')') + 2).split(' ');
  return ((Number(fields[11]) + Number(fields[12])) / TICKS) * 1000;
}

async function signIn(base: URL, email: string, password: string): Promise<string> {
  const cookie = await signInAt(base, email, password);
  if (!cookie) throw new Error(`could not sign in to ${base.origin} as ${email}`);
  return cookie;
}

const targets = LOAD_TARGETS.filter((t) => t.label.includes(ONLY));

/** The four demo accounts, then 12 accounts signed up on that side (evaluations are limited per user in flight). */
async function accounts(base: URL): Promise<{ demo: string[]; all: string[] }> {
  const demo = await Promise.all(['owner', 'editor', 'reviewer', 'viewer'].map((r) => signIn(base, `${r}@demo.test`, 'demo-password')));
  const all = [...demo];
  for (let i = 0; i < 12; i++) {
    const email = `compare-${Date.now()}-${i}@example.test`;
    const response = await fetch(new URL('/api/users', base), {
      method: 'POST',
      headers: { 'content-type': 'application/json' },
      body: JSON.stringify({ email, password: 'compare-password', name: `Compare ${i}` }),
    });
    if (response.status !== 201) break;
    all.push(await signIn(base, email, 'compare-password'));
  }
  return { demo, all };
}
const cookies = { A: await accounts(sides.A), B: await accounts(sides.B) };
const pids = { A: pidOf(sides.A), B: pidOf(sides.B) };

async function slice(side: 'A' | 'B', target: (typeof targets)[number], seconds: number) {
  let next = 0;
  const before = cpuMs(pids[side]);
  const result = await autocannon({
    url: new URL(target.path, sides[side]).href,
    method: (target.method ?? 'GET') as 'GET',
    body: target.body,
    ...(target.unique ? { idReplacement: true } : {}),
    connections: CONNECTIONS,
    duration: seconds,
    setupClient: (client: { setHeaders: (headers: Record<string, string>) => void }) => {
      const headers: Record<string, string> = target.body ? { 'content-type': 'application/json' } : {};
      const pool = target.who === 'all' ? cookies[side].all : cookies[side].demo;
      if (target.who !== 'none') headers.cookie = pool[next++ % pool.length]!;
      client.setHeaders(headers);
    },
  } as autocannon.Options);
  const cpu = cpuMs(pids[side]) - before;
  const answered = result.requests.total;
  return { cpuPerRequest: answered ? cpu / answered : NaN, rps: result.requests.average, p50: result.latency.p50, non2xx: result.non2xx };
}

const median = (values: number[]) => [...values].sort((a, b) => a - b)[Math.floor(values.length / 2)]!;
console.log(`load-compare: A ${sides.A.origin} (pid ${pids.A}), B ${sides.B.origin} (pid ${pids.B}); ${SLICES} × ${SECONDS} s slices, ${CONNECTIONS} connections`);
console.log(`load-compare: ${new Date().toISOString()}, load average ${os.loadavg().map((v) => v.toFixed(1)).join(' ')} before`);
console.log('| route | A CPU ms/req | B CPU ms/req | A/B | A rps | B rps | B/A rps | A p99 ms at 100 rps | B p99 ms at 100 rps | non-2xx A/B |');
console.log('|---|---|---|---|---|---|---|---|---|---|');
for (const target of targets) {
  await slice('A', target, 2);
  await slice('B', target, 2);
  const runs: Record<'A' | 'B', Awaited<ReturnType<typeof slice>>[]> = { A: [], B: [] };
  for (let i = 0; i < SLICES; i++) {
    for (const side of (i % 2 ? ['B', 'A'] : ['A', 'B']) as ('A' | 'B')[]) runs[side].push(await slice(side, target, SECONDS));
  }
  const fixed: Partial<Record<'A' | 'B', Awaited<ReturnType<typeof openLoop>>>> = {};
  if (FIXED_SECONDS > 0) {
    for (const side of ['A', 'B'] as const) {
      const pool = target.who === 'none' ? [] : target.who === 'all' ? cookies[side].all : cookies[side].demo;
      fixed[side] = await openLoop(new URL(target.path, sides[side]), { rate: 100, seconds: FIXED_SECONDS, method: target.method, body: target.body, unique: target.unique, cookies: pool });
    }
  }
  const cpuA = median(runs.A.map((r) => r.cpuPerRequest));
  const cpuB = median(runs.B.map((r) => r.cpuPerRequest));
  const rpsA = median(runs.A.map((r) => r.rps));
  const rpsB = median(runs.B.map((r) => r.rps));
  const non2xx = (side: 'A' | 'B') => runs[side].reduce((sum, r) => sum + r.non2xx, 0) + (fixed[side]?.non2xx ?? 0);
  const p99 = (side: 'A' | 'B') => (fixed[side] ? String(fixed[side].p99) : '—');
  console.log(
    `| ${target.label} | ${cpuA.toFixed(2)} | ${cpuB.toFixed(2)} | ${(cpuA / cpuB).toFixed(2)}× | ${rpsA.toFixed(0)} | ${rpsB.toFixed(0)} | ${(rpsB / rpsA).toFixed(2)}× | ${p99('A')} | ${p99('B')} | ${non2xx('A')}/${non2xx('B')} |`,
  );
}
console.log(`load-compare: load average ${os.loadavg().map((v) => v.toFixed(1)).join(' ')} after`);
