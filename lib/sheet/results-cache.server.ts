import 'server-only';

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
  private entries = new Map<string, { entry: CachedEvaluation<Doc, Results>; bytes: number }>();
  private totalBytes = 0;

  constructor(
    private readonly capacity = 200,
    private readonly maxBytes = RESULTS_CACHE_BYTES,
    private readonly sizeOf: (entry: CachedEvaluation<Doc, Results>) => number = defaultSizeOf,
  ) {}

  get(sheetId: string): CachedEvaluation<Doc, Results> | undefined {
    const slot = this.entries.get(sheetId);
    if (slot) {
      this.entries.delete(sheetId);
      this.entries.set(sheetId, slot);
    }
    return slot?.entry;
  }

  /**
   * Keeps the entry unless a newer draft version is already stored; an entry larger than a quarter
   * of the byte bound is not kept at all (and drops the sheet's older one).
   */
  set(sheetId: string, entry: CachedEvaluation<Doc, Results>): void {
    const current = this.entries.get(sheetId);
    if (current && current.entry.draftVersion > entry.draftVersion) return;
    this.remove(sheetId);
    const bytes = this.sizeOf(entry);
    if (bytes > this.maxBytes / 4) return;
    this.entries.set(sheetId, { entry, bytes });
    this.totalBytes += bytes;
    while (this.entries.size > this.capacity || this.totalBytes > this.maxBytes) {
      const oldest = this.entries.keys().next().value;
      if (oldest === undefined) break;
      this.remove(oldest);
    }
  }

  private remove(sheetId: string): void {
    const slot = this.entries.get(sheetId);
    if (!slot) return;
    this.entries.delete(sheetId);
    this.totalBytes -= slot.bytes;
  }

  get size(): number {
    return this.entries.size;
  }

  /** Bytes held, as sizeOf counts them. */
  get bytes(): number {
    return this.totalBytes;
  }
}
