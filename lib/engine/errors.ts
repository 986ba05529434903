/**
 * Engine errors carry data: which block, which input, what was expected and what was given.
 * Their messages are safe to show to users (never a stack trace).
 */
export interface EngineErrorDetails {
  block?: string;
  input?: string;
  expected?: string;
  given?: string;
}

export class EngineError extends Error {
  readonly block?: string;
  readonly input?: string;
  readonly expected?: string;
  readonly given?: string;

  constructor(message: string, details: EngineErrorDetails = {}) {
    super(message);
    this.name = 'EngineError';
    this.block = details.block;
    this.input = details.input;
    this.expected = details.expected;
    this.given = details.given;
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
    // mathjs messages are short and describe the expression; keep the first line only.
    const first = error.message.split('\n')[0]?.trim() ?? '';
    return first.length > 0 ? first.slice(0, 300) : 'the expression could not be evaluated';
  }
  return 'the expression could not be evaluated';
}
