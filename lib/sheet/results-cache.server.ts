import 'server-only';
import { ByteBoundedLru } from '@/lib/cache/byte-bounded-lru';

/**
 * The last results of each sheet's draft, kept in this server process so the next evaluation of
 * the same sheet recomputes only the blocks that changed and their dependents. A small LRU bounded
 * both in entries and in bytes (the JSON size of each entry's document and results): losing an
 * entry only costs a full evaluation, and incremental results equal a full evaluation's, so the
 * cache is an optimisation only (another app instance without it gives the same results).
 */
export interface CachedEvaluation<Doc, Results> {
  draftVersion: number;
  document: Doc;
  results: Results;
  /** The datasets the evaluation could resolve (sorted hashes), when it used any. */
  datasetKey?: string;
}

/** Default byte bound of the process's results cache. */
export const RESULTS_CACHE_BYTES = 64 * 1024 * 1024;

/** JSON length of an entry's document and results (a close, cheap stand-in for its memory). */
function defaultSizeOf(entry: CachedEvaluation<unknown, unknown>): number {
  return JSON.stringify(entry.document ?? null).length + JSON.stringify(entry.results ?? null).length;
}

export class ResultsCache<Doc, Results> {
  private readonly lru: ByteBoundedLru<string, CachedEvaluation<Doc, Results>>;

  constructor(capacity = 200, maxBytes = RESULTS_CACHE_BYTES, sizeOf: (entry: CachedEvaluation<Doc, Results>) => number = defaultSizeOf) {
    this.lru = new ByteBoundedLru(capacity, maxBytes, sizeOf);
  }

  get(sheetId: string): CachedEvaluation<Doc, Results> | undefined {
    return this.lru.get(sheetId);
  }

  /**
   * Keeps the entry unless a newer draft version is already stored; an entry larger than a quarter
   * of the byte bound is not kept at all (and drops the sheet's older one).
   */
  set(sheetId: string, entry: CachedEvaluation<Doc, Results>): void {
    const current = this.lru.peek(sheetId);
    if (current && current.draftVersion > entry.draftVersion) return;
    this.lru.set(sheetId, entry);
  }

  get size(): number {
    return this.lru.size;
  }

  /** Bytes held, as sizeOf counts them. */
  get bytes(): number {
    return this.lru.bytes;
  }
}
