/**
 * Compiles a checked expression, once, to a function on SI floats for uncertainty samples: unit
 * names become their SI factors, `name.output` references read slots of the sample's values and
 * arithmetic runs on plain numbers. The nominal pass has already checked dimensions with mathjs
 * units; the caller also compares the compiled function with the nominal value before using it.
 * Anything outside the plain arithmetic subset (units with an offset such as degC, conversions
 * of rounding functions, matrices, text, block-type functions, comparisons) returns null, and
 * the caller evaluates that expression with mathjs for every sample instead.
 */
import type { MathNode } from 'mathjs';
import { math } from '../expression';

export type NumericFunction = (env: Float64Array) => number;

type Node = MathNode & Record<string, unknown>;

const UNARY: Record<string, (x: number) => number> = {
  sqrt: Math.sqrt, cbrt: Math.cbrt, exp: Math.exp, expm1: Math.expm1, log10: Math.log10, log2: Math.log2,
  log1p: Math.log1p, abs: Math.abs, sign: Math.sign, sin: Math.sin, cos: Math.cos, tan: Math.tan,
  asin: Math.asin, acos: Math.acos, atan: Math.atan, sinh: Math.sinh, cosh: Math.cosh, tanh: Math.tanh,
  asinh: Math.asinh, acosh: Math.acosh, atanh: Math.atanh,
  square: (x) => x * x, cube: (x) => x * x * x,
  sec: (x) => 1 / Math.cos(x), csc: (x) => 1 / Math.sin(x), cot: (x) => 1 / Math.tan(x),
  erf: (x) => math.erf(x) as number,
};

const VARIADIC: Record<string, (values: number[]) => number> = {
  min: (v) => Math.min(...v),
  max: (v) => Math.max(...v),
  hypot: (v) => Math.hypot(...v),
};

class Unsupported extends Error {}
function unsupported(): never {
  throw new Unsupported();
}

const siFactors = new Map<string, number | null>();
/** The SI value of one unit (`mm` → 0.001), or null for a unit with an offset (degC). */
function unitFactor(name: string): number | null {
  if (siFactors.has(name)) return siFactors.get(name)!;
  let factor: number | null = null;
  try {
    const unit = math.unit(1, name);
    const parts = (unit as unknown as { units: Array<{ unit: { offset: number } }> }).units;
    if (parts.every((p) => p.unit.offset === 0)) factor = unit.toSI().toNumber();
  } catch {
    factor = null;
  }
  siFactors.set(name, factor);
  return factor;
}

function constantValue(name: string): number | null {
  const value = (math as unknown as Record<string, unknown>)[name];
  if (typeof value === 'number') return value;
  if (math.isUnit(value)) {
    const unit = value as import('mathjs').Unit;
    const parts = (unit as unknown as { units: Array<{ unit: { offset: number } }> }).units;
    return parts.every((p) => p.unit.offset === 0) ? unit.toSI().toNumber() : null;
  }
  return null;
}

function build(node: Node, slot: (block: string, output: string) => number | null): NumericFunction {
  switch (node.type) {
    case 'ParenthesisNode':
      return build(node.content as Node, slot);
    case 'ConstantNode': {
      const value = node.value;
      if (typeof value !== 'number') unsupported();
      return () => value;
    }
    case 'SymbolNode': {
      const name = node.name as string;
      if (math.Unit.isValuelessUnit(name)) {
        const factor = unitFactor(name);
        if (factor === null) unsupported();
        return () => factor;
      }
      const constant = constantValue(name);
      if (constant === null) unsupported();
      return () => constant;
    }
    case 'AccessorNode': {
      const object = node.object as Node;
      const index = node.index as Node & { dotNotation?: boolean; dimensions?: Node[] };
      if (!index.dotNotation || object.type !== 'SymbolNode') unsupported();
      const output = String((index.dimensions?.[0] as Node | undefined)?.value);
      const i = slot(object.name as string, output);
      if (i === null) unsupported();
      return (env) => env[i]!;
    }
    case 'OperatorNode': {
      const fn = node.fn as string;
      const args = (node.args as Node[]).map((arg) => build(arg, slot));
      const [a, b] = args as [NumericFunction, NumericFunction];
      switch (fn) {
        case 'add': return args.length === 2 ? (env) => a(env) + b(env) : unsupported();
        case 'subtract': return args.length === 2 ? (env) => a(env) - b(env) : unsupported();
        case 'multiply': return args.length === 2 ? (env) => a(env) * b(env) : unsupported();
        case 'divide': return args.length === 2 ? (env) => a(env) / b(env) : unsupported();
        case 'pow': return args.length === 2 ? (env) => a(env) ** b(env) : unsupported();
        case 'unaryMinus': return (env) => -a(env);
        case 'unaryPlus': return a;
        // A conversion keeps the SI value.
        case 'to': return a;
        default: return unsupported();
      }
    }
    case 'FunctionNode': {
      const name = (node.fn as Node).name as string;
      const args = (node.args as Node[]).map((arg) => build(arg, slot));
      const unary = UNARY[name];
      if (unary && args.length === 1) {
        const a = args[0]!;
        return (env) => unary(a(env));
      }
      if (name === 'log' && args.length === 1) {
        const a = args[0]!;
        return (env) => Math.log(a(env));
      }
      if (name === 'log' && args.length === 2) {
        const [a, b] = args as [NumericFunction, NumericFunction];
        return (env) => Math.log(a(env)) / Math.log(b(env));
      }
      if (name === 'atan2' && args.length === 2) {
        const [a, b] = args as [NumericFunction, NumericFunction];
        return (env) => Math.atan2(a(env), b(env));
      }
      if (name === 'pow' && args.length === 2) {
        const [a, b] = args as [NumericFunction, NumericFunction];
        return (env) => a(env) ** b(env);
      }
      const variadic = VARIADIC[name];
      if (variadic && args.length >= 1) {
        const buffer: number[] = new Array<number>(args.length);
        return (env) => {
          for (let i = 0; i < args.length; i++) buffer[i] = args[i]!(env);
          return variadic(buffer);
        };
      }
      return unsupported();
    }
    default:
      return unsupported();
  }
}

/**
 * The expression as a function of the sample's slot values (SI), or null when it needs mathjs.
 * `slot` gives the slot of a reference, or null when the reference cannot be read as a number.
 */
export function compileNumeric(node: MathNode, slot: (block: string, output: string) => number | null): NumericFunction | null {
  try {
    return build(node as Node, slot);
  } catch (error) {
    if (error instanceof Unsupported) return null;
    throw error;
  }
}
