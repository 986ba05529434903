/**
 * The checks every expression passes before it runs, on the engine's one locked-down mathjs instance
 * (locked-math.ts: units, lockdown, size caps, engine functions and distributions). Every parsed expression
 * is checked against an allow-list of functions, a node-count cap and matrix-size caps before it is compiled.
 * The rest of the engine imports the instance and these checks from here.
 */
import type { MathNode, Unit } from 'mathjs';
import { EngineError } from './errors';
import { MAX_MATRIX_ELEMENTS, MAX_STRING_LENGTH } from './value-size';
import { ALLOWED_FUNCTIONS, checkNesting, KEYWORDS, MAX_EXPRESSION_LENGTH, MAX_EXPRESSION_NODES, MAX_NESTING_DEPTH } from './expression-language';
import {
  builtInNames,
  defineExpressionFunction,
  distributionFunctions,
  expressionFunctions,
  isAllowedConstant,
  isExpressionFunction,
  isValuelessUnitByMathjs,
  math,
  privateParse,
} from './locked-math';
import { explainParseError, rewriteNaturalInput } from './natural-input';

/** mathjs's answer to "is this a unit, with or without a prefix?" (for tests). */
export { isValuelessUnitByMathjs };
export { defineExpressionFunction, isExpressionFunction };

/* ----------------------------------------------------------- reserved names */

/** Why a name cannot be used as a block name in expressions, or null when it is free. */
export function reservedNameReason(name: string): string | null {
  if (KEYWORDS.has(name)) return `"${name}" is a word of the expression language`;
  if (math.Unit.isValuelessUnit(name)) return `"${name}" is a unit the engine knows, so ${name}.x would be ambiguous`;
  if (expressionFunctions.has(name)) return `"${name}" is a block type's function in expressions`;
  if (distributionFunctions.has(name)) return `"${name}" is a distribution the engine knows, such as ${name}(…) in an input`;
  if (builtInNames.has(name)) {
    const value = (math as unknown as Record<string, unknown>)[name];
    return typeof value === 'function'
      ? `"${name}" is a function the engine knows`
      : `"${name}" is a constant the engine knows`;
  }
  return null;
}

/* --------------------------------------------------------- expression checks */
export interface OutputReference {
  block: string;
  output: string;
}

/** A distribution call that is the whole expression: its name and its compiled arguments. */
export interface DistributionCall {
  readonly name: string;
  readonly args: ReadonlyArray<{ evaluate(scope: Map<string, unknown>): unknown }>;
}

export interface CheckedExpression {
  readonly text: string;
  /** The parsed (and checked) expression tree, for the numeric compiler of samples. */
  readonly node: MathNode;
  /** Set when the whole expression is a distribution call (CONTRACT §8.1). */
  readonly distribution: DistributionCall | null;
  /** True when a distribution call appears inside a larger expression (a block error). */
  readonly nestedDistribution: boolean;
  /** `name.output` references, in order of appearance (duplicates removed). */
  readonly references: readonly OutputReference[];
  /** Symbols that are neither units, constants nor functions (block names used bare, typos). */
  readonly freeSymbols: readonly string[];
  evaluate(scope: Map<string, unknown>): unknown;
}

interface Walk {
  /** The root call when the expression is a single distribution call. */
  rootCall: MathNode | null;
  nestedDistribution: boolean;
  nodes: number;
  references: Map<string, OutputReference>;
  freeSymbols: Set<string>;
}

function refuse(message: string): never {
  throw new EngineError(message);
}

function walk(node: MathNode, state: Walk, depth: number): void {
  state.nodes++;
  if (state.nodes > MAX_EXPRESSION_NODES) refuse(`the expression has more than ${MAX_EXPRESSION_NODES} parts`);
  if (depth > 4 * MAX_NESTING_DEPTH) refuse('the expression is nested too deeply');
  const n = node as MathNode & Record<string, unknown>;
  switch (node.type) {
    case 'AssignmentNode':
      refuse('assignments (=) are not allowed: each input is a single expression');
      break;
    case 'FunctionAssignmentNode':
      refuse('defining functions is not allowed in expressions');
      break;
    case 'BlockNode':
      refuse('only one expression per input: ";" and line breaks separating statements are not allowed');
      break;
    case 'ObjectNode':
      refuse('objects ({...}) are not allowed in expressions');
      break;
    case 'FunctionNode': {
      const fn = n.fn as MathNode & { name?: string };
      if (fn.type !== 'SymbolNode' || typeof fn.name !== 'string') {
        refuse('only named functions can be called, such as sqrt(x)');
      }
      const name = fn.name!;
      if (distributionFunctions.has(name) && node !== state.rootCall) state.nestedDistribution = true;
      if (!ALLOWED_FUNCTIONS.has(name) && !expressionFunctions.has(name) && !distributionFunctions.has(name)) {
        refuse(`the function "${name}" is not available in Denudata expressions`);
      }
      for (const arg of n.args as MathNode[]) walk(arg, state, depth + 1);
      return;
    }
    case 'SymbolNode': {
      const name = n.name as string;
      if (ALLOWED_FUNCTIONS.has(name) || expressionFunctions.has(name) || distributionFunctions.has(name) || builtInNames.has(name)) {
        if (!isAllowedConstant(name)) refuse(`"${name}" can only be called as a function, such as ${name}(x)`);
      } else if (!math.Unit.isValuelessUnit(name)) {
        state.freeSymbols.add(name);
      }
      return;
    }
    case 'AccessorNode': {
      const object = n.object as MathNode & { name?: string };
      const index = n.index as MathNode & { dotNotation?: boolean; dimensions?: MathNode[] };
      if (index.dotNotation) {
        if (object.type !== 'SymbolNode') refuse('a dot may only follow a block name, as in name.output');
        const output = (index.dimensions?.[0] as MathNode & { value?: unknown })?.value;
        const key = `${object.name}.${String(output)}`;
        if (!state.references.has(key)) state.references.set(key, { block: object.name!, output: String(output) });
        state.nodes += 2;
        return;
      }
      break;
    }
    case 'ConstantNode': {
      const value = n.value;
      if (typeof value === 'string' && value.length > MAX_STRING_LENGTH) {
        refuse(`a text in quotes may be at most ${MAX_STRING_LENGTH} characters long (this one has ${value.length})`);
      }
      return;
    }
    case 'ArrayNode': {
      const items = n.items as MathNode[];
      if (items.length > MAX_MATRIX_ELEMENTS) refuse(`an array may hold at most ${MAX_MATRIX_ELEMENTS} elements`);
      break;
    }
    default:
      break;
  }
  node.forEach((child) => walk(child, state, depth + 1));
}

const cache = new Map<string, CheckedExpression>();
const MAX_CACHE_ENTRIES = 5000;

/**
 * Parses and checks one expression (cached by its text). Throws an EngineError with a
 * user-safe message when the expression does not parse or is refused.
 */
export function checkExpression(text: string): CheckedExpression {
  const cached = cache.get(text);
  if (cached) return cached;
  if (text.length > MAX_EXPRESSION_LENGTH) {
    throw new EngineError(`the expression is longer than ${MAX_EXPRESSION_LENGTH} characters`);
  }
  if (text.trim() === '') throw new EngineError('the expression is empty');
  checkNesting(text);
  const rewritten = rewriteNaturalInput(text);
  let node: MathNode;
  try {
    node = privateParse(rewritten.text);
  } catch (error) {
    if (error instanceof RangeError) throw new EngineError('the expression is nested too deeply');
    throw explainParseError(error, text, rewritten);
  }
  let root: MathNode = node;
  while (root.type === 'ParenthesisNode') root = (root as MathNode & { content: MathNode }).content;
  const rootFn = root.type === 'FunctionNode' ? (root as MathNode & { fn: MathNode & { name?: string } }).fn : null;
  const rootCall = rootFn && rootFn.type === 'SymbolNode' && distributionFunctions.has(rootFn.name!) ? root : null;
  const state: Walk = { rootCall, nestedDistribution: false, nodes: 0, references: new Map(), freeSymbols: new Set() };
  walk(node, state, 0);
  const compiled = node.compile();
  const distribution: DistributionCall | null = rootCall
    ? {
        name: (rootFn as MathNode & { name: string }).name,
        args: ((rootCall as MathNode & { args: MathNode[] }).args).map((arg) => arg.compile()),
      }
    : null;
  const checked: CheckedExpression = {
    text,
    node,
    distribution,
    nestedDistribution: state.nestedDistribution,
    references: [...state.references.values()],
    freeSymbols: [...state.freeSymbols],
    evaluate: (scope) => compiled.evaluate(scope),
  };
  if (cache.size >= MAX_CACHE_ENTRIES) cache.clear();
  cache.set(text, checked);
  return checked;
}

/** Parses a unit string such as "mm/yr" into a valueless Unit, or null when it is not a unit. */
export function parseUnitText(text: string): Unit | null {
  try {
    if (text.length > 200) return null;
    return math.unit(text);
  } catch {
    return null;
  }
}

/** The locked instance, for the engine's own modules (units, blocks). Never export it further. */
export { math };
