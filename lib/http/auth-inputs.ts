// next-auth 4 refuses an unparsable callbackUrl (in the query of its routes, or in its callback-url cookie)
// by throwing, which made a 500 of its routes and of every page and route reading the session: a planted
// cookie blocked sign-in in that browser for good. proxy.ts drops such values before next-auth sees them
// (the cookie from the request and from the browser, the query parameter from the URL); the app's own
// redirect callback (lib/auth/options safeRedirect) then sends the user to the app's own page.
// No imports beyond the standard library: proxy.ts runs it on every request.

export const CALLBACK_COOKIES = ['next-auth.callback-url', '__Secure-next-auth.callback-url'];

/** next-auth's own test of a callback URL (an absolute http(s) URL, or a path on the app). */
export function isUsableCallbackUrl(value: string, base: string): boolean {
  try {
    return /^https?:/.test(new URL(value, value.startsWith('/') ? base : undefined).protocol);
  } catch {
    return false;
  }
}

/** Cookie header without the callback-url cookies next-auth would choke on, and their names. */
export function withoutBadCallbackCookies(cookieHeader: string | null, base: string): { header: string | null; dropped: string[] } {
  if (!cookieHeader) return { header: cookieHeader, dropped: [] };
  const dropped: string[] = [];
  const kept = cookieHeader
    .split(';')
    .map((part) => part.trim())
    .filter((part) => {
      const index = part.indexOf('=');
      const name = index < 0 ? part : part.slice(0, index);
      if (!CALLBACK_COOKIES.includes(name)) return true;
      let value = part.slice(index + 1);
      try {
        value = decodeURIComponent(value);
      } catch {
        dropped.push(name);
        return false;
      }
      if (isUsableCallbackUrl(value, base)) return true;
      dropped.push(name);
      return false;
    });
  return { header: dropped.length ? kept.join('; ') : cookieHeader, dropped };
}
