/**
 * A same-site path to return to after signing in. A full URL (next-auth's callbackUrl) keeps only its
 * path; anything odd falls back to the sheets index. Browsers read "/\host" and paths with tabs or
 * line breaks ("/\t/host") as "//host", another site, so backslashes and control characters are refused,
 * and the result must resolve to this site.
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
  if (/[\\\u0000-\u001f\u007f\s]/.test(path)) return '/sheets';
  const base = 'http://denudata.invalid';
  try {
    if (new URL(path, base).origin !== base) return '/sheets';
  } catch {
    return '/sheets';
  }
  return path;
}
