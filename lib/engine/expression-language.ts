/**
 * The vocabulary of Denudata's expression language: the size caps of an expression's text, the
 * functions it may call, the operators' functions, the words it reserves and the distribution calls.
 * expression.ts locks the mathjs instance to these lists.
 */
import { EngineError } from './errors';

export const MAX_EXPRESSION_LENGTH = 2000;
export const MAX_EXPRESSION_NODES = 1000;
export const MAX_NESTING_DEPTH = 40;

/** Functions refused outright: they reach the parser, change the configuration or are not reproducible. */
export const LOCKED_FUNCTIONS = [
  'import', 'createUnit', 'evaluate', 'parse', 'compile', 'simplify', 'simplifyConstant',
  'simplifyCore', 'derivative', 'resolve', 'rationalize', 'config', 'reviver', 'replacer',
  'chain', 'help', 'parser', 'leafCount', 'symbolicEqual', 'random', 'randomInt', 'pickRandom',
] as const;

/** Functions an expression may call. Everything else is refused before evaluation. */
export const ALLOWED_FUNCTIONS = new Set<string>([
  // arithmetic
  'abs', 'add', 'subtract', 'multiply', 'divide', 'unaryMinus', 'unaryPlus', 'pow', 'sqrt', 'cbrt',
  'nthRoot', 'square', 'cube', 'exp', 'expm1', 'log', 'log10', 'log2', 'log1p', 'mod', 'sign',
  'round', 'floor', 'ceil', 'fix', 'hypot', 'gcd', 'lcm', 'dotMultiply', 'dotDivide', 'dotPow',
  // trigonometry and special functions
  'sin', 'cos', 'tan', 'asin', 'acos', 'atan', 'atan2', 'sinh', 'cosh', 'tanh', 'asinh', 'acosh',
  'atanh', 'sec', 'csc', 'cot', 'erf', 'gamma', 'lgamma', 'factorial',
  // statistics
  'min', 'max', 'mean', 'median', 'std', 'variance', 'sum', 'prod', 'cumsum', 'mad',
  // comparison and logic
  'equal', 'unequal', 'larger', 'largerEq', 'smaller', 'smallerEq', 'compare', 'and', 'or', 'not',
  'xor', 'isNaN', 'isZero', 'isPositive', 'isNegative', 'isInteger',
  // units and numbers
  'unit', 'to', 'number', 'splitUnit',
  // small matrices (sizes are capped)
  'ones', 'zeros', 'identity', 'range', 'matrix', 'size', 'transpose', 'dot', 'cross', 'det',
  'inv', 'norm', 'trace', 'subset', 'concat', 'flatten', 'sort', 'count',
]);

/** The functions behind the operators of the expression language (a + b is add(a, b), ...). */
export const OPERATOR_FUNCTIONS = [
  'add', 'and', 'bitAnd', 'bitNot', 'bitOr', 'bitXor', 'ctranspose', 'divide', 'dotDivide', 'dotMultiply',
  'dotPow', 'equal', 'factorial', 'larger', 'largerEq', 'leftShift', 'mod', 'multiply', 'not', 'nullish', 'or',
  'pow', 'rightArithShift', 'rightLogShift', 'smaller', 'smallerEq', 'subtract', 'to', 'unaryMinus',
  'unaryPlus', 'unequal', 'xor', 'index', 'subset', 'range', 'matrix',
] as const;

/**
 * The distribution calls of CONTRACT §8.1. They are recognised only as the whole expression of
 * an input (the evaluation reads their arguments); called anywhere else they refuse.
 */
export const DISTRIBUTION_FUNCTIONS: readonly string[] = ['normal', 'lognormal', 'uniform', 'triangular'];
export const NESTED_DISTRIBUTION_MESSAGE = 'a distribution must be the whole expression of an input';

/** Words of the expression language, never block names. */
export const KEYWORDS = new Set(['to', 'in', 'and', 'or', 'not', 'xor', 'mod', 'end', 'true', 'false', 'null', 'undefined']);

/** Refuses text nested deeper than MAX_NESTING_DEPTH brackets (quoted text not counted), before mathjs parses it. */
export function checkNesting(text: string): void {
  let depth = 0;
  let quote: string | null = null;
  for (let i = 0; i < text.length; i++) {
    const c = text[i]!;
    if (quote) {
      if (c === '\\') i++;
      else if (c === quote) quote = null;
      continue;
    }
    if (c === '"' || c === "'") quote = c;
    else if (c === '(' || c === '[' || c === '{') {
      depth++;
      if (depth > MAX_NESTING_DEPTH) {
        throw new EngineError(`the expression is nested more than ${MAX_NESTING_DEPTH} levels deep`);
      }
    } else if (c === ')' || c === ']' || c === '}') depth--;
  }
}
