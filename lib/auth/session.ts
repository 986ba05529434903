import 'server-only';
import { cookies } from 'next/headers';
import { cache } from 'react';
import { loadSessionContext, type SessionContext } from '@/lib/db/teams';
import { requestScope } from '@/lib/http/request-scope';
import { authOptions } from './options';
import { cachedDecode } from './token-cache';

// The caller of a page or API request, read once per request:
//  - the session token is decoded with next-auth's own decode behind a bounded cache (lib/auth/token-cache.ts),
//    instead of getServerSession, which also re-encrypts a fresh token and builds a CSRF token on every call
//    (and, called as pages and routes call it, could not even send the fresh token back);
//  - the user and their memberships come from one query (loadSessionContext);
//  - API routes keep the answer in their request scope (lib/http/request-scope.ts), pages in React's cache.
// Every check still runs on the server for every request: only repeated look-ups within one request are saved.

export type { SessionContext } from '@/lib/db/teams';

/** next-auth's session cookie name for this app (the __Secure- form when the app URL is https). */
export const SESSION_COOKIE = `${authOptions.useSecureCookies ? '__Secure-' : ''}next-auth.session-token`;

/** The session token from the request's cookies; next-auth splits a long one into `name.0`, `name.1`, … */
export function sessionTokenFrom(all: { name: string; value: string }[]): string | undefined {
  const whole = all.find((c) => c.name === SESSION_COOKIE);
  if (whole) return whole.value;
  const chunks = all
    .filter((c) => c.name.startsWith(`${SESSION_COOKIE}.`) && /^\d+$/.test(c.name.slice(SESSION_COOKIE.length + 1)))
    .sort((a, b) => Number(a.name.slice(SESSION_COOKIE.length + 1)) - Number(b.name.slice(SESSION_COOKIE.length + 1)));
  return chunks.length ? chunks.map((c) => c.value).join('') : undefined;
}

const secret = () => authOptions.secret ?? process.env.NEXTAUTH_SECRET ?? process.env.AUTH_SECRET ?? '';

/** The user id and sign-in time the session token carries, or null (no token, a bad one, an expired one). */
export async function readSessionClaims(): Promise<{ userId: string; signedInAt?: number } | null> {
  const token = sessionTokenFrom((await cookies()).getAll());
  if (!token) return null;
  try {
    const payload = await cachedDecode({ token, secret: secret() });
    if (!payload || typeof payload.userId !== 'string') return null;
    return { userId: payload.userId, signedInAt: typeof payload.signedInAt === 'number' ? payload.signedInAt : undefined };
  } catch {
    return null; // not a token of ours, or expired: no session, as next-auth answers
  }
}

async function load(): Promise<SessionContext | null> {
  const claims = await readSessionClaims();
  return claims ? loadSessionContext({ id: claims.userId, signedInAt: claims.signedInAt }) : null;
}

const loadForRender = cache(load);

/** The signed-in caller with their teams, or null; looked up once per request. */
export function getSessionContext(): Promise<SessionContext | null> {
  const scope = requestScope();
  if (!scope) return loadForRender();
  scope.session ??= load();
  return scope.session as Promise<SessionContext | null>;
}

/** The caller as already looked up in this API request, if it was (the guards use it instead of a query). */
export function sessionLookedUp(): Promise<SessionContext | null> | undefined {
  return requestScope()?.session as Promise<SessionContext | null> | undefined;
}
