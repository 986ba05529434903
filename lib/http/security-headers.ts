// Response headers for security (README "Headers"): a Content-Security-Policy that lets only the app's
// own scripts run (a fresh nonce per page, set by proxy.ts, for the inline scripts Next.js and the theme
// switch need). The fixed headers every answer carries (nosniff, referrer and permissions policies, no
// framing, and the API's own policy) are set in next.config.mjs.

/** The policy of a page: scripts only with this request's nonce (and what they load), nothing framed. */
export function pageContentSecurityPolicy(nonce: string, { development = false } = {}): string {
  return [
    "default-src 'self'",
    // 'strict-dynamic': chunks loaded by the nonce'd Next.js runtime are allowed; nothing inline without the nonce.
    `script-src 'self' 'nonce-${nonce}' 'strict-dynamic'${development ? " 'unsafe-eval'" : ''}`,
    // Observable Plot and CodeMirror inject <style> elements and style attributes at run time.
    "style-src 'self' 'unsafe-inline'",
    "img-src 'self' data: blob:",
    "font-src 'self'",
    `connect-src 'self'${development ? ' ws: wss:' : ''}`,
    "worker-src 'self' blob:",
    "object-src 'none'",
    "base-uri 'self'",
    "form-action 'self'",
    "frame-ancestors 'none'",
  ].join('; ');
}
