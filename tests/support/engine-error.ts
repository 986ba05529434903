import { expect } from 'vitest';
import { EngineError } from '@/lib/engine/errors';

/** The EngineError a call throws (fails the test when it throws nothing or something else). */
export function engineError(call: () => unknown): EngineError {
  try {
    call();
  } catch (error) {
    expect(error).toBeInstanceOf(EngineError);
    return error as EngineError;
  }
  throw new Error('expected an EngineError, nothing was thrown');
}
