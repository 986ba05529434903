/**
 * The one locked-down mathjs instance of the engine and the checks every expression passes before
 * it runs. Its units are set up in engine-units.ts, its vocabulary (allowed functions, operators,
 * reserved words, distributions) is listed in expression-language.ts, the size caps of every value
 * are in value-size.ts.
 *
 * Expressions come from users, so the instance is locked: functions that reach the parser,
 * change the configuration or make results irreproducible throw, and every parsed expression
 * is checked against an allow-list of functions, a node-count cap and matrix-size caps
 * before it is compiled.
 */
import { all, create, type FactoryFunctionMap, type MathNode, type Unit } from 'mathjs';
import { EngineError } from './errors';
import { assertElementCount, countElements, flattenSizes, MAX_MATRIX_ELEMENTS, MAX_STRING_LENGTH, sizeChecked, type Flagged } from './value-size';
import { configureUnits } from './engine-units';
import {
  ALLOWED_FUNCTIONS,
  checkNesting,
  DISTRIBUTION_FUNCTIONS,
  KEYWORDS,
  LOCKED_FUNCTIONS,
  MAX_EXPRESSION_LENGTH,
  MAX_EXPRESSION_NODES,
  MAX_NESTING_DEPTH,
  NESTED_DISTRIBUTION_MESSAGE,
  OPERATOR_FUNCTIONS,
} from './expression-language';
import { explainParseError, rewriteNaturalInput } from './natural-input';
import { temperatureArithmetic } from './temperature';

// mathjs types `all` as an index into a map; it is the full factory set.
const math = create(all as FactoryFunctionMap, { number: 'number', precision: 64 });

/* ------------------------------------------------------------------ units */
// Time units, atoms, the fixed SI system and the unit-name test (engine-units.ts).
const { isValuelessUnitByMathjs } = configureUnits(math);
/** mathjs's answer to "is this a unit, with or without a prefix?" (for tests). */
export { isValuelessUnitByMathjs };

/* ------------------------------------------------------ private references */
const privateParse = math.parse.bind(math) as (text: string) => MathNode;
const privateImport = math.import.bind(math) as (
  object: Record<string, unknown>,
  options?: { override?: boolean; silent?: boolean },
) => void;

type AnyFunction = (...args: unknown[]) => unknown;
const original = {
  ones: math.ones as unknown as AnyFunction,
  zeros: math.zeros as unknown as AnyFunction,
  identity: math.identity as unknown as AnyFunction,
  range: math.range as unknown as AnyFunction,
  matrix: math.matrix as unknown as AnyFunction,
  add: math.add as unknown as AnyFunction,
  subtract: math.subtract as unknown as AnyFunction,
};

/** Namespace names known before any engine function is added (for the reserved-name check). */
const builtInNames = new Set(Object.keys(math));

/* ---------------------------------------------------------- size limits */
// Constructors are bounded before they allocate (value-size.ts); every other function is wrapped
// by sizeChecked in the lockdown below.
const boundedConstructors: Record<string, AnyFunction> = {
  ones: (...args) => {
    assertElementCount('ones', flattenSizes('ones', args).reduce((a, b) => a * Math.max(0, b), 1));
    return original.ones(...args);
  },
  zeros: (...args) => {
    assertElementCount('zeros', flattenSizes('zeros', args).reduce((a, b) => a * Math.max(0, b), 1));
    return original.zeros(...args);
  },
  identity: (...args) => {
    const sizes = flattenSizes('identity', args);
    const count = sizes.length === 1 ? sizes[0]! * sizes[0]! : sizes.reduce((a, b) => a * Math.max(0, b), 1);
    assertElementCount('identity', count);
    return original.identity(...args);
  },
  range: (...args) => {
    if (args.some((a) => typeof a !== 'number' && typeof a !== 'boolean')) {
      throw new EngineError('range: expects plain numbers, as range(start, end) or range(start, end, step)');
    }
    const [start, end, step = 1] = args as number[];
    if (step === 0) throw new EngineError('range: the step must not be zero');
    assertElementCount('range', Math.floor(Math.abs((end! - start!) / step)) + 1);
    return original.range(...args);
  },
  matrix: (...args) => {
    assertElementCount('matrix', countElements(args[0]));
    return original.matrix(...args);
  },
};

/* --------------------------------------------------------------- lockdown */
function refused(name: string): AnyFunction {
  return () => {
    throw new EngineError(`the function "${name}" is not available in Denudata expressions`);
  };
}

// Resolve every lazily created function now, so that none is built later against an
// overridden dependency.
for (const name of Object.keys(math)) void (math as unknown as Record<string, unknown>)[name];

privateImport(
  {
    ...Object.fromEntries(LOCKED_FUNCTIONS.map((name) => [name, refused(name)])),
    ...boundedConstructors,
    ...temperatureArithmetic(math, original.add, original.subtract),
  },
  { override: true },
);

// Every function an expression reaches (by name or through an operator) is replaced by its
// size-checked form, in the namespace and in the expression transforms (1-based variants), so
// no intermediate value exceeds the caps.
{
  const namespace = math as unknown as Record<string, Flagged>;
  const transforms = (math as unknown as { expression: { transform: Record<string, Flagged> } }).expression.transform;
  const wrapped: Record<string, Flagged> = {};
  for (const name of new Set<string>([...ALLOWED_FUNCTIONS, ...OPERATOR_FUNCTIONS])) {
    const current = namespace[name];
    if (typeof current !== 'function') continue;
    const checked = sizeChecked(name, current);
    const transform = transforms[name];
    if (typeof transform === 'function') checked.transform = sizeChecked(name, transform);
    wrapped[name] = checked;
  }
  privateImport(wrapped, { override: true });
}

/** Named values an expression may use: numeric or unit constants such as pi, e or gravity. */
function isAllowedConstant(name: string): boolean {
  if (!builtInNames.has(name)) return false;
  const value = (math as unknown as Record<string, unknown>)[name];
  return typeof value === 'number' || math.isUnit(value);
}

const expressionFunctions = new Set<string>();

/**
 * Adds an engine function (a block type used as a function) to expressions. Uses the private
 * import reference, so it works after the lockdown.
 */
export function defineExpressionFunction(name: string, fn: AnyFunction): void {
  if (expressionFunctions.has(name)) return;
  privateImport({ [name]: sizeChecked(name, fn) }, { override: true });
  expressionFunctions.add(name);
}

export function isExpressionFunction(name: string): boolean {
  return expressionFunctions.has(name);
}

// dataset("<sha256>") is only ever the whole text of a data input, which the evaluator reads
// without running it (CONTRACT "Additions" §7.6). Anywhere else the call is a block error; it is
// defined so that the name is reserved and the message says why.
defineExpressionFunction('dataset', () => {
  throw new EngineError(
    'dataset(…) can only be the whole input of a data input (data of scarp_fit, profile_evolution or channel_march)',
  );
});

/* ------------------------------------------------------------ distributions */
// Called anywhere but as the whole expression of an input, a distribution refuses (CONTRACT §8.1).
const distributionFunctions = new Set<string>(DISTRIBUTION_FUNCTIONS);
privateImport(
  Object.fromEntries(DISTRIBUTION_FUNCTIONS.map((name) => [name, () => {
    throw new EngineError(NESTED_DISTRIBUTION_MESSAGE);
  }])),
  { override: true },
);

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
