/**
 * The size caps of CONTRACT §3 on every value an expression makes: element count of a matrix and
 * length of a string, checked before a call allocates (from its arguments' shapes) and on its result.
 */
import { isMatrix } from 'mathjs';
import { EngineError } from './errors';

/** CONTRACT §3 Limits: elements in any matrix value (intermediate or final). */
export const MAX_MATRIX_ELEMENTS = 100_000;
/** CONTRACT §3 Limits: characters in any string value (intermediate or final). */
export const MAX_STRING_LENGTH = 1000;

type AnyFunction = (...args: unknown[]) => unknown;

/* ---------------------------------------------------------- size limits */
export function numericArgument(fn: string, value: unknown): number {
  if (typeof value === 'number') return value;
  if (typeof value === 'boolean') return value ? 1 : 0;
  throw new EngineError(`${fn}: expects plain numbers for sizes`);
}

export function flattenSizes(fn: string, args: unknown[]): number[] {
  const sizes: number[] = [];
  for (const arg of args) {
    if (typeof arg === 'string') continue; // storage format such as 'dense'
    if (Array.isArray(arg)) sizes.push(...arg.flat(Infinity).map((v) => numericArgument(fn, v)));
    else if (isMatrix(arg)) sizes.push(...(arg.toArray() as unknown[]).flat(Infinity).map((v) => numericArgument(fn, v)));
    else sizes.push(numericArgument(fn, arg));
  }
  return sizes;
}

export function assertElementCount(fn: string, count: number): void {
  if (!Number.isFinite(count) || count > MAX_MATRIX_ELEMENTS) {
    throw new EngineError(
      `${fn}: a matrix may hold at most ${MAX_MATRIX_ELEMENTS} elements (asked for ${Number.isFinite(count) ? count : 'too many'})`,
    );
  }
}

/* ------------------------------------------- size of every intermediate value */
// The constructors above are bounded before they allocate; every other function and operator
// an expression can reach is wrapped below so that (a) a call whose result size follows from the
// sizes of its matrix arguments (an outer product, a broadcast sum, a concatenation) is refused
// before it allocates, and (b) every result is checked after the call: its element count, and the
// length of a string. The checks apply to intermediate values as well as final ones, so
// `sum(ones(1000, 1) * ones(1, 1000))` is refused although its final value is one number.

/** The shape of a matrix or nested array, or null for anything else. */
function shapeOf(value: unknown): number[] | null {
  if (isMatrix(value)) return (value as { size(): number[] }).size();
  if (!Array.isArray(value)) return null;
  const shape: number[] = [];
  let level: unknown = value;
  while (Array.isArray(level)) {
    shape.push(level.length);
    level = level[0];
  }
  return shape;
}

function product(shape: readonly number[]): number {
  return shape.reduce((a, b) => a * b, 1);
}

/** The shape of a matrix product (mathjs semantics), or null when mathjs will refuse it. */
function productShape(a: number[] | null, b: number[] | null): number[] | null {
  if (a === null) return b;
  if (b === null) return a;
  if (a.length === 1 && b.length === 1) return [];
  if (a.length === 2 && b.length === 1) return [a[0]!];
  if (a.length === 1 && b.length === 2) return [b[1]!];
  if (a.length === 2 && b.length === 2) return [a[0]!, b[1]!];
  return null;
}

/** The element count a call will produce, when it follows from its arguments' shapes. */
function predictedElements(fn: string, args: readonly unknown[]): number {
  const shapes = args.map(shapeOf);
  const matrices = shapes.filter((shape): shape is number[] => shape !== null);
  if (fn === 'concat') return matrices.reduce((n, shape) => n + product(shape), 0);
  if (fn === 'multiply') {
    let shape: number[] | null = null;
    let first = true;
    for (const next of shapes) {
      if (first) {
        shape = next;
        first = false;
        continue;
      }
      shape = productShape(shape, next);
      if (shape === null && next !== null) return 0; // a shape mathjs refuses itself
    }
    return shape === null ? 0 : product(shape);
  }
  if (matrices.length < 2) return 0;
  // Element-wise functions broadcast their arguments to the largest size along each dimension.
  const rank = Math.max(...matrices.map((shape) => shape.length));
  const broadcast: number[] = [];
  for (let d = 0; d < rank; d++) {
    let size = 0;
    for (const shape of matrices) size = Math.max(size, shape[shape.length - rank + d] ?? 1);
    broadcast.push(size);
  }
  return product(broadcast);
}

function elementCount(value: unknown): number {
  if (isMatrix(value)) return product((value as { size(): number[] }).size());
  if (Array.isArray(value)) return value.reduce((n: number, item) => n + (Array.isArray(item) ? elementCount(item) : 1), 0);
  return 1;
}

/**
 * Checks one value against the size caps of CONTRACT §3 (element count of a matrix, length of a
 * string); `what` names where it came from. Throws an EngineError naming the cap.
 */
export function checkValueSize(what: string, value: unknown): void {
  if (typeof value === 'string') {
    if (value.length > MAX_STRING_LENGTH) {
      throw new EngineError(
        `${what}: the text would be ${value.length} characters long, over the limit of ${MAX_STRING_LENGTH} characters in a string value`,
      );
    }
    return;
  }
  if (isMatrix(value) || Array.isArray(value)) {
    const count = elementCount(value);
    if (count > MAX_MATRIX_ELEMENTS) {
      throw new EngineError(
        `${what}: the result would hold ${count} elements, over the limit of ${MAX_MATRIX_ELEMENTS} elements in a matrix value`,
      );
    }
  }
}

export type Flagged = AnyFunction & { rawArgs?: boolean; transform?: AnyFunction };

/** The function with its size checks before (from the arguments' shapes) and after (the result). */
export function sizeChecked(name: string, fn: Flagged): Flagged {
  let checked: Flagged;
  if (fn.rawArgs === true) {
    // Lazily evaluated operators (and, or, ??): their arguments are parse nodes; check the result only.
    checked = (...args) => {
      const result = fn(...args);
      checkValueSize(name, result);
      return result;
    };
    checked.rawArgs = true;
  } else {
    checked = (...args) => {
      const predicted = predictedElements(name, args);
      if (predicted > MAX_MATRIX_ELEMENTS) {
        throw new EngineError(
          `${name}: the result would hold ${predicted} elements, over the limit of ${MAX_MATRIX_ELEMENTS} elements in a matrix value`,
        );
      }
      const result = fn(...args);
      checkValueSize(name, result);
      return result;
    };
  }
  return checked;
}

export function countElements(value: unknown): number {
  if (Array.isArray(value)) return value.reduce((n: number, item) => n + countElements(item), 0);
  if (isMatrix(value)) return value.size().reduce((a: number, b: number) => a * b, 1);
  return 1;
}
