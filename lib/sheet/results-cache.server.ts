import 'server-only';

/**
 * The last results of each sheet's draft, kept in this server process so the next evaluation of
 * the same sheet recomputes only the blocks that changed and their dependents. A small LRU:
 * losing an entry only costs a full evaluation.
 */
export interface CachedEvaluation<Doc, Results> {
  draftVersion: number;
  document: Doc;
  results: Results;
}

export class ResultsCache<Doc, Results> {
  private entries = new Map<string, CachedEvaluation<Doc, Results>>();
  constructor(private readonly capacity = 200) {}

  get(sheetId: string): CachedEvaluation<Doc, Results> | undefined {
    const entry = this.entries.get(sheetId);
    if (entry) {
      this.entries.delete(sheetId);
      this.entries.set(sheetId, entry);
    }
    return entry;
  }

  /** Keeps the entry unless a newer draft version is already stored. */
  set(sheetId: string, entry: CachedEvaluation<Doc, Results>): void {
    const current = this.entries.get(sheetId);
    if (current && current.draftVersion > entry.draftVersion) return;
    this.entries.delete(sheetId);
    this.entries.set(sheetId, entry);
    while (this.entries.size > this.capacity) {
      const oldest = this.entries.keys().next().value;
      if (oldest === undefined) break;
      this.entries.delete(oldest);
    }
  }

  get size(): number {
    return this.entries.size;
  }
}
