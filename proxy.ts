import { withAuth, type NextRequestWithAuth } from 'next-auth/middleware';
import { NextResponse, type NextFetchEvent, type NextRequest } from 'next/server';
import { pageContentSecurityPolicy } from '@/lib/http/security-headers';

// Runs before every page and API request (not static files):
//  - a method the app does not serve (TRACE, CONNECT, anything unknown) is 405 with the contract's error body;
//  - API routes pass straight on (they answer 401 JSON themselves: a redirect is no answer for an API client);
//  - pages get a fresh nonce and the Content-Security-Policy that names it (Next.js puts the nonce on its
//    own scripts when the request carries the policy), and all but the sign-in pages need a session.

const METHODS = new Set(['GET', 'HEAD', 'POST', 'PUT', 'PATCH', 'DELETE', 'OPTIONS']);
const PUBLIC_PAGES = /^\/(sign-in|sign-up|reset-password|invitations)(\/|$)/;

function withPolicy(request: NextRequest): NextResponse {
  const nonce = Buffer.from(crypto.randomUUID()).toString('base64');
  const policy = pageContentSecurityPolicy(nonce, { development: process.env.NODE_ENV === 'development' });
  const headers = new Headers(request.headers);
  headers.set('x-nonce', nonce);
  headers.set('content-security-policy', policy);
  const response = NextResponse.next({ request: { headers } });
  response.headers.set('content-security-policy', policy);
  return response;
}

const signedInPage = withAuth((request: NextRequestWithAuth) => withPolicy(request), { pages: { signIn: '/sign-in' } });

export default async function proxy(request: NextRequest, event: NextFetchEvent) {
  if (!METHODS.has(request.method.toUpperCase())) {
    return NextResponse.json(
      { error: { code: 'method_not_allowed', message: `${request.method} is not a method this app serves.` } },
      { status: 405, headers: { Allow: [...METHODS].join(', ') } },
    );
  }
  const { pathname } = request.nextUrl;
  if (pathname === '/api' || pathname.startsWith('/api/')) return NextResponse.next();
  if (PUBLIC_PAGES.test(pathname)) return withPolicy(request);
  return signedInPage(request as NextRequestWithAuth, event);
}

export const config = {
  matcher: ['/((?!_next/static|_next/image|fonts|icon.svg|favicon.ico).*)'],
};
