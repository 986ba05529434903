import { describe, expect, it } from 'vitest';
import { ResultsCache } from '@/lib/sheet/results-cache.server';

describe('ResultsCache', () => {
  it('should drop the least recently used sheet beyond its capacity', () => {
    const cache = new ResultsCache<string, number>(2);
    cache.set('a', { draftVersion: 1, document: 'a', results: 1 });
    cache.set('b', { draftVersion: 1, document: 'b', results: 2 });
    cache.get('a');
    cache.set('c', { draftVersion: 1, document: 'c', results: 3 });
    expect(cache.get('b')).toBeUndefined();
    expect(cache.get('a')?.results).toBe(1);
    expect(cache.size).toBe(2);
  });

  it('should not replace a newer draft version with an older one', () => {
    const cache = new ResultsCache<string, number>();
    cache.set('a', { draftVersion: 5, document: 'new', results: 5 });
    cache.set('a', { draftVersion: 4, document: 'old', results: 4 });
    expect(cache.get('a')).toEqual({ draftVersion: 5, document: 'new', results: 5 });
  });
});
