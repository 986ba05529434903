import { describe, expect, it } from 'vitest';
import { AnswerCache, QuickAnswerCache } from '@/lib/evaluation/answer-cache';

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

describe('QuickAnswerCache (answers of POST /api/quick by expression text)', () => {
  it('should key an answer by the exact expression text', () => {
    const cache = new QuickAnswerCache();
    cache.set('1 km to m', '{"value":1000}');
    expect(cache.get('1 km to m')).toBe('{"value":1000}');
    expect(cache.get('1 km to  m')).toBeUndefined();
    expect(cache.get('1 KM to m')).toBeUndefined();
  });

  it('should stay within its entry and byte bounds and refuse an answer over a quarter of the bytes', () => {
    const cache = new QuickAnswerCache(3, 400);
    for (let i = 0; i < 5; i++) cache.set(`${i} m`, 'a'.repeat(50));
    expect(cache.size).toBe(3);
    expect(cache.get('0 m')).toBeUndefined();
    expect(cache.get('4 m')).toBe('a'.repeat(50));
    cache.set('big', 'b'.repeat(101));
    expect(cache.get('big')).toBeUndefined();
    const small = new QuickAnswerCache(100, 400);
    for (let i = 0; i < 10; i++) small.set(`${i}`, 'c'.repeat(100));
    expect(small.bytes).toBe(400);
    expect(small.size).toBe(4);
  });
});
