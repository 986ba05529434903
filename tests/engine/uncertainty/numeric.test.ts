import { all, create, type Unit } from 'mathjs';
import { describe, expect, it } from 'vitest';
import { checkExpression } from '@/lib/engine/expression';
import { compileNumeric } from '@/lib/engine/uncertainty/numeric';
import { expectClose } from '../../support/approx';

// The numeric compiler of samples against a reference: a fresh, unrestricted mathjs instance from npm
// evaluating the same text with the same values, converted to SI. Two sample points each, away from the
// nominal one (the caller checks only the nominal point before trusting the compiled function).
const reference = create(all!);
const SLOTS = ['a.x', 'b.y'];
const slot = (block: string, output: string): number | null => {
  const i = SLOTS.indexOf(`${block}.${output}`);
  return i < 0 ? null : i;
};
const POINTS: Array<[number, number]> = [
  [0.3, 0.6],
  [0.9, 0.2],
];

function compiled(text: string) {
  return compileNumeric(checkExpression(text).node, slot);
}

function expectAgrees(text: string): void {
  const f = compiled(text);
  expect(f, text).not.toBeNull();
  for (const [x, y] of POINTS) {
    const value = reference.evaluate(text, { a: { x }, b: { y } }) as number | Unit;
    const si = typeof value === 'number' ? value : value.toSI().toNumber();
    expectClose(f!(Float64Array.of(x, y)), si, 1e-13, 1e-300);
  }
}

describe('compileNumeric against mathjs (reference library)', () => {
  it('should agree on the arithmetic operators and parentheses', () => {
    for (const text of ['a.x + b.y', 'a.x - b.y', 'a.x * b.y', 'a.x / b.y', 'a.x ^ b.y', '-a.x', '+a.x', '(a.x + 1) * (b.y - 3)', '2 ^ -a.x']) expectAgrees(text);
  });

  it('should agree on every one-argument function it compiles', () => {
    const names = ['sqrt', 'cbrt', 'exp', 'expm1', 'log10', 'log2', 'log1p', 'abs', 'sign', 'sin', 'cos', 'tan', 'asin', 'acos', 'atan', 'sinh', 'cosh', 'tanh', 'asinh', 'atanh', 'square', 'cube', 'sec', 'csc', 'cot', 'erf', 'log'];
    for (const name of names) expectAgrees(`${name}(a.x - b.y)`.replace(/^(sqrt|log10|log2|log)\(a\.x - b\.y\)$/, '$1(a.x + b.y)'));
    expectAgrees('acosh(a.x + 1)');
  });

  it('should agree on the functions of two or more arguments', () => {
    for (const text of ['log(a.x, b.y)', 'atan2(a.x, b.y - 0.5)', 'pow(a.x, b.y)', 'min(a.x, b.y, 0.5)', 'max(a.x, b.y, 0.5)', 'hypot(a.x, b.y)', 'max(a.x)']) expectAgrees(text);
  });

  it('should read units and constants as their SI values, and keep the SI value through a conversion', () => {
    for (const text of ['a.x * 3 mm', '2 km / (b.y * 1 s)', '(a.x * 1 m) to km', 'pi * a.x', 'e ^ a.x', 'a.x * 1 N / (1 cm^2)']) expectAgrees(text);
    const f = compiled('a.x * 3 mm')!;
    expect(f(Float64Array.of(2, 0))).toBe(2 * 3 * 0.001);
  });

  it('should give null (evaluate with mathjs instead) for what it cannot compile', () => {
    for (const text of ['a.x * 1 degC', 'c.z + 1', 'a.x > b.y', 'sqrt(a.x, b.y)', 'log(a.x, b.y, 2)', 'atan2(a.x)', 'gamma(a.x)', '"text"', '[a.x, b.y]', 'true', 'a.x ? 1 : 2']) {
      expect(compiled(text), text).toBeNull();
    }
  });
});
