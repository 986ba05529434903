// One error type for everything the web layer may show a user, mapped to HTTP in one place.
export type ErrorCode =
  | 'validation'
  | 'hash_mismatch'
  | 'unauthenticated'
  | 'forbidden'
  | 'not_found'
  | 'conflict'
  | 'too_large'
  | 'unsupported_media_type'
  | 'limit_exceeded'
  | 'rate_limited'
  | 'method_not_allowed'
  | 'forbidden_origin'
  | 'database_unavailable'
  | 'internal'
  // Datasets (CONTRACT §6 additions, §7)
  | 'invalid_dataset'
  | 'unknown_dataset'
  | 'dataset_in_use'
  | 'quota_exceeded';

const STATUS: Record<ErrorCode, number> = {
  validation: 400,
  hash_mismatch: 400,
  unauthenticated: 401,
  forbidden: 403,
  not_found: 404,
  conflict: 409,
  too_large: 413,
  unsupported_media_type: 415,
  limit_exceeded: 422,
  rate_limited: 429,
  method_not_allowed: 405,
  forbidden_origin: 403,
  database_unavailable: 503,
  internal: 500,
  invalid_dataset: 400,
  unknown_dataset: 400,
  dataset_in_use: 409,
  quota_exceeded: 409,
};

export class AppError extends Error {
  readonly code: ErrorCode;
  readonly status: number;
  readonly field?: string;
  /** Extra members of the error body, such as `current` on a conflict. */
  readonly extra?: Record<string, unknown>;
  /** Extra members of the error object itself, such as `position` on a parse error. */
  readonly detail?: Record<string, unknown>;
  /** Seconds after which a retry may succeed (sent as Retry-After with 429 and 503). */
  readonly retryAfter?: number;

  constructor(
    code: ErrorCode,
    message: string,
    options: { field?: string; extra?: Record<string, unknown>; detail?: Record<string, unknown>; retryAfter?: number } = {},
  ) {
    super(message);
    this.name = 'AppError';
    this.code = code;
    this.status = STATUS[code];
    this.field = options.field;
    this.extra = options.extra;
    this.detail = options.detail;
    this.retryAfter = options.retryAfter;
  }

  toBody() {
    return {
      error: { code: this.code, message: this.message, ...(this.field ? { field: this.field } : {}), ...this.detail },
      ...this.extra,
    };
  }
}

export const badRequest = (message: string, field?: string) => new AppError('validation', message, { field });
export const unauthenticated = () => new AppError('unauthenticated', 'Sign in to continue.');
export const forbidden = (message = 'Your role in this team does not allow that.') => new AppError('forbidden', message);
export const notFound = (what = 'That') => new AppError('not_found', `${what} was not found.`);
export const conflict = (message: string, extra?: Record<string, unknown>) => new AppError('conflict', message, { extra });
/** 429 with Retry-After (whole seconds, at least 1). */
export const rateLimited = (message: string, retryAfterSeconds: number) =>
  new AppError('rate_limited', message, { retryAfter: Math.max(1, Math.ceil(retryAfterSeconds)) });
/** 422: an evaluation stopped as a whole by its time or memory limit. */
export const limitExceeded = (message: string) => new AppError('limit_exceeded', message);

/** "45 seconds", "1 minute", "14 minutes", "1 hour": how long until a rate limit lifts, in words. */
export function describeWait(seconds: number): string {
  if (seconds < 60) return `${seconds} second${seconds === 1 ? '' : 's'}`;
  const minutes = Math.ceil(seconds / 60);
  if (minutes < 60) return `${minutes} minute${minutes === 1 ? '' : 's'}`;
  const hours = Math.ceil(minutes / 60);
  return `${hours} hour${hours === 1 ? '' : 's'}`;
}
