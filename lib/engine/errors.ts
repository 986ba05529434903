/**
 * Engine errors carry data: which block, which input, what was expected and what was given.
 * Their messages are safe to show to users (never a stack trace).
 */
/**
 * What kind of failure it is, so callers never classify by message text: `invalid` (the document, an input or
 * an expression is at fault: the message says which), `limit_exceeded` (a time, memory or size limit stopped
 * the work, not a fault of the document), `cancelled` (stopped on request).
 */
export const ENGINE_ERROR_CODES = ['invalid', 'limit_exceeded', 'cancelled'] as const;
export type EngineErrorCode = (typeof ENGINE_ERROR_CODES)[number];

export interface EngineErrorDetails {
  /** Default `invalid`. */
  code?: EngineErrorCode;
  block?: string;
  input?: string;
  expected?: string;
  given?: string;
  /** 0-based character index in the expression as typed, for parse errors. */
  position?: number;
}

export class EngineError extends Error {
  readonly code: EngineErrorCode;
  readonly block?: string;
  readonly input?: string;
  readonly expected?: string;
  readonly given?: string;
  readonly position?: number;

  constructor(message: string, details: EngineErrorDetails = {}) {
    super(message);
    this.name = 'EngineError';
    this.code = details.code ?? 'invalid';
    this.block = details.block;
    this.input = details.input;
    this.expected = details.expected;
    this.given = details.given;
    if (details.position !== undefined) this.position = details.position;
  }
}

/** An error about one input of a block type: "diffusivity: expected ..., got ...". */
export class InputError extends EngineError {
  constructor(input: string, message: string, details: Omit<EngineErrorDetails, 'input'> = {}) {
    super(`${input}: ${message}`, { ...details, input });
    this.name = 'InputError';
  }
}

/** Turns anything thrown into a short, user-safe message. */
export function toSafeMessage(error: unknown): string {
  if (error instanceof EngineError) return error.message;
  if (error instanceof RangeError && /call stack/i.test(error.message)) {
    return 'the expression is nested too deeply';
  }
  if (error instanceof Error) {
    if (/^Unexpected type of argument in function to\b/.test(error.message)) {
      return 'to converts a value that has a unit, and the value before it is a plain number (atan, asin and acos give radians as plain numbers: write (atan(x) rad) to deg)';
    }
    const typeError = /^Unexpected type of argument in function (\w+) \(expected: ([^,]+?)(?:, actual: ([^,]+))?, index: (\d+)\)/.exec(error.message);
    if (typeError) {
      const [, fn, expected, actual, index] = typeError;
      return `${fn}: input ${Number(index) + 1} should be ${expected!.replace(/ or /g, ' or ')}${actual ? `, not ${actual}` : ''}`;
    }
    // mathjs messages are short and describe the expression; keep the first line only.
    const first = error.message.split('\n')[0]?.trim() ?? '';
    return first.length > 0 ? first.slice(0, 300) : 'the expression could not be evaluated';
  }
  return 'the expression could not be evaluated';
}
