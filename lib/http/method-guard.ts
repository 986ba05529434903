// Methods that never reach proxy.ts or a route handler are answered here, in the Node.js server itself,
// before Next.js sees the request (installed once by instrumentation.ts when the server starts):
//  - any method outside GET, HEAD, POST, PUT, PATCH, DELETE and OPTIONS (PROPFIND, TRACE, …) → 405, on every
//    path: the app's API routes do not pass through proxy.ts (its matcher), and route files can only name
//    the methods above (`notAllowed` answers those a route does not serve); the web Request that Next.js
//    builds refuses TRACE and TRACK (it answered 500);
//  - a method Node's HTTP parser does not know (TRACK, or any made-up token such as FOO) is refused by
//    the parser, which would answer a bare 400 → 405 (the `clientError` of an invalid method);
//  - CONNECT is handed to a `connect` listener, and without one Node drops the connection → 405;
//  - static files (/_next/static, /fonts, the icons) do not pass through proxy.ts, and Next.js answered
//    other methods than GET and HEAD with 500 → 405.
// Every 405 has the contract's error shape and an Allow header. Every request that passes also gets the socket's
// peer address in PEER_HEADER (lib/http/peer.ts), for the per-address rate limits.
import http from 'node:http';
import type { Duplex } from 'node:stream';
import { PEER_HEADER } from './peer';

/** The methods the app serves anywhere; every other one is 405 here. */
const SERVED = new Set(['GET', 'HEAD', 'POST', 'PUT', 'PATCH', 'DELETE', 'OPTIONS']);
const ALLOW = [...SERVED].join(', ');
/** Paths that proxy.ts leaves out (its matcher): only GET and HEAD are served there. */
const STATIC_PATHS = /^\/(_next\/static\/|_next\/image|fonts\/|favicon\.ico$|icon\.svg$)/;
const STATIC_ALLOW = 'GET, HEAD';

const body405 = (method: string) =>
  JSON.stringify({ error: { code: 'method_not_allowed', message: `${method || 'That method'} is not a method this app serves here.` } });

function answer405(response: http.ServerResponse, method: string, allow: string): void {
  const body = body405(method);
  response.writeHead(405, {
    'content-type': 'application/json',
    'content-length': Buffer.byteLength(body),
    allow,
    'x-content-type-options': 'nosniff',
  });
  response.end(body);
}

/** A whole 405 answer written straight to a socket (the parser refused the request, or CONNECT). */
function raw405(socket: Duplex, method: string): void {
  if (!socket.writable) return void socket.destroy();
  const body = body405(method);
  socket.end(
    'HTTP/1.1 405 Method Not Allowed\r\n' +
      'Content-Type: application/json\r\n' +
      `Content-Length: ${Buffer.byteLength(body)}\r\n` +
      `Allow: ${ALLOW}\r\n` +
      'X-Content-Type-Options: nosniff\r\n' +
      'Connection: close\r\n\r\n' +
      body,
  );
}

/** The method token at the start of a request the parser refused, if it is one (for the message). */
function methodOf(error: { rawPacket?: Buffer }): string {
  const token = error.rawPacket?.subarray(0, 32).toString('latin1').split(' ')[0] ?? '';
  return /^[A-Za-z]{1,24}$/.test(token) ? token : '';
}

export function installMethodGuard(): void {
  const server = http.Server.prototype as http.Server & { denudataMethodGuard?: boolean };
  if (server.denudataMethodGuard) return;
  server.denudataMethodGuard = true;
  const emit = server.emit;
  server.emit = function guardedEmit(this: http.Server & { denudataConnectGuard?: boolean }, event: string | symbol, ...args: unknown[]) {
    if (event === 'connection' && !this.denudataConnectGuard) {
      // Node drops a CONNECT when the server has no listener for it: give it one that answers 405.
      this.denudataConnectGuard = true;
      if (this.listenerCount('connect') === 0) this.on('connect', (request: http.IncomingMessage, socket: Duplex) => raw405(socket, request.method ?? 'CONNECT'));
    }
    if (event === 'clientError') {
      const [error, socket] = args as [NodeJS.ErrnoException & { rawPacket?: Buffer }, Duplex];
      if (error?.code === 'HPE_INVALID_METHOD') {
        raw405(socket, methodOf(error));
        return true;
      }
    }
    if (event === 'request') {
      const [request, response] = args as [http.IncomingMessage, http.ServerResponse];
      // The socket's peer, for per-address limits (lib/http/peer.ts); a client's own value is replaced.
      request.headers[PEER_HEADER] = request.socket?.remoteAddress ?? '';
      const method = (request.method ?? '').toUpperCase();
      if (method !== 'GET' && method !== 'HEAD' && STATIC_PATHS.test(request.url ?? '')) {
        answer405(response, method, STATIC_ALLOW);
        request.resume();
        return true;
      }
      if (!SERVED.has(method)) {
        answer405(response, method, ALLOW);
        request.resume();
        return true;
      }
    }
    return (emit as (this: http.Server, event: string | symbol, ...rest: unknown[]) => boolean).call(this, event, ...args);
  } as typeof server.emit;
}
