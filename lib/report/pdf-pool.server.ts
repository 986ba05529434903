import 'server-only';
import { existsSync } from 'node:fs';
import path from 'node:path';
import { pathToFileURL } from 'node:url';
import { Piscina } from 'piscina';
import { AppError } from '@/lib/errors';
import type { ReportModel } from './types';
import { BoundedBytesCache, reportCacheKey } from './pdf-cache';

/**
 * Report PDFs are laid out in one worker thread of their own (never on the server's main thread, never in the
 * evaluation threads), one at a time, at most MAX_WAITING waiting (beyond: 429 rate_limited), each stopped
 * after LAYOUT_TIME_LIMIT_MS. Made PDFs are cached by revision hash, engine version and review state
 * (BoundedBytesCache: 32 entries, 64 MB); the same PDF asked for twice while it is being made is made once.
 */
export const PDF_WORKER_FILE = path.join(process.cwd(), '.worker-dist', 'report-worker.mjs');
const MAX_WAITING = 10;
const LAYOUT_TIME_LIMIT_MS = 30_000;
const HEAP_LIMIT_MB = 384;
export const PDF_CACHE_LIMITS = { maxEntries: 32, maxBytes: 64 * 1024 * 1024, maxEntryBytes: 16 * 1024 * 1024 };

interface PdfState {
  pool: Piscina;
  cache: BoundedBytesCache;
  inFlight: Map<string, Promise<Uint8Array>>;
}

const holder = globalThis as unknown as { __denudataPdfPool?: PdfState };

function state(): PdfState {
  if (!holder.__denudataPdfPool) {
    if (!existsSync(PDF_WORKER_FILE)) {
      throw new Error(`The report worker is not built (${PDF_WORKER_FILE}); run: node scripts/build-worker.mjs`);
    }
    holder.__denudataPdfPool = {
      pool: new Piscina({
        filename: pathToFileURL(PDF_WORKER_FILE).href,
        // One thread, started on first use and kept for ten minutes (fonts stay loaded between reports).
        minThreads: 0,
        maxThreads: 1,
        idleTimeout: 10 * 60_000,
        maxQueue: MAX_WAITING,
        resourceLimits: { maxOldGenerationSizeMb: HEAP_LIMIT_MB, maxYoungGenerationSizeMb: 48, stackSizeMb: 4 },
      }),
      cache: new BoundedBytesCache(PDF_CACHE_LIMITS),
      inFlight: new Map(),
    };
  }
  return holder.__denudataPdfPool;
}

async function layOut(pool: Piscina, model: ReportModel): Promise<Uint8Array> {
  if (pool.queueSize >= MAX_WAITING) {
    throw new AppError('rate_limited', 'Too many reports are being made right now; try again in a few seconds.', { retryAfter: 5 });
  }
  const signal = AbortSignal.timeout(LAYOUT_TIME_LIMIT_MS);
  try {
    return (await pool.run({ model }, { signal })) as Uint8Array;
  } catch (error) {
    if (signal.aborted) throw new AppError('limit_exceeded', `The report took longer than ${LAYOUT_TIME_LIMIT_MS / 1000} s to lay out and was stopped.`);
    if (/queue is at limit/i.test(error instanceof Error ? error.message : '')) {
      throw new AppError('rate_limited', 'Too many reports are being made right now; try again in a few seconds.', { retryAfter: 5 });
    }
    throw error;
  }
}

/** The PDF of a report: from the cache, or laid out in the report worker. */
export async function reportPdf(model: ReportModel): Promise<{ bytes: Uint8Array; cached: boolean }> {
  const s = state();
  const key = reportCacheKey(model);
  const hit = s.cache.get(key);
  if (hit) return { bytes: hit, cached: true };
  let pending = s.inFlight.get(key);
  if (!pending) {
    pending = layOut(s.pool, model).finally(() => s.inFlight.delete(key));
    s.inFlight.set(key, pending);
    const bytes = await pending;
    s.cache.set(key, bytes);
    return { bytes, cached: false };
  }
  return { bytes: await pending, cached: false };
}

/**
 * Starts laying out a report's PDF in the background (the report page does, so the download that usually follows
 * is a cache hit). Never waits and never throws; skipped when the worker already has work waiting.
 */
export function prepareReportPdf(model: ReportModel): void {
  try {
    const s = state();
    if (s.pool.queueSize > 0) return;
    reportPdf(model).catch(() => undefined);
  } catch {
    // No worker built (a development server before the first build): the route makes it on demand.
  }
}

/** Counts of the PDF cache (tests, diagnostics). */
export function reportPdfStats() {
  return holder.__denudataPdfPool?.cache.stats() ?? { entries: 0, bytes: 0, hits: 0, misses: 0 };
}

/** Empties the cache (benchmarks measure the cold case with it). */
export function clearReportPdfCache(): void {
  holder.__denudataPdfPool?.cache.clear();
}

/** Stops the report thread (tests, shutdown). */
export async function closeReportPdfPool(): Promise<void> {
  const s = holder.__denudataPdfPool;
  holder.__denudataPdfPool = undefined;
  if (s) await s.pool.destroy();
}
