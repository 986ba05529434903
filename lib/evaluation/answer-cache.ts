import { createHash } from 'node:crypto';
import { ByteBoundedLru } from '@/lib/cache/byte-bounded-lru';

/**
 * Answers kept by the SHA-256 of a request's text. `POST /api/evaluate` keys a body whose answer depends
 * on nothing but that text (a document whose datasets, if any, all came in the body: evaluation
 * is deterministic, so the same text gives the same results). A repeated body is then answered without
 * parsing, validating, cloning to a worker thread or serialising again. Only an optimisation: a miss
 * evaluates in full, and every check before the body (session, rate limit, size) still runs.
 *
 * A small LRU bounded in entries and in bytes (the answers' text length); an answer over a quarter of
 * the byte bound is not kept; a body longer than `maxKeyedBytes` is not looked up at all (hashing it
 * would cost more than a rare repeat saves).
 *
 * `POST /api/quick` keys an expression's text the same way (its own instance, smaller): a quick calculation
 * depends on nothing but that text (no data, no user setting; random numbers are not in the language), so
 * the preview computed while the text was typed answers the same text when it is entered. Failures are never
 * set by either route (a time limit or a full queue is no property of the text).
 */
export class AnswerCache {
  private readonly lru: ByteBoundedLru<string, string>;

  constructor(
    readonly capacity = 256,
    readonly maxBytes = 32 * 1024 * 1024,
    readonly maxKeyedBytes = 256 * 1024,
  ) {
    this.lru = new ByteBoundedLru(capacity, maxBytes, (answer) => answer.length);
  }

  /** The cache key of a body's text, or null when the body is too long to be kept. */
  keyOf(text: string): string | null {
    if (text.length > this.maxKeyedBytes) return null;
    return createHash('sha256').update(text, 'utf8').digest('base64');
  }

  get(key: string | null): string | undefined {
    return key === null ? undefined : this.lru.get(key);
  }

  set(key: string | null, answer: string): void {
    if (key !== null) this.lru.set(key, answer);
  }

  get size(): number {
    return this.lru.size;
  }

  /** Characters held (the answers' text length). */
  get bytes(): number {
    return this.lru.bytes;
  }
}
