/**
 * Strict UTF-8 checks for uploads (CONTRACT §7.2): the offset of the first byte that is not part of
 * well-formed UTF-8 (RFC 3629: no overlong forms, no surrogates, nothing above U+10FFFF), or of the
 * first NUL byte. Pure.
 */

export type EncodingFault = { offset: number; kind: 'nul' | 'invalid' };

/** The first NUL byte or malformed sequence, or null when the bytes are well-formed UTF-8 without NUL. */
export function findEncodingFault(bytes: Uint8Array): EncodingFault | null {
  const n = bytes.length;
  let i = 0;
  while (i < n) {
    const b = bytes[i]!;
    if (b === 0) return { offset: i, kind: 'nul' };
    if (b < 0x80) {
      i++;
      continue;
    }
    let need: number;
    let min: number;
    let code: number;
    if (b >= 0xc2 && b <= 0xdf) {
      need = 1;
      min = 0x80;
      code = b & 0x1f;
    } else if (b >= 0xe0 && b <= 0xef) {
      need = 2;
      min = 0x800;
      code = b & 0x0f;
    } else if (b >= 0xf0 && b <= 0xf4) {
      need = 3;
      min = 0x10000;
      code = b & 0x07;
    } else {
      return { offset: i, kind: 'invalid' };
    }
    for (let k = 1; k <= need; k++) {
      const c = bytes[i + k];
      if (c === undefined || (c & 0xc0) !== 0x80) return { offset: i, kind: 'invalid' };
      code = (code << 6) | (c & 0x3f);
    }
    if (code < min || code > 0x10ffff || (code >= 0xd800 && code <= 0xdfff)) return { offset: i, kind: 'invalid' };
    i += need + 1;
  }
  return null;
}

/** The 1-based line of a byte offset (LF bytes before it, plus one). */
export function lineOfOffset(bytes: Uint8Array, offset: number): number {
  let line = 1;
  for (let i = 0; i < offset && i < bytes.length; i++) if (bytes[i] === 0x0a) line++;
  return line;
}
