import { expect } from 'vitest';

/**
 * Relative-tolerance comparison, as the reference cases define it: a value passes when
 * |got − expected| ≤ relTol·|expected|, or ≤ absTol when one is given.
 */
export function isClose(got: number, expected: number, relTol: number, absTol = 0): boolean {
  const difference = Math.abs(got - expected);
  return difference <= relTol * Math.abs(expected) || difference <= absTol;
}

export function expectClose(got: unknown, expected: number, relTol = 1e-9, absTol = 0): void {
  expect(typeof got, `expected a number, got ${String(got)}`).toBe('number');
  const ok = isClose(got as number, expected, relTol, absTol);
  expect(ok, `${String(got)} is not within rel ${relTol}${absTol ? ` / abs ${absTol}` : ''} of ${expected}`).toBe(true);
}
