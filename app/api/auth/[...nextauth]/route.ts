import NextAuth from 'next-auth';
import { authOptions, signInRateLimitError } from '@/lib/auth/options';
import { errorResponse, notAllowed } from '@/lib/http';
import { checkRateLimit, clientAddress } from '@/lib/rate-limit';

const handler = NextAuth(authOptions);
type Context = { params: Promise<{ nextauth: string[] }> };

/** The e-mail address of a credentials sign-in form, read from a copy of the body. */
async function formEmail(request: Request): Promise<string | null> {
  try {
    const form = new URLSearchParams(await request.clone().text());
    return form.get('email');
  } catch {
    return null;
  }
}

/**
 * next-auth's own routes (its CSRF token guards its forms). A credentials sign-in whose account or
 * address has used up its failures (lib/rate-limit) answers 429 `rate_limited` with Retry-After
 * before the password is even checked, and the body carries next-auth's `url` with
 * `error=rate_limited:<seconds>` so the sign-in form can say when to try again.
 */
async function POST(request: Request, context: Context) {
  const { nextauth } = await context.params;
  if (nextauth?.[0] === 'callback' && nextauth[1] === 'credentials') {
    try {
      const email = (await formEmail(request))?.trim().toLowerCase();
      await checkRateLimit(['signInAccount', email], ['signInAddress', clientAddress(request.headers)]);
    } catch (error) {
      const response = errorResponse(error);
      const seconds = Number(response.headers.get('retry-after') ?? '0');
      if (response.status !== 429) return response;
      const body = await response.json();
      const base = process.env.NEXTAUTH_URL ?? new URL(request.url).origin;
      return Response.json(
        { ...body, url: `${base.replace(/\/$/, '')}/sign-in?error=${signInRateLimitError(seconds)}` },
        { status: 429, headers: { 'Retry-After': String(seconds) } },
      );
    }
  }
  return handler(request, context);
}

export { handler as GET, POST };

export const { PUT, PATCH, DELETE } = notAllowed('GET, POST');
