// The address a request really came from, for per-address rate limits. The Node.js server's request hook
// (lib/http/method-guard.ts) writes the socket's peer address into PEER_HEADER on every request, replacing
// whatever a client sent under that name; `clientAddress` (lib/rate-limit) then believes X-Forwarded-For only
// when that peer is a proxy we trust: loopback by default (a reverse proxy on the same host, and the test
// runs), plus the addresses in DENUDATA_TRUSTED_PROXIES (comma-separated). A client talking to the app
// directly is counted by its own address, whatever X-Forwarded-For it sends. No I/O here.

/** The request header that carries the socket's peer address (set by the server, never by a client). */
export const PEER_HEADER = 'x-denudata-peer';

/** `::ffff:127.0.0.1` (an IPv4 peer on an IPv6 socket) → `127.0.0.1`; other addresses lower-cased. */
export function normaliseAddress(address: string): string {
  const trimmed = address.trim().toLowerCase();
  return trimmed.startsWith('::ffff:') && trimmed.includes('.') ? trimmed.slice(7) : trimmed;
}

/** Whether a peer is a proxy whose X-Forwarded-For is believed: loopback, or listed in DENUDATA_TRUSTED_PROXIES. */
export function isTrustedProxy(peer: string, configured = process.env.DENUDATA_TRUSTED_PROXIES ?? ''): boolean {
  const address = normaliseAddress(peer);
  if (address === '::1' || /^127\.\d{1,3}\.\d{1,3}\.\d{1,3}$/.test(address)) return true;
  return configured
    .split(',')
    .map((entry) => entry.trim())
    .filter(Boolean)
    .some((entry) => normaliseAddress(entry) === address);
}
