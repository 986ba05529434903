import { withAuth, type NextRequestWithAuth } from 'next-auth/middleware';
import { NextResponse, type NextFetchEvent, type NextRequest } from 'next/server';
import { withoutBadCallbackCookies, isUsableCallbackUrl } from '@/lib/http/auth-inputs';
import { pageContentSecurityPolicy } from '@/lib/http/security-headers';
import { cachedDecode } from '@/lib/auth/token-cache';

// Runs before every page request and next-auth's own routes (/api/auth/*); not before static files nor the
// app's other API routes (its matcher below), which need none of it: each API route authenticates and
// answers 401 JSON itself (lib/http `route()`), a method it does not serve is 405 from its route file
// (`notAllowed`) or, for methods no route file can name, from the Node.js server (lib/http/method-guard.ts),
// and only next-auth reads the callback URL. Leaving them out saves Next.js's proxy round (a web Request and
// Response built and merged) on every API call. What it does:
//  - a method the app does not serve is 405 with the contract's error body: any but GET, HEAD and POST on a
//    page (lib/http/method-guard.ts answers methods outside GET, HEAD, POST, PUT, PATCH, DELETE, OPTIONS
//    everywhere, before Next.js sees them);
//  - an unparsable next-auth callback URL (cookie, or query of /api/auth) is dropped (lib/http/auth-inputs.ts);
//  - next-auth's routes then pass straight on;
//  - pages get a fresh nonce and the Content-Security-Policy that names it (Next.js puts the nonce on its
//    own scripts when the request carries the policy), and all but the sign-in pages need a session.

const METHODS = new Set(['GET', 'HEAD', 'POST', 'PUT', 'PATCH', 'DELETE', 'OPTIONS']);
/** Pages are read (GET, HEAD) and take server actions (POST); Next.js would render them for any method. */
const PAGE_METHODS = new Set(['GET', 'HEAD', 'POST']);
const PUBLIC_PAGES = /^\/(sign-in|sign-up|reset-password|invitations)(\/|$)/;

/** The request headers with bad callback-url cookies removed, and the names removed. */
function cleanHeaders(request: NextRequest): { headers: Headers; dropped: string[] } {
  const headers = new Headers(request.headers);
  const { header, dropped } = withoutBadCallbackCookies(request.headers.get('cookie'), request.nextUrl.origin);
  if (dropped.length) {
    if (header) headers.set('cookie', header);
    else headers.delete('cookie');
  }
  return { headers, dropped };
}

function forgetCookies(response: NextResponse, names: string[]): NextResponse {
  for (const name of names) response.cookies.set(name, '', { path: '/', maxAge: 0, secure: name.startsWith('__Secure-') });
  return response;
}

function withPolicy(request: NextRequest): NextResponse {
  const { headers, dropped } = cleanHeaders(request);
  const nonce = Buffer.from(crypto.randomUUID()).toString('base64');
  const policy = pageContentSecurityPolicy(nonce, { development: process.env.NODE_ENV === 'development' });
  headers.set('x-nonce', nonce);
  headers.set('content-security-policy', policy);
  const response = NextResponse.next({ request: { headers } });
  response.headers.set('content-security-policy', policy);
  return forgetCookies(response, dropped);
}

function api(request: NextRequest): NextResponse {
  const { headers, dropped } = cleanHeaders(request);
  const callbackUrl = request.nextUrl.searchParams.get('callbackUrl');
  if (request.nextUrl.pathname.startsWith('/api/auth/') && callbackUrl !== null && !isUsableCallbackUrl(callbackUrl, request.nextUrl.origin)) {
    const url = request.nextUrl.clone();
    url.searchParams.delete('callbackUrl');
    return forgetCookies(NextResponse.rewrite(url, { request: { headers } }), dropped);
  }
  if (!dropped.length) return NextResponse.next();
  return forgetCookies(NextResponse.next({ request: { headers } }), dropped);
}

// The session token is decoded by next-auth's decode behind a bounded cache (the same token arrives with
// every request of a signed-in browser).
const signedInPage = withAuth((request: NextRequestWithAuth) => withPolicy(request), { pages: { signIn: '/sign-in' }, jwt: { decode: cachedDecode } });

function methodNotAllowed(request: NextRequest, allowed: Set<string>): NextResponse {
  return NextResponse.json(
    { error: { code: 'method_not_allowed', message: `${request.method} is not a method this app serves here.` } },
    { status: 405, headers: { Allow: [...allowed].join(', ') } },
  );
}

export default async function proxy(request: NextRequest, event: NextFetchEvent) {
  const method = request.method.toUpperCase();
  const { pathname } = request.nextUrl;
  const isApi = pathname === '/api' || pathname.startsWith('/api/');
  if (!METHODS.has(method)) return methodNotAllowed(request, METHODS);
  if (!isApi && !PAGE_METHODS.has(method)) return methodNotAllowed(request, PAGE_METHODS);
  if (isApi) return api(request);
  if (PUBLIC_PAGES.test(pathname)) return withPolicy(request);
  return signedInPage(request as NextRequestWithAuth, event);
}

export const config = {
  // Pages (everything but static files and the API), and next-auth's routes. tests/http/proxy-matcher.test.ts
  // checks which paths it takes.
  matcher: ['/((?!api/|api$|_next/static|_next/image|fonts|icon.svg|favicon.ico).*)', '/api/auth/:path*'],
};
