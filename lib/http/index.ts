import 'server-only';
import { NextResponse } from 'next/server';
import { z, type ZodType } from 'zod';
import { AppError, badRequest } from '@/lib/errors';
import { checkRequest, type RequestRules } from './request-guard';
import { runInRequestScope } from './request-scope';

export { checkRequest, type RequestRules } from './request-guard';
export { safeText } from '@/lib/engine/text';

/** The largest JSON body any route accepts, in bytes. */
export const MAX_BODY_BYTES = 1_000_000;

export function json(data: unknown, status = 200, headers?: HeadersInit): NextResponse {
  return NextResponse.json(data, { status, headers });
}

/** A 200 answer whose JSON text is already made (the same body and content type as json() gives for its value). */
export function jsonText(text: string): NextResponse {
  return new NextResponse(text, { status: 200, headers: { 'content-type': 'application/json' } });
}

/** The first problem zod found, as a message and a dotted field path. */
export function firstIssue(error: z.ZodError): { message: string; field?: string } {
  const issue = error.issues[0];
  if (!issue) return { message: 'The input is not valid.' };
  const field = issue.path.length ? issue.path.map(String).join('.') : undefined;
  return { message: field ? `${field}: ${issue.message}` : issue.message, field };
}

export function parseWith<T>(schema: ZodType<T>, input: unknown): T {
  const parsed = schema.safeParse(input);
  if (!parsed.success) {
    const { message, field } = firstIssue(parsed.error);
    throw badRequest(message, field);
  }
  return parsed.data;
}

/** The largest JSON body of the routes that carry datasets (bundles, evaluations with datasets). */
export const MAX_DATASET_BODY_BYTES = 8_000_000;

const tooLarge = (limit = MAX_BODY_BYTES) => new AppError('too_large', `The request body is larger than ${limit / 1_000_000} MB.`);

/**
 * The body as text, at most MAX_BODY_BYTES: 413 as soon as the declared length or the bytes read so far
 * pass the limit, so an oversized body is never buffered whole.
 */
export async function readBodyText(request: Request, maxBytes = MAX_BODY_BYTES): Promise<string> {
  const declared = Number(request.headers.get('content-length') ?? '');
  if (Number.isFinite(declared) && declared > maxBytes) throw tooLarge(maxBytes);
  if (!request.body) return '';
  const reader = request.body.getReader();
  const chunks: Uint8Array[] = [];
  let size = 0;
  for (;;) {
    let chunk: ReadableStreamReadResult<Uint8Array>;
    try {
      chunk = await reader.read();
    } catch {
      // The client went away while sending (a newer keystroke aborts an unsaved evaluation): not a
      // database fault, and nobody reads the answer.
      throw badRequest('The request body could not be read: the connection closed.');
    }
    const { done, value } = chunk;
    if (done) break;
    size += value.byteLength;
    if (size > maxBytes) {
      await reader.cancel().catch(() => undefined);
      throw tooLarge(maxBytes);
    }
    chunks.push(value);
  }
  return new TextDecoder().decode(Buffer.concat(chunks));
}

/** Reads a JSON body (at most MAX_BODY_BYTES) and parses it with the schema: 400 or 413 otherwise. */
export async function readJson<T>(request: Request, schema: ZodType<T>, maxBytes = MAX_BODY_BYTES): Promise<T> {
  return parseJsonText(await readBodyText(request, maxBytes), schema);
}

/** A body already read (readBodyText) parsed as readJson parses it: the same checks and the same 400s. */
export function parseJsonText<T>(text: string, schema: ZodType<T>): T {
  let body: unknown;
  try {
    body = text.length ? JSON.parse(text) : undefined;
  } catch {
    throw badRequest('The request body is not valid JSON.');
  }
  if (body === undefined) throw badRequest('The request needs a JSON body.');
  checkJsonShape(body);
  return parseWith(schema, body);
}

/** How deeply a JSON body may nest objects and arrays (a sheet document needs 5 levels). */
export const MAX_JSON_DEPTH = 32;
/** Keys that reach JavaScript object internals: refused anywhere in a body rather than dropped. */
const PROTOTYPE_KEYS = new Set(['__proto__', 'constructor', 'prototype']);

/**
 * Refuses bodies nested deeper than MAX_JSON_DEPTH and keys such as `__proto__` anywhere in them (400
 * naming where). Iterative, so a hostile body cannot exhaust the stack.
 */
export function checkJsonShape(body: unknown): void {
  const stack: { value: unknown; path: string; depth: number }[] = [{ value: body, path: '', depth: 0 }];
  while (stack.length) {
    const { value, path, depth } = stack.pop()!;
    if (value === null || typeof value !== 'object') continue;
    if (depth >= MAX_JSON_DEPTH) throw badRequest(`The request body is nested more than ${MAX_JSON_DEPTH} levels deep.`, path || undefined);
    if (Array.isArray(value)) {
      value.forEach((item, i) => stack.push({ value: item, path: `${path}[${i}]`, depth: depth + 1 }));
      continue;
    }
    for (const key of Object.keys(value)) {
      const field = path ? `${path}.${key}` : key;
      if (PROTOTYPE_KEYS.has(key)) throw badRequest(`${field}: "${key}" is not allowed as a key.`, field);
      stack.push({ value: (value as Record<string, unknown>)[key], path: field, depth: depth + 1 });
    }
  }
}

export function readQuery<T>(request: Request, schema: ZodType<T>): T {
  const params = Object.fromEntries(new URL(request.url).searchParams.entries());
  return parseWith(schema, params);
}

const CONNECTION_ERRORS = new Set([
  'SequelizeConnectionError',
  'SequelizeConnectionRefusedError',
  'SequelizeConnectionTimedOutError',
  'SequelizeConnectionAcquireTimeoutError',
  'SequelizeHostNotFoundError',
  'SequelizeHostNotReachableError',
]);
// PostgreSQL's "the server is going away or not yet up" codes: admin_shutdown, crash_shutdown, cannot_connect_now.
const UNAVAILABLE_CODES = new Set(['57P01', '57P02', '57P03', 'ECONNREFUSED', 'ECONNRESET']);

/** Whether an error says the database could not be reached (rather than that a query was wrong). */
export function isDatabaseUnavailable(error: unknown): boolean {
  if (!(error instanceof Error)) return false;
  if (CONNECTION_ERRORS.has(error.name)) return true;
  const parent = (error as Error & { parent?: { code?: string }; original?: { code?: string } }).parent ?? (error as { original?: { code?: string } }).original;
  const code = parent?.code ?? (error as { code?: string }).code;
  if (code && UNAVAILABLE_CODES.has(code)) return true;
  return /Connection terminated|connect ECONNREFUSED|the database system is (shutting down|starting up)/i.test(error.message);
}

/** Turns any error into the contract's JSON error body; unexpected ones are logged, never shown. */
export function errorResponse(error: unknown): NextResponse {
  if (error instanceof AppError) {
    if (error.status >= 500) console.error('[denudata]', error.code, error.message);
    const headers = error.retryAfter !== undefined ? { 'Retry-After': String(error.retryAfter) } : undefined;
    return json(error.toBody(), error.status, headers);
  }
  if (isDatabaseUnavailable(error)) {
    console.error('[denudata] database unavailable:', error instanceof Error ? error.message : 'unknown');
    const unavailable = new AppError('database_unavailable', 'The database cannot be reached just now. Nothing was changed; try again in a moment.');
    const response = json(unavailable.toBody(), unavailable.status);
    response.headers.set('Retry-After', '5');
    return response;
  }
  console.error('[denudata] unexpected error:', error instanceof Error ? `${error.name}: ${error.message}` : 'unknown');
  return json({ error: { code: 'internal', message: 'Something went wrong on the server. Try again.' } }, 500);
}

type Handler<Ctx> = (request: Request, context: Ctx) => Promise<Response>;

/**
 * Wraps a route handler: the request-forgery and content-type rules first (403 `forbidden_origin`,
 * 415 `unsupported_media_type`; lib/http/request-guard.ts), and every error leaves as the contract's
 * JSON shape. `rules.multipart` lets an upload route take multipart/form-data. The handler runs in a
 * request scope (lib/http/request-scope.ts), so the caller's session is looked up once per request.
 */
export function route<Ctx>(handler: Handler<Ctx>, rules: RequestRules = {}): Handler<Ctx> {
  return (request, context) =>
    runInRequestScope(async () => {
      try {
        checkRequest(request, rules);
        return await handler(request, context);
      } catch (error) {
        return errorResponse(error);
      }
    });
}

export const uuidParam = z.string().uuid('must be a valid id');

const SERVED_METHODS = ['GET', 'POST', 'PUT', 'PATCH', 'DELETE'] as const;
type ServedMethod = (typeof SERVED_METHODS)[number];

/**
 * Handlers for the methods a route does not serve: 405 `method_not_allowed` in the contract's shape with
 * `Allow` (Next.js alone would answer an empty 405). Each route file ends with
 * `export const { PUT, PATCH, DELETE } = notAllowed('GET, POST');` listing what it does serve.
 */
export function notAllowed(allowed: string): Record<ServedMethod, (request: Request) => Promise<Response>> {
  const allow = `${allowed}, OPTIONS`;
  const handler = async (request: Request) =>
    json(
      { error: { code: 'method_not_allowed', message: `${request.method} is not served here; use ${allowed}.` } },
      405,
      { Allow: allow },
    );
  return Object.fromEntries(SERVED_METHODS.map((method) => [method, handler])) as Record<ServedMethod, typeof handler>;
}
