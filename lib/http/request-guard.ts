// Request-forgery and content-type rules every route handler gets through `route()` (CONTRACT §6):
//  - a write (POST, PUT, PATCH, DELETE) whose Origin header is present and not the app's own origin,
//    or whose Sec-Fetch-Site is `cross-site`, is 403 `forbidden_origin`; scripted clients that send
//    neither header are not refused for it;
//  - a write with a body must say `application/json` (or `multipart/form-data` where the route takes an
//    upload), else 415 `unsupported_media_type`; a write without a body needs no content type.
// A browser sends a `text/plain` or form POST to another origin without a preflight, so these two rules
// together close the forms and fetches a foreign page can make in a signed-in user's browser.
import { AppError } from '@/lib/errors';

export const WRITE_METHODS = new Set(['POST', 'PUT', 'PATCH', 'DELETE']);

/** Routes that take an upload as multipart/form-data (CONTRACT §6: `POST /api/datasets`). */
export const MULTIPART_ROUTES: readonly RegExp[] = [/^\/api\/datasets\/?$/];

export type RequestRules = {
  /** The route takes an upload as multipart/form-data (as well as JSON). */
  multipart?: boolean;
};

/** The origin of a URL, or null when it is not one. */
function originOf(url: string | undefined): string | null {
  if (!url) return null;
  try {
    return new URL(url).origin;
  } catch {
    return null;
  }
}

/** The app's own origins: the configured app URL, and the origin this request was addressed to. */
export function ownOrigins(request: Request): Set<string> {
  const origins = new Set<string>();
  for (const configured of [originOf(process.env.NEXTAUTH_URL), originOf(process.env.DENUDATA_APP_URL)]) {
    if (configured) origins.add(configured);
  }
  const host = request.headers.get('x-forwarded-host') ?? request.headers.get('host');
  const proto = request.headers.get('x-forwarded-proto') ?? new URL(request.url).protocol.replace(':', '');
  if (host) {
    const fromHost = originOf(`${proto.split(',')[0]!.trim()}://${host.split(',')[0]!.trim()}`);
    if (fromHost) origins.add(fromHost);
  }
  return origins;
}

/** Whether the request carries a body (a declared length above 0, or a chunked body). */
export function hasBody(request: Request): boolean {
  const length = request.headers.get('content-length');
  if (length !== null) return length.trim() !== '0';
  return request.headers.has('transfer-encoding');
}

/** The media type without parameters, lower case: `application/json; charset=utf-8` → `application/json`. */
export function mediaType(request: Request): string {
  return (request.headers.get('content-type') ?? '').split(';')[0]!.trim().toLowerCase();
}

/** Throws 403 or 415 when a write breaks the rules above; reads and body-less writes pass. */
export function checkRequest(request: Request, rules: RequestRules = {}): void {
  if (!WRITE_METHODS.has(request.method.toUpperCase())) return;
  const fetchSite = request.headers.get('sec-fetch-site');
  if (fetchSite && fetchSite.toLowerCase() === 'cross-site') {
    throw new AppError('forbidden_origin', 'This request came from another site; it is refused.');
  }
  const origin = request.headers.get('origin');
  if (origin !== null && !ownOrigins(request).has(origin)) {
    throw new AppError('forbidden_origin', 'This request came from another origin than the app; it is refused.');
  }
  if (!hasBody(request)) return;
  const type = mediaType(request);
  if (type === 'application/json') return;
  const multipart = rules.multipart ?? (request.method.toUpperCase() === 'POST' && MULTIPART_ROUTES.some((pattern) => pattern.test(new URL(request.url).pathname)));
  if (multipart && type === 'multipart/form-data') return;
  throw new AppError(
    'unsupported_media_type',
    multipart
      ? 'Send the body as application/json or multipart/form-data.'
      : 'Send the body as application/json (Content-Type: application/json).',
  );
}
