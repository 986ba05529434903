import { decode, type JWT, type JWTDecodeParams } from 'next-auth/jwt';

// next-auth's `decode` derives the encryption key with HKDF and decrypts the token on every call; a
// signed-in browser sends the same token with every request until it signs in again. This keeps the
// decoded payload of recent tokens, keyed by the whole token string (only its holder can present it),
// bounded in entries, and still refuses a token once it has expired (with next-auth's 15 s tolerance).
// Used by proxy.ts (pages), lib/auth/session.ts (pages and routes) and authOptions (next-auth's routes).

/** At most this many decoded tokens are kept (a few hundred bytes each). */
export const TOKEN_CACHE_ENTRIES = 2000;
/** The clock tolerance next-auth's own decode uses, in seconds. */
const CLOCK_TOLERANCE_S = 15;

const caches = new Map<string, Map<string, JWT>>();

function cacheFor(secret: string | Buffer, salt: string): Map<string, JWT> {
  const key = `${salt}\u0000${typeof secret === 'string' ? secret : secret.toString('hex')}`;
  let cache = caches.get(key);
  if (!cache) {
    if (caches.size >= 4) caches.clear();
    cache = new Map();
    caches.set(key, cache);
  }
  return cache;
}

const expired = (payload: JWT, now = Date.now() / 1000) => typeof payload.exp === 'number' && payload.exp + CLOCK_TOLERANCE_S < now;

/** next-auth's JWT decode with a bounded cache of recent tokens; a drop-in for `jwt.decode`. */
export async function cachedDecode(params: JWTDecodeParams): Promise<JWT | null> {
  const { token, secret, salt = '' } = params;
  if (!token || !secret) return null;
  const cache = cacheFor(secret, salt);
  const hit = cache.get(token);
  if (hit) {
    cache.delete(token);
    if (expired(hit)) return null;
    cache.set(token, hit); // most recently used last
    return { ...hit };
  }
  const payload = await decode({ token, secret, salt });
  if (!payload) return null;
  cache.set(token, payload);
  if (cache.size > TOKEN_CACHE_ENTRIES) cache.delete(cache.keys().next().value!);
  return { ...payload };
}

/** How many decoded tokens are kept now (for tests). */
export function tokenCacheSize(): number {
  let size = 0;
  for (const cache of caches.values()) size += cache.size;
  return size;
}
