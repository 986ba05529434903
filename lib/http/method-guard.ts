// TRACE, TRACK and CONNECT cannot reach proxy.ts or a route handler: the web Request that Next.js builds for
// them refuses those methods and the server answered 500. This guard answers them with 405 (the contract's
// error shape) in the Node.js server itself, before Next.js sees the request. Installed once by
// instrumentation.ts when the server starts.
import http from 'node:http';

const REFUSED = new Set(['TRACE', 'TRACK', 'CONNECT']);
const ALLOW = 'GET, HEAD, POST, PUT, PATCH, DELETE, OPTIONS';

export function installMethodGuard(): void {
  const server = http.Server.prototype as http.Server & { denudataMethodGuard?: boolean };
  if (server.denudataMethodGuard) return;
  server.denudataMethodGuard = true;
  const emit = server.emit;
  server.emit = function guardedEmit(this: http.Server, event: string | symbol, ...args: unknown[]) {
    if (event === 'request') {
      const [request, response] = args as [http.IncomingMessage, http.ServerResponse];
      if (REFUSED.has((request.method ?? '').toUpperCase())) {
        const body = JSON.stringify({ error: { code: 'method_not_allowed', message: `${request.method} is not a method this app serves.` } });
        response.writeHead(405, {
          'content-type': 'application/json',
          'content-length': Buffer.byteLength(body),
          allow: ALLOW,
          'x-content-type-options': 'nosniff',
        });
        response.end(body);
        request.resume();
        return true;
      }
    }
    return (emit as (this: http.Server, event: string | symbol, ...rest: unknown[]) => boolean).call(this, event, ...args);
  } as typeof server.emit;
}
