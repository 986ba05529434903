import canonicalize from 'canonicalize';
import { describe, expect, it } from 'vitest';
import { canonicalJson } from '@/lib/engine/canonical-json';
import { DEMO_SHEETS } from '@/lib/demo/sheets';

// RFC 8785 (JSON Canonicalization Scheme); the canonicalize package (v4.0.0) is the reference.
describe('canonicalJson', () => {
  const samples: unknown[] = [
    { b: 1, a: [3, 'x', null, true], c: { z: 1e21, y: -0.0, x: 1.5e-7 } },
    { '\u20ac': 1, '\r': 2, '1': 3, A: 4, a: 5, 'é': 6, '😀': 7 },
    'text with "quotes" and \n newlines \u0007',
    [1, [2, [3, { k: undefined, j: 1 }]]],
    ...DEMO_SHEETS.map((s) => s.document),
  ];
  it('should produce the same text as the canonicalize package', () => {
    for (const sample of samples) expect(canonicalJson(sample)).toBe(canonicalize(sample));
  });

  it('should refuse NaN, Infinity and lone surrogates like the package', () => {
    expect(() => canonicalJson({ x: Number.NaN })).toThrow();
    expect(() => canonicalJson([Infinity])).toThrow();
    expect(() => canonicalJson('\ud800')).toThrow();
  });
});
