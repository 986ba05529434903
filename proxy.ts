import { withAuth } from 'next-auth/middleware';

// Pages need a session; the API answers 401 JSON by itself, so it is left out here.
export default withAuth({ pages: { signIn: '/sign-in' } });

export const config = {
  matcher: ['/((?!api|_next/static|_next/image|fonts|icon.svg|favicon.ico|sign-in|sign-up|reset-password|invitations).*)'],
};
