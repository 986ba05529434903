/**
 * Evaluation of a sheet: expressions are checked and their references resolved, the dependency
 * graph orders the blocks, and each block becomes ok, error or blocked. Incremental evaluation
 * reuses previous results for blocks that neither changed nor depend on a change.
 */
import { collectCallWarnings, formatBlockOutput, runBlockType, type RunOptions } from './block-run';
import { BlockFailure, type Series } from './block-type';
import { DatasetReference } from './dataset-input';
import { hashSheetDocument, type SheetBlock, type SheetDocument } from './document';
import { EngineError, toSafeMessage } from './errors';
import type { DependencyGraph } from './graph';
import { blockMessage, prepare, type PreparedBlock } from './prepare';
import { formatValue, valueFromFormatted, type FormattedOutput } from './unit-format';
import { isDistributionName, makeDistribution, valueOf, type Distribution } from './uncertainty/distributions';
import { DISTRIBUTION_CALL, planUncertainty, type Spread, type UncertaintyEcho, type UncertaintyPlan } from './uncertainty/plan';
import { propagateUncertainty } from './uncertainty/propagate';

export type { Spread, UncertaintyEcho } from './uncertainty/plan';

export const ENGINE_VERSION = '1.0.0';
/** CONTRACT §3 Limits: the size of a results document (UTF-8 bytes of its JSON). */
export const MAX_RESULTS_BYTES = 16 * 1024 * 1024;
/** Room kept for the envelope (format, hash, engine) and the block names as keys. */
const RESULTS_ENVELOPE_BYTES = 4096;

/** UTF-8 length of a string, without encoding it (the engine is pure: no Buffer). */
function utf8Length(text: string): number {
  let bytes = 0;
  for (let i = 0; i < text.length; i++) {
    const code = text.charCodeAt(i);
    if (code < 0x80) bytes += 1;
    else if (code < 0x800) bytes += 2;
    else if (code >= 0xd800 && code <= 0xdbff && i + 1 < text.length) {
      bytes += 4;
      i++;
    } else bytes += 3;
  }
  return bytes;
}

/** The bytes a block's entry adds to the results document ("name":{...},). */
export function blockResultBytes(name: string, result: BlockResult): number {
  return utf8Length(JSON.stringify(name)) + utf8Length(JSON.stringify(result)) + 2;
}
export const RESULTS_FORMAT = 'denudata-results@1';

export type BlockStatus = 'ok' | 'error' | 'blocked';

/** One output in the results: its nominal value, and its spread when it is uncertain (§8.5). */
export type OutputResult = FormattedOutput & { spread?: Spread };

export interface BlockResult {
  id: string;
  type: string;
  status: BlockStatus;
  error?: string;
  warnings: string[];
  outputs: Record<string, OutputResult>;
  series?: Record<string, Series>;
}

export interface SheetResults {
  format: typeof RESULTS_FORMAT;
  sheetHash: string;
  engine: string;
  /** The uncertainty settings used and the declared distributions (sheets with distributions). */
  uncertainty?: UncertaintyEcho;
  blocks: Record<string, BlockResult>;
}


function failed(block: SheetBlock, status: 'error' | 'blocked', error: string, series?: Record<string, Series>): BlockResult {
  const result: BlockResult = { id: block.id, type: block.type, status, error, warnings: [], outputs: {} };
  if (series) result.series = series;
  return result;
}

/** Evaluation state shared by the blocks of one run. */
class Run {
  readonly results = new Map<string, BlockResult>();
  /** Distributions made in this run, by `<block>\u0000<input>` (uncertain sheets only). */
  readonly distributions = new Map<string, Distribution>();
  /** The nominal input values of the blocks downstream of a distribution. */
  readonly nominalInputs = new Map<string, Map<string, unknown>>();


  private readonly scopeObjects = new Map<string, Record<string, unknown>>();
  /** One scope for every expression of the run, holding only what the current block reads. */
  private readonly scope = new Map<string, unknown>();

  constructor(
    private readonly options: RunOptions = {},
    private readonly uncertain: ReadonlySet<string> = new Set(),
  ) {}

  /** The values of a block's outputs as expressions see them (rebuilt from the results). */
  scopeObject(name: string): Record<string, unknown> {
    let object = this.scopeObjects.get(name);
    if (!object) {
      object = {};
      const outputs = this.results.get(name)!.outputs;
      for (const output of Object.keys(outputs)) object[output] = valueFromFormatted(outputs[output]!);
      this.scopeObjects.set(name, object);
    }
    return object;
  }

  evaluateBlock(prepared: PreparedBlock, graph: DependencyGraph): BlockResult {
    const { block } = prepared;
    const cycle = graph.cycles.get(block.name);
    if (cycle) {
      return failed(block, 'error', cycle.length === 2 ? `block "${block.name}" refers to itself` : `part of a dependency cycle: ${cycle.join(' → ')}`);
    }
    if (prepared.problem) return failed(block, 'error', prepared.problem);
    for (const dependency of prepared.dependencies) {
      const upstream = this.results.get(dependency)!;
      if (upstream.status !== 'ok') {
        const why = upstream.status === 'error' ? 'which has an error' : 'which is itself blocked';
        return failed(block, 'blocked', `waiting on block "${dependency}", ${why}`);
      }
    }
    const scope = this.scope;
    scope.clear();
    for (const reference of prepared.references) {
      const upstream = this.results.get(reference.block)!;
      if (!(reference.output in upstream.outputs)) {
        const message = `${reference.block}.${reference.output} has no value (block "${reference.block}" did not produce it)`;
        return failed(block, 'error', blockMessage(block.name, message));
      }
      if (!scope.has(reference.block)) scope.set(reference.block, this.scopeObject(reference.block));
    }
    try {
      return this.compute(prepared, scope);
    } catch (error) {
      const series = error instanceof BlockFailure ? error.series : undefined;
      return failed(block, 'error', blockMessage(block.name, toSafeMessage(error)), series);
    } finally {
      scope.clear();
    }
  }

  /** Warnings of block-type functions called in the current block's expressions. */
  private callWarnings: string[] = [];

  private evaluateInput(prepared: PreparedBlock, name: string, scope: Map<string, unknown>): unknown {
    const input = prepared.inputs.get(name);
    if (!input) return undefined;
    let value: unknown;
    try {
      const call = input.checked.distribution;
      if (call && isDistributionName(call.name)) {
        // The nominal pass: the distribution at its median (CONTRACT §8.3).
        const distribution = makeDistribution(call.name, call.args.map((arg) => arg.evaluate(scope)));
        this.distributions.set(`${prepared.block.name}\u0000${name}`, distribution);
        value = valueOf(distribution, distribution.median);
      } else {
        const collected = collectCallWarnings(() => input.checked.evaluate(scope));
        for (const warning of collected.warnings) {
          const text = `${name}: ${warning}`;
          if (!this.callWarnings.includes(text)) this.callWarnings.push(text);
        }
        value = collected.value;
      }
    } catch (error) {
      throw new EngineError(`${name}: ${toSafeMessage(error)}`, { input: name });
    }
    this.recordNominal(prepared.block.name, name, value);
    return value;
  }

  /** Keeps the nominal input values of blocks downstream of a distribution, for the samples. */
  private recordNominal(block: string, input: string, value: unknown): void {
    if (!this.uncertain.has(block)) return;
    let values = this.nominalInputs.get(block);
    if (!values) {
      values = new Map();
      this.nominalInputs.set(block, values);
    }
    values.set(input, value);
  }

  private compute(prepared: PreparedBlock, scope: Map<string, unknown>): BlockResult {
    const { block, type } = prepared;
    const display = block.display;
    this.callWarnings = [];

    if (type.freeInputs || type.id === 'formula') {
      const outputs: Record<string, FormattedOutput> = {};
      const names = type.freeInputs ? Object.keys(block.inputs) : FORMULA_INPUTS;
      for (const name of names) {
        const value = this.evaluateInput(prepared, name, scope);
        if (value === undefined) throw new EngineError(`${name}: the expression is empty`, { input: name });
        const outputName = type.freeInputs ? name : 'value';
        try {
          outputs[outputName] = formatValue(value, display?.[outputName]);
        } catch (error) {
          throw new EngineError(`${name}: ${toSafeMessage(error)}`, { input: name });
        }
      }
      return { id: block.id, type: block.type, status: 'ok', warnings: this.callWarnings, outputs };
    }

    const values: Record<string, unknown> = {};
    for (const spec of type.inputs) {
      const sha256 = prepared.data.get(spec.name);
      values[spec.name] = sha256 !== undefined ? new DatasetReference(sha256) : this.evaluateInput(prepared, spec.name, scope);
      if (sha256 !== undefined) this.recordNominal(block.name, spec.name, values[spec.name]);
    }
    const outcome = runBlockType(type, values, this.options);
    const outputs: Record<string, FormattedOutput> = {};
    for (const spec of type.outputs) {
      const formatted = formatBlockOutput(spec, outcome, display?.[spec.name]);
      if (formatted) outputs[spec.name] = formatted;
    }
    const warnings = this.callWarnings.length > 0 ? [...outcome.warnings, ...this.callWarnings] : outcome.warnings;
    const result: BlockResult = { id: block.id, type: block.type, status: 'ok', warnings, outputs };
    if (outcome.series) result.series = outcome.series;
    return result;
  }
}

const FORMULA_INPUTS: readonly string[] = ['expr'];

function assemble(document: SheetDocument, results: Map<string, BlockResult>, sheetHash: string, uncertainty?: UncertaintyEcho): SheetResults {
  const blocks: Record<string, BlockResult> = {};
  for (const block of document.blocks) {
    const result = results.get(block.name);
    if (result) blocks[block.name] = result;
  }
  if (uncertainty) return { format: RESULTS_FORMAT, sheetHash, engine: ENGINE_VERSION, uncertainty, blocks };
  return { format: RESULTS_FORMAT, sheetHash, engine: ENGINE_VERSION, blocks };
}

/** Options of an evaluation: the datasets data inputs resolve against, and a progress hook. */
export interface EvaluateOptions extends RunOptions {
  /** Called after each block with the fraction of blocks done (0..1], for progress bars; changes no result. */
  onProgress?: (fraction: number) => void;
}

function run(
  document: SheetDocument,
  reuse: (prepared: PreparedBlock, graph: DependencyGraph, reused: Set<string>) => BlockResult | null,
  sheetHash: string,
  options: EvaluateOptions = {},
): { results: SheetResults; evaluatedBlockIds: string[] } {
  const { blocks, graph } = prepare(document);
  const plan: UncertaintyPlan | null = planUncertainty(document, blocks, graph.order, (name, message) => {
    const prepared = blocks.get(name)!;
    prepared.problem ??= blockMessage(name, message);
  });
  const state = new Run(options, plan?.uncertain);
  const total = graph.order.length;
  // With uncertainty, the blocks' nominal pass is the first tenth of the work; the rest is reported
  // by the propagation (options.onProgress) when it reports at all.
  const blockShare = plan ? 0.1 : 1;
  let done = 0;
  const reused = new Set<string>();
  const evaluatedBlockIds: string[] = [];
  let bytes = RESULTS_ENVELOPE_BYTES;
  for (const name of graph.order) {
    const prepared = blocks.get(name)!;
    const previous = reuse(prepared, graph, reused);
    let result: BlockResult;
    if (previous) {
      reused.add(name);
      result = previous;
    } else {
      evaluatedBlockIds.push(prepared.block.id);
      result = state.evaluateBlock(prepared, graph);
    }
    // A block whose outputs would take the document over its size cap is an error (its
    // dependents are then blocked), never a stopped run.
    let size = blockResultBytes(name, result);
    if (bytes + size > MAX_RESULTS_BYTES) {
      if (previous) {
        reused.delete(name);
        evaluatedBlockIds.push(prepared.block.id);
      }
      result = failed(
        prepared.block,
        'error',
        blockMessage(name, `its results would take the results document over the limit of ${MAX_RESULTS_BYTES / (1024 * 1024)} MB`),
      );
      size = blockResultBytes(name, result);
    }
    bytes += size;
    state.results.set(name, result);
    done++;
    options.onProgress?.((blockShare * done) / total);
  }
  const uncertainty = plan
    ? propagateUncertainty({
        plan,
        blocks,
        order: graph.order,
        results: state.results,
        distributions: state.distributions,
        nominalInputs: state.nominalInputs,
        options,
      })
    : undefined;
  return { results: assemble(document, state.results, sheetHash, uncertainty), evaluatedBlockIds };
}

/**
 * Evaluates every block of a (validated) sheet document. `sheetHash` is the document's hash
 * when the caller has it already (computed from the canonical text of the validation).
 */
export function evaluateSheet(
  document: SheetDocument,
  sheetHash = hashSheetDocument(document),
  options: EvaluateOptions = {},
): SheetResults {
  return run(document, () => null, sheetHash, options).results;
}

/**
 * Re-evaluates only the changed blocks, blocks that are new, renamed or retyped since the
 * previous results, and everything downstream of them. The results equal a full evaluation.
 */
export function evaluateSheetIncremental(
  document: SheetDocument,
  previous: SheetResults | null,
  changedBlockIds: readonly string[],
  sheetHash = hashSheetDocument(document),
  options: EvaluateOptions = {},
): { results: SheetResults; evaluatedBlockIds: string[] } {
  if (!previous || previous.engine !== ENGINE_VERSION || previous.format !== RESULTS_FORMAT || mayBeUncertain(document)) {
    return run(document, () => null, sheetHash, options);
  }
  const changed = new Set(changedBlockIds);
  return run(document, (prepared, graph, reused) => {
    const { block } = prepared;
    const before = previous.blocks[block.name];
    if (!before || before.id !== block.id || before.type !== block.type) return null;
    if (changed.has(block.id) || prepared.problem || graph.cycles.has(block.name)) return null;
    if (!prepared.dependencies.every((dependency) => reused.has(dependency))) return null;
    // A failed data block is tried again: the missing dataset may have been uploaded since.
    // An ok one stays valid, since a dataset never changes under its hash.
    if (prepared.data.size > 0 && before.status !== 'ok') return null;
    return before;
  }, sheetHash, options);
}

/**
 * Whether a document has uncertainty settings or may hold a distribution: such sheets are always
 * evaluated in full (a changed seed or distribution changes every downstream sample).
 */
function mayBeUncertain(document: SheetDocument): boolean {
  if (document.uncertainty !== undefined) return true;
  return document.blocks.some((block) => Object.values(block.inputs).some((text) => DISTRIBUTION_CALL.test(text)));
}
