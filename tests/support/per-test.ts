import { expect } from 'vitest';

/**
 * A value computed inside each test that uses it (once per test, shared by that test's assertions).
 * Mutation testing (Stryker's vitest runner) switches a mutant on in a `beforeAll` hook, after the file has been
 * collected, and runs only the tests that reached the mutant: a result computed in a `describe` body, or once for
 * several tests, would be computed with no mutant active or outside the tests that check it.
 */
export function perTest<T>(compute: () => T): () => T {
  let cell: { test: string | undefined; value: T } | undefined;
  return () => {
    const test = expect.getState().currentTestName;
    if (cell === undefined || cell.test !== test) cell = { test, value: compute() };
    return cell.value;
  };
}
