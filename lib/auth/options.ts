import type { NextAuthOptions } from 'next-auth';
import CredentialsProvider from 'next-auth/providers/credentials';
import { z } from 'zod';
import { verifyCredentials } from '@/lib/db/users';
import { clientAddress, penaliseRateLimit } from '@/lib/rate-limit';
import { cachedDecode } from './token-cache';

const credentialsSchema = z.object({ email: z.string().trim().email(), password: z.string().min(1).max(200) });

/** The `error` next-auth passes to the sign-in form when sign-in is rate limited: `rate_limited:<seconds>`. */
export const signInRateLimitError = (seconds: number) => `rate_limited:${Math.max(1, Math.ceil(seconds))}`;

/**
 * Where to go after signing in or out: a URL on this app (absolute or a path), else the sheets index.
 * An unparsable callbackUrl (query, form or a planted cookie) falls back instead of failing the request.
 */
export function safeRedirect({ url, baseUrl }: { url: string; baseUrl: string }): string {
  try {
    if (!/[\\\u0000-\u001f\u007f]/.test(url)) {
      const target = new URL(url, baseUrl);
      if (target.origin === new URL(baseUrl).origin) return target.href;
    }
  } catch {
    // not a URL: fall back below
  }
  return `${baseUrl.replace(/\/$/, '')}/sheets`;
}

const appUrl = process.env.NEXTAUTH_URL ?? process.env.DENUDATA_APP_URL ?? '';

export const authOptions: NextAuthOptions = {
  session: { strategy: 'jwt', maxAge: 60 * 60 * 12 },
  // next-auth's own decode behind a bounded cache of recent tokens (lib/auth/token-cache.ts).
  jwt: { decode: cachedDecode },
  // Session and CSRF cookies carry Secure (and the __Secure-/__Host- names) whenever the app is served over https.
  useSecureCookies: appUrl.startsWith('https://'),
  pages: { signIn: '/sign-in' },
  providers: [
    CredentialsProvider({
      id: 'credentials',
      name: 'E-mail and password',
      credentials: {
        email: { label: 'E-mail', type: 'email' },
        password: { label: 'Password', type: 'password' },
      },
      async authorize(raw, request) {
        const parsed = credentialsSchema.safeParse(raw);
        if (!parsed.success) return null;
        const user = await verifyCredentials(parsed.data);
        if (user) return { id: user.id, name: user.name, email: user.email };
        // A failed sign-in counts against the account and the client address (the route refuses
        // further attempts with 429 once either is used up: app/api/auth/[...nextauth]/route.ts).
        const headers = (request?.headers ?? {}) as Record<string, string | undefined>;
        await penaliseRateLimit(['signInAccount', parsed.data.email.toLowerCase()], ['signInAddress', clientAddress(headers)]);
        return null;
      },
    }),
  ],
  callbacks: {
    async redirect(params) {
      return safeRedirect(params);
    },
    async jwt({ token, user }) {
      if (user) {
        token.userId = user.id;
        // Kept across token renewals (unlike iat), so a later password change can end this session.
        token.signedInAt = Date.now();
      }
      return token;
    },
    async session({ session, token }) {
      if (session.user && typeof token.userId === 'string') session.user.id = token.userId;
      if (typeof token.signedInAt === 'number') session.signedInAt = token.signedInAt;
      return session;
    },
  },
};
