/**
 * The evaluation of one block in a run: cycles, upstream errors and missing outputs become error or blocked
 * results; otherwise the block's inputs are evaluated in a scope holding only what it reads (a distribution at
 * its median in the nominal pass) and its type runs. The state shared by a run's blocks is kept here.
 */
import { collectCallWarnings, formatBlockOutput, runBlockType, type RunOptions } from './block-run';
import { BlockFailure } from './block-type';
import { DatasetReference } from './dataset-input';
import { EngineError, toSafeMessage } from './errors';
import type { DependencyGraph } from './graph';
import { blockMessage, type PreparedBlock } from './prepare';
import { failed, type BlockResult } from './results-document';
import { formatValue, valueFromFormatted, type FormattedOutput } from './unit-format';
import { isDistributionName, makeDistribution, valueOf, type Distribution } from './uncertainty/distributions';

const FORMULA_INPUTS: readonly string[] = ['expr'];

/** Evaluation state shared by the blocks of one run. */
export class Run {
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
