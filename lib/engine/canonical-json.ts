/**
 * RFC 8785 (JSON Canonicalization Scheme) serialisation, the same algorithm as the
 * `canonicalize` package (v4.0.0), which tests/engine/canonical-json.test.ts compares it with.
 *
 * Why not import the package: canonicalize 4 is ESM-only with an "import"-only export map, so
 * it cannot be loaded where tsx runs our TypeScript as CommonJS (scripts, the data layer)
 * on Node 20. The algorithm is short: sorted keys (UTF-16 code units), ECMAScript number and
 * string serialisation (JSON.stringify), no whitespace.
 *
 * It runs on every evaluation (the results carry the document's hash), so it appends to one
 * string instead of building an array per object, and checks strings for lone surrogates with
 * the engine's String.prototype.isWellFormed where it exists.
 */

type WellFormed = { isWellFormed?: () => boolean };
const nativeWellFormed = typeof (String.prototype as WellFormed).isWellFormed === 'function';

function hasLoneSurrogate(value: string): boolean {
  if (nativeWellFormed) return !(value as unknown as Required<WellFormed>).isWellFormed();
  return scanForLoneSurrogate(value);
}

/**
 * The same test by scanning UTF-16 code units, for engines without String.prototype.isWellFormed: Node.js has
 * it from 20, browsers from 2023 (Chrome 111, Firefox 119, Safari 16.4), and the sheet page's merge check
 * runs this module in the browser. Exported so tests can compare it with the native one.
 */
export function scanForLoneSurrogate(value: string): boolean {
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

/** Canonical JSON text of a string (throws on a lone surrogate). */
export function canonicalString(value: string): string {
  return stringText(value);
}

function stringText(value: string): string {
  if (hasLoneSurrogate(value)) throw new Error('Lone surrogate is not allowed');
  return JSON.stringify(value);
}

function write(value: unknown, seen: Set<object>): string {
  switch (typeof value) {
    case 'string':
      return stringText(value);
    case 'number':
      if (!Number.isFinite(value)) throw new Error(Number.isNaN(value) ? 'NaN is not allowed' : 'Infinity is not allowed');
      return JSON.stringify(value);
    case 'object':
      break;
    default:
      // booleans, and what JSON.stringify makes of undefined, functions, symbols and bigints
      return JSON.stringify(value);
  }
  if (value === null) return 'null';
  const object = value as Record<string, unknown> & { toJSON?: () => unknown };
  if (seen.has(object)) throw new Error('Circular reference detected');
  seen.add(object);
  let result: string;
  if (typeof object.toJSON === 'function') {
    result = write(object.toJSON(), seen);
  } else if (Array.isArray(object)) {
    result = '[';
    for (let i = 0; i < object.length; i++) {
      const item: unknown = object[i];
      if (i > 0) result += ',';
      const text: string | undefined = write(item === undefined || typeof item === 'symbol' ? null : item, seen);
      if (text !== undefined) result += text; // as Array.prototype.join does with a function's undefined
    }
    result += ']';
  } else {
    result = '{';
    let first = true;
    for (const key of Object.keys(object).sort()) {
      const item = object[key];
      if (item === undefined || typeof item === 'symbol') continue;
      if (!first) result += ',';
      first = false;
      result += `${stringText(key)}:${write(item, seen)}`;
    }
    result += '}';
  }
  seen.delete(object);
  return result;
}

/** Canonical JSON text of a JSON value. Throws on NaN, Infinity, lone surrogates and cycles. */
export function canonicalJson(value: unknown, seen: Set<object> = new Set()): string {
  return write(value, seen);
}
