import fc from 'fast-check';
import { describe, expect, it } from 'vitest';
import { EngineError, evaluateQuick, MAX_MATRIX_ELEMENTS, MAX_STRING_LENGTH } from '@/lib/engine';

// Expression fuzzing (issue 8): generated expressions of numbers, units, operators, functions,
// matrices, strings and nesting go through the engine. Every outcome must be a result within the
// caps or an EngineError with a clear, short message; nothing may crash or run past the app's
// 5 s limit. Sizes are drawn so that the caps are reached often (1000 × 1000 outer products,
// 100,001-element constructors, texts doubled past 1000 characters).

const APP_TIME_LIMIT_MS = 5000;

const sizes = fc.constantFrom('0', '1', '2', '3', '10', '50', '400', '1000', '100001', '-1', '2.5');
const numbers = fc.oneof(
  fc.constantFrom('0', '1', '-1', '2', '0.5', '1e308', '-1e308', '1e-320', 'pi', 'e', 'Infinity', 'NaN'),
  fc.double({ noNaN: true, noDefaultInfinity: true, min: -1e6, max: 1e6 }).map((value) => String(value)),
  fc.integer({ min: -1000, max: 1000 }).map(String),
);
const units = fc.constantFrom('m', 'km', 'mm/yr', 'kyr', 'm^2/s', 'degC', 'K', 'kg/m^3', 'deg', 'Ma', 's', 'W/m^2');
const strings = fc.oneof(
  fc.string({ maxLength: 20 }).map((s) => JSON.stringify(s)),
  fc.constantFrom(`"${'a'.repeat(600)}"`, '"thrust"', '""', '"normal"'),
);
const unary = fc.constantFrom('-', '+', 'not ');
const binary = fc.constantFrom(' + ', ' - ', ' * ', ' / ', ' ^ ', ' .* ', ' ./ ', ' .^ ', ' mod ', ' == ', ' < ', ' >= ', ' and ', ' or ', ' to ');
const functions1 = fc.constantFrom(
  'sqrt', 'abs', 'exp', 'log', 'sin', 'erf', 'sum', 'mean', 'max', 'min', 'transpose', 'size', 'det', 'inv',
  'flatten', 'sort', 'cumsum', 'number', 'round', 'gamma', 'factorial', 'norm', 'cbrt', 'std',
);
const functions2 = fc.constantFrom('concat', 'multiply', 'add', 'dotMultiply', 'max', 'pow', 'hypot', 'atan2', 'mod', 'dot', 'cross', 'unit');
const constructors = fc.constantFrom('ones', 'zeros', 'identity', 'range');

const { expression } = fc.letrec<{ expression: string; leaf: string }>((tie) => ({
  leaf: fc.oneof(
    { weight: 4, arbitrary: numbers },
    { weight: 3, arbitrary: fc.tuple(numbers, units).map(([n, u]) => `${n} ${u}`) },
    { weight: 2, arbitrary: strings },
    { weight: 2, arbitrary: fc.tuple(constructors, sizes, sizes).map(([f, a, b]) => `${f}(${a}, ${b})`) },
    { weight: 1, arbitrary: fc.tuple(constructors, sizes).map(([f, a]) => `${f}(${a})`) },
  ),
  expression: fc.oneof(
    { depthSize: 'small', withCrossShrink: true },
    { weight: 3, arbitrary: tie('leaf') },
    { weight: 2, arbitrary: fc.tuple(tie('expression'), binary, tie('expression')).map(([a, op, b]) => `(${a}${op}${b})`) },
    { weight: 1, arbitrary: fc.tuple(unary, tie('expression')).map(([op, a]) => `${op}(${a})`) },
    { weight: 2, arbitrary: fc.tuple(functions1, tie('expression')).map(([f, a]) => `${f}(${a})`) },
    { weight: 2, arbitrary: fc.tuple(functions2, tie('expression'), tie('expression')).map(([f, a, b]) => `${f}(${a}, ${b})`) },
    { weight: 1, arbitrary: fc.array(tie('expression'), { minLength: 1, maxLength: 4 }).map((items) => `[${items.join(', ')}]`) },
    { weight: 1, arbitrary: fc.tuple(tie('expression'), tie('expression'), tie('expression'), tie('expression')).map(([a, b, c, d]) => `[${a}, ${b}; ${c}, ${d}]`) },
    { weight: 1, arbitrary: fc.tuple(tie('expression'), fc.integer({ min: 1, max: 3 })).map(([a, i]) => `(${a})[${i}]`) },
    { weight: 1, arbitrary: fc.tuple(tie('expression'), tie('expression'), tie('expression')).map(([c, a, b]) => `(${c} ? ${a} : ${b})`) },
  ),
}));

type Outcome = { kind: 'value'; value: unknown } | { kind: 'error'; message: string };

function run(expr: string): { outcome: Outcome; ms: number } {
  const started = performance.now();
  try {
    const result = evaluateQuick(expr);
    return { outcome: { kind: 'value', value: result.value }, ms: performance.now() - started };
  } catch (error) {
    // Anything but an EngineError is a crash of the engine.
    if (!(error instanceof EngineError)) throw new Error(`not an EngineError for ${expr}: ${String(error)}`);
    return { outcome: { kind: 'error', message: error.message }, ms: performance.now() - started };
  }
}

describe('expression fuzzing (fast-check)', () => {
  it('should give a result or a clear EngineError for 10,000 generated expressions, each within the limits', () => {
    let slowest = 0;
    const counts = { value: 0, error: 0, capped: 0 };
    fc.assert(
      fc.property(expression, (expr) => {
        const { outcome, ms } = run(expr);
        slowest = Math.max(slowest, ms);
        expect(ms).toBeLessThan(APP_TIME_LIMIT_MS);
        if (outcome.kind === 'value') {
          counts.value++;
          if (typeof outcome.value === 'string') expect(outcome.value.length).toBeLessThanOrEqual(MAX_STRING_LENGTH);
          else expect(Number.isFinite(outcome.value)).toBe(true);
        } else {
          counts.error++;
          if (/over the limit of|at most \d+ (elements|characters)/.test(outcome.message)) counts.capped++;
          // Clear: one short line, no stack trace, no internal names.
          expect(outcome.message.length).toBeGreaterThan(0);
          expect(outcome.message.length).toBeLessThan(600);
          expect(outcome.message).not.toMatch(/\n\s+at |TypeError|ReferenceError|undefined is not|Cannot read prop/);
        }
      }),
      { numRuns: 10_000, seed: 20261201, endOnFailure: true },
    );
    // The generator reaches every kind of outcome, the caps included.
    expect(counts.value).toBeGreaterThan(500);
    expect(counts.error).toBeGreaterThan(500);
    expect(counts.capped).toBeGreaterThan(50);
    expect(slowest).toBeLessThan(APP_TIME_LIMIT_MS);
    expect(MAX_MATRIX_ELEMENTS).toBe(100_000);
  }, 600_000);
});
