// Command-line runner: evaluates a sheet document (or a bundle with its datasets) and prints its results as JSON.
//   npm run --silent calc -- <sheet.json | bundle.json> [--datasets DIR] [--time-limit S]
// DIR holds canonical datasets as <sha256>.json (the bytes of GET /api/datasets/{sha256}?format=canonical);
// a bundle's datasets and the folder's files must hash to their sha256 (else exit 2).
// Exit codes: 0 every block ok; 1 any block error or blocked (a value over a size cap is a block
// error); 2 unreadable or invalid document or dataset; 3 the whole run was stopped by its time limit
// (--time-limit S, default 120 s, counted from when the evaluation starts) or its memory limit
// (DENUDATA_CALC_MEMORY_MB, default 2048), with the reason on stderr.
//
// The evaluation runs in a worker thread so that the time and memory limits can stop it: the
// worker says "started" when it is ready, the clock starts then, and the worker is terminated when
// the clock runs out. Caps on values (matrix elements, string length, results size) are the
// engine's own, the same as in the app.
import { readFile } from 'node:fs/promises';
import path from 'node:path';
import { isMainThread, parentPort, Worker, workerData } from 'node:worker_threads';
import type { SheetResults } from '../lib/engine';

const DEFAULT_TIME_LIMIT_S = 120;
const DEFAULT_MEMORY_MB = 2048;

type WorkerReply =
  | { type: 'started' }
  | { type: 'done'; results: SheetResults }
  | { type: 'invalid'; message: string }
  | { type: 'failed'; message: string };

function fail(reason: string, code = 2): never {
  process.stderr.write(`calc: ${reason}\n`);
  process.exit(code);
}

const USAGE = 'usage: npm run --silent calc -- <sheet.json | bundle.json> [--datasets DIR] [--time-limit S]';

function parseArgs(argv: string[]): { file: string; timeLimitS: number; datasetsDir: string | null } {
  const positional: string[] = [];
  let timeLimitS = DEFAULT_TIME_LIMIT_S;
  let datasetsDir: string | null = null;
  for (let i = 0; i < argv.length; i++) {
    const arg = argv[i]!;
    if (arg === '--') continue;
    if (arg === '--time-limit' || arg.startsWith('--time-limit=')) {
      const text = arg.includes('=') ? arg.slice(arg.indexOf('=') + 1) : argv[++i];
      const value = Number(text);
      if (text === undefined || text.trim() === '' || !Number.isFinite(value) || value <= 0) {
        fail(`--time-limit takes a number of seconds greater than 0 (got ${text ?? 'nothing'})`);
      }
      timeLimitS = value;
    } else if (arg === '--datasets' || arg.startsWith('--datasets=')) {
      const text = arg.includes('=') ? arg.slice(arg.indexOf('=') + 1) : argv[++i];
      if (!text) fail(`--datasets takes a folder of <sha256>.json files; ${USAGE}`);
      datasetsDir = text;
    } else if (arg.startsWith('--')) {
      fail(`unknown option ${arg}; ${USAGE}`);
    } else positional.push(arg);
  }
  if (positional.length !== 1) fail(USAGE);
  return { file: positional[0]!, timeLimitS, datasetsDir };
}

function memoryLimitMb(): number {
  const value = Number(process.env.DENUDATA_CALC_MEMORY_MB ?? DEFAULT_MEMORY_MB);
  return Number.isFinite(value) && value >= 64 ? value : DEFAULT_MEMORY_MB;
}

/**
 * Validates and evaluates in a worker thread under the time and memory limits. The main thread
 * never loads the engine (one engine start-up, not two); an invalid document ends with exit 2.
 */
function evaluateWithLimits(json: unknown, timeLimitS: number, datasetsDir: string | null): Promise<SheetResults> {
  // Node 20 worker threads do not inherit tsx's loader: register it in the worker first.
  const source = `require('tsx/cjs/api').register();
import('tsx/esm/api').then(({ register }) => { register(); return import(${JSON.stringify(import.meta.url)}); });`;
  const worker = new Worker(source, {
    eval: true,
    workerData: { json, datasetsDir },
    execArgv: ['--conditions=react-server'],
    resourceLimits: { maxOldGenerationSizeMb: memoryLimitMb() },
    stderr: false,
  });
  return new Promise((resolve, reject) => {
    let timer: NodeJS.Timeout | undefined;
    let settled = false;
    const settle = (action: () => void) => {
      if (settled) return;
      settled = true;
      clearTimeout(timer);
      action();
      void worker.terminate();
    };
    worker.on('message', (reply: WorkerReply) => {
      if (reply.type === 'started') {
        timer = setTimeout(() => {
          settle(() => reject(Object.assign(new Error(`stopped: the evaluation took longer than its time limit of ${timeLimitS} s`), { exitCode: 3 })));
        }, timeLimitS * 1000);
      } else if (reply.type === 'done') settle(() => resolve(reply.results));
      else if (reply.type === 'invalid') settle(() => reject(Object.assign(new Error(reply.message), { exitCode: 2 })));
      else settle(() => reject(new Error(reply.message)));
    });
    worker.on('error', (error: Error & { code?: string }) => {
      const memory = error.code === 'ERR_WORKER_OUT_OF_MEMORY' || /out of memory/i.test(error.message);
      settle(() =>
        reject(
          memory
            ? Object.assign(new Error(`stopped: the evaluation needed more than its memory limit of ${memoryLimitMb()} MB`), { exitCode: 3 })
            : error,
        ),
      );
    });
    worker.on('exit', (code) => {
      settle(() => reject(Object.assign(new Error(`stopped: the evaluation ended unexpectedly (code ${code})`), { exitCode: 3 })));
    });
  });
}

async function main(): Promise<void> {
  const { file: given, timeLimitS, datasetsDir } = parseArgs(process.argv.slice(2));
  const base = process.env.INIT_CWD ?? process.cwd();
  const file = path.resolve(base, given);
  const folder = datasetsDir === null ? null : path.resolve(base, datasetsDir);
  let text: string;
  try {
    text = await readFile(file, 'utf8');
  } catch {
    fail(`cannot read ${file}`);
  }
  let json: unknown;
  try {
    json = JSON.parse(text);
  } catch (error) {
    fail(`${file} is not JSON (${error instanceof Error ? error.message : 'parse error'})`);
  }
  let results: SheetResults;
  try {
    results = await evaluateWithLimits(json, timeLimitS, folder);
  } catch (error) {
    const code = (error as { exitCode?: number }).exitCode ?? 2;
    fail(error instanceof Error ? error.message : String(error), code);
  }
  process.stdout.write(`${JSON.stringify(results, null, 2)}\n`);
  const allOk = Object.values(results.blocks).every((block) => block.status === 'ok');
  process.exitCode = allOk ? 0 : 1;
}

if (isMainThread) {
  main().catch((error: unknown) => {
    process.stderr.write(`calc: ${error instanceof Error ? error.message : String(error)}\n`);
    process.exit(2);
  });
} else {
  const port = parentPort!;
  try {
    const { evaluateSheet, parseSheetDocument } = await import('../lib/engine');
    const { readRunnerInput } = await import('../lib/datasets/runner-input');
    const { json, datasetsDir } = workerData as { json: unknown; datasetsDir: string | null };
    const input = await readRunnerInput(json, datasetsDir);
    const parsed = input.ok ? parseSheetDocument(input.document) : null;
    if (!input.ok) {
      port.postMessage({ type: 'invalid', message: input.message } satisfies WorkerReply);
    } else if (!parsed!.ok) {
      port.postMessage({ type: 'invalid', message: `invalid document: ${parsed!.path ? `${parsed!.path}: ` : ''}${parsed!.message}` } satisfies WorkerReply);
    } else {
      port.postMessage({ type: 'started' } satisfies WorkerReply);
      const results = evaluateSheet(parsed!.document, { datasets: input.datasets });
      port.postMessage({ type: 'done', results } satisfies WorkerReply);
    }
  } catch (error) {
    port.postMessage({ type: 'failed', message: error instanceof Error ? error.message : String(error) } satisfies WorkerReply);
  }
}
