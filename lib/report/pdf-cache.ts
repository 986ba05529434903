/**
 * A bounded cache of made PDFs: at most `maxEntries` entries and `maxBytes` bytes in all, least recently
 * used first out; a PDF larger than `maxEntryBytes` is never kept. Pure (no I/O), so it is tested alone.
 * The key says everything a PDF is made from (reportCacheKey), so an entry never goes stale: it is only
 * pushed out.
 */
import { createHash } from 'node:crypto';
import type { ReportModel } from './types';

export interface BytesCacheLimits {
  maxEntries: number;
  maxBytes: number;
  maxEntryBytes: number;
}

export class BoundedBytesCache {
  private readonly entries = new Map<string, Uint8Array>();
  private bytes = 0;
  hits = 0;
  misses = 0;

  constructor(readonly limits: BytesCacheLimits) {}

  get(key: string): Uint8Array | undefined {
    const value = this.entries.get(key);
    if (value === undefined) {
      this.misses += 1;
      return undefined;
    }
    this.hits += 1;
    // Most recently used last.
    this.entries.delete(key);
    this.entries.set(key, value);
    return value;
  }

  set(key: string, value: Uint8Array): void {
    const old = this.entries.get(key);
    if (old) {
      this.entries.delete(key);
      this.bytes -= old.byteLength;
    }
    if (value.byteLength > this.limits.maxEntryBytes) return;
    this.entries.set(key, value);
    this.bytes += value.byteLength;
    while (this.entries.size > this.limits.maxEntries || this.bytes > this.limits.maxBytes) {
      const [oldest, bytes] = this.entries.entries().next().value as [string, Uint8Array];
      this.entries.delete(oldest);
      this.bytes -= bytes.byteLength;
    }
  }

  clear(): void {
    this.entries.clear();
    this.bytes = 0;
  }

  stats(): { entries: number; bytes: number; hits: number; misses: number } {
    return { entries: this.entries.size, bytes: this.bytes, hits: this.hits, misses: this.misses };
  }
}

/**
 * The cache key of a report's PDF: the revision hash, the engine version that recalculated it, and a
 * SHA-256 of everything else the PDF prints (the review state and trail, team, sheet, notices, figures),
 * except the time the report was made. Two sheets holding the same document (a fork) get different keys.
 */
export function reportCacheKey(model: ReportModel): string {
  const { generatedAt: _made, ...rest } = model;
  const digest = createHash('sha256').update(JSON.stringify(rest)).digest('hex');
  return `${model.revision.hash}:${model.engine.current}:${digest}`;
}
