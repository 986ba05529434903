// Starts a served instance of the built app (the test build) on a port of its own, for the suites that
// need more than one instance (two instances on one database; a database restart under load).
import { spawn, type ChildProcess } from 'node:child_process';
import { mkdirSync, openSync, readFileSync } from 'node:fs';

export interface AppInstance {
  origin: string;
  child: ChildProcess;
  stop: () => Promise<void>;
}

/**
 * Ports the Fetch standard forbids ("bad ports"): Node's fetch refuses them with "fetch failed" (cause "bad
 * port") whatever listens there. An instance's port is moved past them.
 */
const FETCH_BAD_PORTS = new Set([
  1, 7, 9, 11, 13, 15, 17, 19, 20, 21, 22, 23, 25, 37, 42, 43, 53, 69, 77, 79, 87, 95, 101, 102, 103, 104, 109, 110, 111, 113, 115,
  117, 119, 123, 135, 137, 139, 143, 161, 179, 389, 427, 465, 512, 513, 514, 515, 526, 530, 531, 532, 540, 548, 554, 556, 563,
  587, 601, 636, 989, 990, 993, 995, 1719, 1720, 1723, 2049, 3659, 4045, 4190, 5060, 5061, 6000, 6566, 6665, 6666, 6667, 6668,
  6669, 6679, 6697, 10080,
]);

/** The first port from `port` on such that it and the `count − 1` after it are not fetch's bad ports. */
export function fetchablePorts(port: number, count = 1): number {
  let first = port;
  while (Array.from({ length: count }, (_, i) => first + i).some((p) => FETCH_BAD_PORTS.has(p))) first += 1;
  return first;
}

export async function waitForApp(origin: string, child: ChildProcess, timeoutMs: number): Promise<void> {
  const deadline = Date.now() + timeoutMs;
  // What the last try got, for the error: a status with the start of its body, or the fetch's error.
  let last = 'no answer yet';
  while (Date.now() < deadline) {
    if (child.exitCode !== null) throw new Error(`the app exited with code ${child.exitCode}`);
    try {
      // Each try is bounded, so one stuck connection cannot use up the whole wait.
      const response = await fetch(`${origin}/api/auth/csrf`, { signal: AbortSignal.timeout(10_000) });
      if (response.ok) return;
      last = `${response.status}: ${(await response.text()).slice(0, 300)}`;
    } catch (error) {
      const cause = (error as { cause?: { code?: string; message?: string } }).cause;
      const why = cause?.code ?? cause?.message;
      last = `${error instanceof Error ? error.message : String(error)}${why ? ` (${why})` : ''}`;
    }
    await new Promise((resolve) => setTimeout(resolve, 300));
  }
  throw new Error(`the app did not answer on ${origin} within ${timeoutMs / 1000} s (last try: ${last})`);
}

/** `next start` of the test build on 127.0.0.1:port with extra environment; stop() ends its process group. */
export async function startAppInstance({ port, env = {}, quiet = false }: { port: number; env?: Record<string, string>; quiet?: boolean }): Promise<AppInstance> {
  const origin = `http://127.0.0.1:${port}`;
  mkdirSync('.denudata', { recursive: true });
  const logPath = `.denudata/instance-${port}.log`;
  const output = quiet ? openSync(logPath, 'w') : 'inherit';
  const child = spawn('node_modules/.bin/next', ['start', '-H', '127.0.0.1', '-p', String(port)], {
    env: {
      ...process.env,
      NEXTAUTH_URL: origin,
      NEXTAUTH_SECRET: process.env.NEXTAUTH_SECRET ?? 'test-secret-not-for-production-0123456789',
      DENUDATA_DIST_DIR: process.env.DENUDATA_DIST_DIR ?? '.next-test',
      // As scripts/start.sh serves the app: a larger young generation (DEVELOPERS.md, "Third round").
      NODE_OPTIONS: `--max-semi-space-size=64${process.env.NODE_OPTIONS ? ` ${process.env.NODE_OPTIONS}` : ''}`,
      ...env,
    },
    // A quiet instance writes to a log of its own, so a start that fails can say why.
    stdio: ['ignore', output, output],
    detached: true,
  });
  const stop = async () => {
    if (child.pid && child.exitCode === null) {
      const exited = new Promise((resolve) => child.once('exit', resolve));
      try {
        process.kill(-child.pid, 'SIGTERM');
      } catch {
        return;
      }
      await Promise.race([exited, new Promise((resolve) => setTimeout(resolve, 5000))]);
    }
  };
  try {
    await waitForApp(origin, child, 90_000);
  } catch (error) {
    await stop();
    const tail = quiet ? readFileSync(logPath, 'utf8').slice(-2000) : '';
    throw new Error(`${error instanceof Error ? error.message : String(error)}${tail ? `; its log (${logPath}) ends:\n${tail}` : ''}`);
  }
  return { origin, child, stop };
}
