/**
 * A same-site path to return to after signing in. A full URL (next-auth's callbackUrl) keeps only its
 * path; anything odd falls back to the sheets index.
 */
export function safeNextPath(value: string | string[] | undefined): string {
  let path = Array.isArray(value) ? value[0] : value;
  if (path && /^https?:\/\//.test(path)) {
    try {
      const url = new URL(path);
      path = `${url.pathname}${url.search}`;
    } catch {
      path = undefined;
    }
  }
  if (!path || !path.startsWith('/') || path.startsWith('//') || path.startsWith('/api') || path === '/sign-in') return '/sheets';
  return path;
}
