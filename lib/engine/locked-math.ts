/**
 * The one locked-down mathjs instance of the engine. Its units are set up in engine-units.ts, its vocabulary
 * (allowed functions, operators, reserved words, distributions) is listed in expression-language.ts, the size
 * caps of every value are in value-size.ts; the checks every expression passes before it runs are in
 * expression.ts, which is the module the rest of the engine imports.
 *
 * Expressions come from users, so the instance is locked: functions that reach the parser, change the
 * configuration or make results irreproducible throw, and every function an expression reaches is wrapped so
 * that no value exceeds the size caps.
 */
import { all, create, type FactoryFunctionMap, type MathNode } from 'mathjs';
import { EngineError } from './errors';
import { assertElementCount, countElements, flattenSizes, sizeChecked, type Flagged } from './value-size';
import { configureUnits } from './engine-units';
import { ALLOWED_FUNCTIONS, DISTRIBUTION_FUNCTIONS, LOCKED_FUNCTIONS, NESTED_DISTRIBUTION_MESSAGE, OPERATOR_FUNCTIONS } from './expression-language';
import { temperatureArithmetic } from './temperature';

// mathjs types `all` as an index into a map; it is the full factory set.
const math = create(all as FactoryFunctionMap, { number: 'number', precision: 64 });

/* ------------------------------------------------------------------ units */
// Time units, atoms, the fixed SI system and the unit-name test (engine-units.ts).
const { isValuelessUnitByMathjs } = configureUnits(math);
/** mathjs's answer to "is this a unit, with or without a prefix?" (for tests). */
export { isValuelessUnitByMathjs };

/* ------------------------------------------------------ private references */
/** The parser, kept before the lockdown refuses `parse` to expressions (for expression.ts only). */
export const privateParse = math.parse.bind(math) as (text: string) => MathNode;
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
  /** mathjs's range for expressions: it includes the end unless told otherwise (`1:4` is [1, 2, 3, 4]). */
  rangeTransform: (math as unknown as { expression: { transform: Record<string, AnyFunction> } }).expression.transform.range!,
  matrix: math.matrix as unknown as AnyFunction,
  add: math.add as unknown as AnyFunction,
  subtract: math.subtract as unknown as AnyFunction,
};

/** Namespace names known before any engine function is added (for the reserved-name check). */
export const builtInNames = new Set(Object.keys(math));

/* ---------------------------------------------------------- size limits */
// Constructors are bounded before they allocate (value-size.ts); every other function is wrapped
// by sizeChecked in the lockdown below.
/**
 * A range bounded by its element count before it is built. mathjs's namespace `range(start, end[, step])`
 * leaves out the end; in expressions (its transform, as `1:4` too) the end is included unless a last
 * boolean says otherwise: `range(1, 4)` is [1, 2, 3, 4], `range(1, 4, false)` [1, 2, 3]. The count is
 * floor(span) + 1 with the end, ceil(span) without, span = (end − start) / step (0 when the step points away
 * from the end). The result is checked again after it is built (sizeChecked), so a rounding of one element
 * here cannot pass the cap.
 */
function boundedRange(build: AnyFunction, endByDefault: boolean): AnyFunction {
  return (...args) => {
    if (args.some((a) => typeof a !== 'number' && typeof a !== 'boolean')) {
      throw new EngineError('range: expects plain numbers, as range(start, end) or range(start, end, step)');
    }
    const last = args.length > 2 && typeof args[args.length - 1] === 'boolean' ? (args[args.length - 1] as boolean) : undefined;
    const [start, end, step = 1] = (last === undefined ? args : args.slice(0, -1)).map(Number);
    if (step === 0) throw new EngineError('range: the step must not be zero');
    const span = (end! - start!) / step;
    const includeEnd = last ?? endByDefault;
    assertElementCount('range', span >= 0 ? (includeEnd ? Math.floor(span) + 1 : Math.ceil(span)) : 0);
    return build(...args);
  };
}

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
  range: Object.assign(boundedRange(original.range, false), { transform: boundedRange(original.rangeTransform, true) }),
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
export function isAllowedConstant(name: string): boolean {
  if (!builtInNames.has(name)) return false;
  const value = (math as unknown as Record<string, unknown>)[name];
  return typeof value === 'number' || math.isUnit(value);
}

/** Names of the engine functions added to expressions (block types used as functions). */
export const expressionFunctions = new Set<string>();

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
export const distributionFunctions = new Set<string>(DISTRIBUTION_FUNCTIONS);
privateImport(
  Object.fromEntries(DISTRIBUTION_FUNCTIONS.map((name) => [name, () => {
    throw new EngineError(NESTED_DISTRIBUTION_MESSAGE);
  }])),
  { override: true },
);

/** The locked instance, for the engine's own modules (through expression.ts). Never export it further. */
export { math };
