/**
 * The one typed client for Denudata's JSON API, used by the browser code (and its react-query hooks).
 * Every failure becomes one ApiError rebuilt from the contract's error shape
 * `{"error": {"code", "message", "field"?}}` (CONTRACT.md, API), plus the rest of the body (a 409 says
 * what is current) and the status. A network failure is an ApiError with status 0 and code `network`.
 */

export interface ApiErrorBody {
  error: { code: string; message: string; field?: string; [key: string]: unknown };
  [key: string]: unknown;
}

export class ApiError extends Error {
  readonly status: number;
  readonly code: string;
  readonly field?: string;
  /** The whole error body, for members such as `current` on a 409. */
  readonly body: unknown;

  constructor(status: number, code: string, message: string, options: { field?: string; body?: unknown } = {}) {
    super(message);
    this.name = 'ApiError';
    this.status = status;
    this.code = code;
    this.field = options.field;
    this.body = options.body ?? null;
  }
}

function isErrorBody(body: unknown): body is ApiErrorBody {
  if (typeof body !== 'object' || body === null || !('error' in body)) return false;
  const error = (body as { error: unknown }).error;
  return typeof error === 'object' && error !== null && typeof (error as { message?: unknown }).message === 'string';
}

/** The ApiError for a non-2xx answer, from the contract's error body when there is one. */
export function apiErrorOf(status: number, body: unknown): ApiError {
  if (isErrorBody(body)) {
    const { code, message, field } = body.error;
    return new ApiError(status, typeof code === 'string' ? code : 'error', message, { field: typeof field === 'string' ? field : undefined, body });
  }
  return new ApiError(status, 'error', `The server answered ${status}.`, { body });
}

export interface ApiRequest {
  method?: 'GET' | 'POST' | 'PUT' | 'PATCH' | 'DELETE';
  /** Sent as JSON, or as multipart when it is a FormData. */
  body?: unknown;
  signal?: AbortSignal;
}

/**
 * Calls the API and returns the parsed JSON answer typed as T (the route's answer type: a `z.infer` of
 * its schema or a `lib/db` return type). Throws ApiError for any status outside 2xx and for network failures.
 */
export async function apiFetch<T>(path: string, request: ApiRequest = {}): Promise<T> {
  return (await apiResponse<T>(path, request)).body;
}

/** As apiFetch, with the 2xx status beside the answer (201 created or 200 already there, 202 accepted...). */
export async function apiResponse<T>(path: string, request: ApiRequest = {}): Promise<{ status: number; body: T }> {
  const { method = request.body === undefined ? 'GET' : 'POST', body, signal } = request;
  let response: Response;
  try {
    response = await fetch(path, {
      method,
      signal,
      headers: body === undefined || body instanceof FormData ? undefined : { 'content-type': 'application/json' },
      body: body === undefined ? undefined : body instanceof FormData ? body : JSON.stringify(body),
    });
  } catch (error) {
    if (error instanceof DOMException && error.name === 'AbortError') throw error;
    throw new ApiError(0, 'network', 'The server could not be reached. Check the connection and try again.');
  }
  const text = await response.text();
  let parsed: unknown = null;
  if (text) {
    try {
      parsed = JSON.parse(text);
    } catch {
      parsed = null;
    }
  }
  if (!response.ok) throw apiErrorOf(response.status, parsed);
  return { status: response.status, body: parsed as T };
}

/**
 * What to show for a failure: the contract's message and field when the server gave them (or the network
 * message), otherwise `fallback`; with the status (0 for a network failure, -1 for anything not an ApiError).
 */
export function failureOf(error: unknown, fallback: string): { status: number; code: string; message: string; field?: string } {
  if (error instanceof ApiError) {
    return { status: error.status, code: error.code, message: error.code === 'error' ? fallback : error.message, field: error.field };
  }
  return { status: -1, code: 'error', message: fallback };
}

/** The message to show for anything thrown by apiFetch (or elsewhere). */
export function errorMessage(error: unknown, fallback = 'Something went wrong. Try again.'): string {
  if (error instanceof Error && error.message) return error.message;
  return fallback;
}
