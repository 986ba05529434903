/**
 * RFC 8785 (JSON Canonicalization Scheme) serialisation, the same algorithm as the
 * `canonicalize` package (v4.0.0), which tests/engine/canonical-json.test.ts compares it with.
 *
 * Why not import the package: canonicalize 4 is ESM-only with an "import"-only export map, so
 * it cannot be loaded where tsx runs our TypeScript as CommonJS (scripts, the data layer)
 * on Node 20. The algorithm is short: sorted keys (UTF-16 code units), ECMAScript number and
 * string serialisation (JSON.stringify), no whitespace.
 */

function hasLoneSurrogate(value: string): boolean {
  for (let i = 0; i < value.length; i++) {
    const code = value.charCodeAt(i);
    if (code >= 0xd800 && code <= 0xdbff) {
      const next = i + 1 < value.length ? value.charCodeAt(i + 1) : 0;
      if (!(next >= 0xdc00 && next <= 0xdfff)) return true;
      i++;
    } else if (code >= 0xdc00 && code <= 0xdfff) {
      return true;
    }
  }
  return false;
}

/** Canonical JSON text of a JSON value. Throws on NaN, Infinity, lone surrogates and cycles. */
export function canonicalJson(value: unknown, seen: Set<object> = new Set()): string {
  if (typeof value === 'number' && !Number.isFinite(value)) {
    throw new Error(Number.isNaN(value) ? 'NaN is not allowed' : 'Infinity is not allowed');
  }
  if (typeof value === 'string' && hasLoneSurrogate(value)) throw new Error('Lone surrogate is not allowed');
  if (value === null || typeof value !== 'object') return JSON.stringify(value);
  const object = value as Record<string, unknown> & { toJSON?: () => unknown };
  if (seen.has(object)) throw new Error('Circular reference detected');
  seen.add(object);
  let result: string;
  if (typeof object.toJSON === 'function') {
    result = canonicalJson(object.toJSON(), seen);
  } else if (Array.isArray(object)) {
    result = `[${object.map((item) => canonicalJson(item === undefined || typeof item === 'symbol' ? null : item, seen)).join(',')}]`;
  } else {
    const parts: string[] = [];
    for (const key of Object.keys(object).sort()) {
      const item = object[key];
      if (item === undefined || typeof item === 'symbol') continue;
      parts.push(`${canonicalJson(key)}:${canonicalJson(item, seen)}`);
    }
    result = `{${parts.join(',')}}`;
  }
  seen.delete(object);
  return result;
}
