import { describe, expect, it } from 'vitest';
import { AnswerCache } from '@/lib/evaluation/answer-cache';

describe('AnswerCache (answers of POST /api/evaluate by body text)', () => {
  it('should key a body by the SHA-256 of its text: the same text gives the same key, any change another', () => {
    const cache = new AnswerCache();
    const body = JSON.stringify({ document: { title: 'a' } });
    expect(cache.keyOf(body)).toBe(cache.keyOf(`${body}`));
    expect(cache.keyOf(body)).not.toBe(cache.keyOf(body.replace('"a"', '"b"')));
    expect(cache.keyOf(`${body} `)).not.toBe(cache.keyOf(body));
    // SHA-256 of "abc" (FIPS 180-2, appendix B.1), base64.
    expect(cache.keyOf('abc')).toBe(Buffer.from('ba7816bf8f01cfea414140de5dae2223b00361a396177a9cb410ff61f20015ad', 'hex').toString('base64'));
  });

  it('should neither look up nor keep a body longer than its keyed limit', () => {
    const cache = new AnswerCache(8, 1000, 10);
    expect(cache.keyOf('x'.repeat(11))).toBeNull();
    cache.set(null, 'answer');
    expect(cache.get(null)).toBeUndefined();
    expect(cache.size).toBe(0);
  });

  it('should drop the least recently used answer beyond its capacity', () => {
    const cache = new AnswerCache(2);
    cache.set('a', '1');
    cache.set('b', '2');
    expect(cache.get('a')).toBe('1');
    cache.set('c', '3');
    expect(cache.get('b')).toBeUndefined();
    expect(cache.get('a')).toBe('1');
    expect(cache.get('c')).toBe('3');
    expect(cache.size).toBe(2);
  });

  it('should stay within its byte bound, refuse an answer over a quarter of it, and count replacements once', () => {
    const cache = new AnswerCache(100, 100);
    cache.set('big', 'x'.repeat(26));
    expect(cache.get('big')).toBeUndefined();
    for (let i = 0; i < 6; i++) cache.set(`k${i}`, 'y'.repeat(20));
    expect(cache.bytes).toBeLessThanOrEqual(100);
    expect(cache.size).toBe(5);
    expect(cache.get('k0')).toBeUndefined();
    cache.set('k5', 'z'.repeat(10));
    expect(cache.get('k5')).toBe('z'.repeat(10));
    expect(cache.bytes).toBe(4 * 20 + 10);
  });
});

describe('AnswerCache as POST /api/quick uses it (answers by expression text)', () => {
  const quickCache = (capacity = 1024, bytes = 4 * 1024 * 1024) => new AnswerCache(capacity, bytes, 4096);

  it('should key an answer by the exact expression text, and every expression the body allows', () => {
    const cache = quickCache();
    cache.set(cache.keyOf('1 km to m'), '{"value":1000}');
    expect(cache.get(cache.keyOf('1 km to m'))).toBe('{"value":1000}');
    expect(cache.get(cache.keyOf('1 km to  m'))).toBeUndefined();
    expect(cache.get(cache.keyOf('1 KM to m'))).toBeUndefined();
    const longest = `${'1+'.repeat(999)}1`; // 1,999 characters: under the body schema's 2,000
    expect(cache.keyOf(longest)).not.toBeNull();
  });

  it('should stay within its entry and byte bounds and refuse an answer over a quarter of the bytes', () => {
    const cache = quickCache(3, 400);
    for (let i = 0; i < 5; i++) cache.set(cache.keyOf(`${i} m`), 'a'.repeat(50));
    expect(cache.size).toBe(3);
    expect(cache.get(cache.keyOf('0 m'))).toBeUndefined();
    expect(cache.get(cache.keyOf('4 m'))).toBe('a'.repeat(50));
    cache.set(cache.keyOf('big'), 'b'.repeat(101));
    expect(cache.get(cache.keyOf('big'))).toBeUndefined();
    const small = quickCache(100, 400);
    for (let i = 0; i < 10; i++) small.set(small.keyOf(`${i}`), 'c'.repeat(100));
    expect(small.bytes).toBe(400);
    expect(small.size).toBe(4);
  });
});
