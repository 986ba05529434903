/**
 * Uncertainty through the chain (CONTRACT §8): after the nominal pass (every distribution at its
 * median), the blocks downstream of an uncertain input are evaluated again for every sample —
 * Monte Carlo with one seeded stream per input, or the 2m perturbed points of first-order
 * propagation — and each varying output gets a spread. Other blocks are evaluated once.
 *
 * Speed: each block's relation is compiled once. A formula or quantities expression becomes a
 * function on SI floats (numeric.ts), checked against the nominal value; a block type runs its
 * pure evaluate() (or its sampleRelation) on SI numbers, with the nominal pass's dimension checks
 * standing and only ranges re-checked. Samples run as loops over typed arrays. Expressions the
 * numeric compiler does not cover are evaluated with mathjs for each sample (slower, same answer).
 */
import { toSafeMessage } from '../errors';
import { describeSample, quantileOf, type Distribution } from './distributions';
import type { SampledBlock, SampledResult, Spread, UncertaintyEcho, UncertaintyPlan } from './plan';
import { sampleBlock, SampleFailure, WarningTally, type BlockColumns, type PropagationContext } from './sample-block';
import { constant, linearSpread, monteCarloSpread } from './spread';
import { averageRanks } from './statistics';
import { streamUniforms } from './stream';

/** Runs the sampling (or linear) pass and adds spreads, histograms and warnings to the results. */
export function propagateUncertainty(context: PropagationContext): UncertaintyEcho {
  const { plan } = context;
  const settings = plan.settings;
  const linear = settings.method === 'linear';
  const made: Array<Distribution | undefined> = plan.inputs.map((input) => context.distributions.get(`${input.block}\u0000${input.input}`));
  const m = plan.inputs.length;
  const count = linear ? 2 * m : settings.samples;

  // The sample columns of every uncertain input (SI).
  const inputColumns: Array<Float64Array | undefined> = made.map((d, j) => {
    if (!d) return undefined;
    const column = new Float64Array(count);
    if (linear) {
      column.fill(d.median);
      const h = 1e-4 * d.sd;
      column[2 * j] = d.median + h;
      column[2 * j + 1] = d.median - h;
    } else {
      const input = plan.inputs[j]!;
      const u = streamUniforms(settings.seed, input.blockId, input.input, count);
      for (let k = 0; k < count; k++) column[k] = quantileOf(d, u[k]!);
    }
    return column;
  });

  const columns = new Map<string, BlockColumns>();
  /** Linear method: the samples that failed in a block (message), propagated downstream. */
  const failures = new Map<string, Array<string | undefined>>();
  const tallies = new Map<string, WarningTally>();

  for (const name of context.order) {
    if (!plan.uncertain.has(name)) continue;
    const prepared = context.blocks.get(name)!;
    const result = context.results.get(name);
    if (!result || result.status !== 'ok') continue;
    if (blockedByUpstream(name, prepared, context)) continue;
    const upstreamFailed: Array<string | undefined> = new Array(count);
    if (linear) {
      for (const dependency of prepared.dependencies) {
        const failed = failures.get(dependency);
        if (failed) failed.forEach((why, k) => { if (why && !upstreamFailed[k]) upstreamFailed[k] = why; });
      }
    }
    const tally = new WarningTally();
    try {
      const own = sampleBlock(prepared, context, columns, inputColumns, made, count, linear, upstreamFailed, tally);
      columns.set(name, own.columns);
      if (linear) failures.set(name, own.failed);
      tallies.set(name, tally);
    } catch (error) {
      const message = error instanceof SampleFailure
        ? `block "${name}", sample ${error.sample + 1} of ${count} (${describeSampleInputs(name, plan, made, inputColumns, error.sample)}): ${error.reason}`
        : `block "${name}", ${toSafeMessage(error)}`;
      context.results.set(name, { id: prepared.block.id, type: prepared.block.type, status: 'error', error: message, warnings: [], outputs: {} });
    }
  }

  // Spreads, histograms, sensitivities, warnings.
  const inputRanks = new Map<number, Float64Array>();
  const ranksOf = (j: number): Float64Array => {
    let ranks = inputRanks.get(j);
    if (!ranks) {
      ranks = averageRanks(inputColumns[j]!);
      inputRanks.set(j, ranks);
    }
    return ranks;
  };
  for (const [name, own] of columns) {
    const result = context.results.get(name)!;
    if (result.status !== 'ok') continue;
    const prepared = context.blocks.get(name)!;
    // Linear method: a block upstream that failed on both sides of an input (below) blocks this one.
    if (blockedByUpstream(name, prepared, context)) continue;
    const blockUpstream = (plan.upstream.get(name) ?? []).filter((j) => inputColumns[j] !== undefined);
    const outputs: SampledResult['outputs'] = {};
    let series = result.series;
    let failedLinear: string | undefined;
    for (const [output, formatted] of Object.entries(result.outputs)) {
      const column = own.numbers.get(output);
      const texts = own.texts.get(output);
      let spread: Spread | undefined;
      const upstream = outputUpstream(prepared, output, blockUpstream, plan);
      if (column instanceof Float64Array) {
        if (linear) {
          try {
            spread = linearSpread(column, formatted, upstream, plan, failures.get(name)!, name);
          } catch (error) {
            // CONTRACT §8.4: a block error when both sides of an input fail (not a failed evaluation).
            failedLinear = toSafeMessage(error);
            break;
          }
        } else if (!constant(column)) {
          const built = monteCarloSpread(column, formatted, upstream, plan, settings, ranksOf);
          spread = built.spread;
          const spec = prepared.type.outputs.find((o) => o.name === output);
          series = { ...(series ?? {}), [`hist_${output}`]: {
            x: built.centres, y: built.counts,
            xLabel: spec?.label ?? output, yLabel: 'samples', xUnit: formatted.unit, yUnit: '',
          } };
        }
      } else if (texts && !linear && texts.some((t) => t !== texts[0])) {
        const labels = prepared.type.outputs.find((o) => o.name === output)?.labels ?? [];
        const counts: Record<string, number> = {};
        for (const label of labels) counts[label] = 0;
        for (const t of texts) counts[t] = (counts[t] ?? 0) + 1;
        spread = { method: 'monte_carlo', samples: settings.samples, seed: settings.seed, counts };
      }
      outputs[output] = spread ? { ...formatted, spread } : formatted;
    }
    if (failedLinear !== undefined) {
      context.results.set(name, { id: prepared.block.id, type: prepared.block.type, status: 'error', error: failedLinear, warnings: [], outputs: {} });
      continue;
    }
    const warnings = [...result.warnings, ...(linear ? [] : tallies.get(name)?.lines(count) ?? [])];
    const next: SampledResult = { ...result, warnings, outputs };
    if (series) next.series = series;
    context.results.set(name, next);
  }

  return {
    ...settings,
    inputs: plan.inputs.flatMap((input, j) => {
      const d = made[j];
      return d ? [{ block: input.block, input: input.input, distribution: d.name, parameters: d.parameters }] : [];
    }),
  };
}

/** Marks the block blocked when a block it depends on is not ok (an error, or itself blocked). */
function blockedByUpstream(name: string, prepared: SampledBlock, context: PropagationContext): boolean {
  const waiting = prepared.dependencies.find((d) => context.results.get(d)?.status !== 'ok');
  if (!waiting) return false;
  const why = context.results.get(waiting)?.status === 'error' ? 'which has an error' : 'which is itself blocked';
  context.results.set(name, { id: prepared.block.id, type: prepared.block.type, status: 'blocked', error: `waiting on block "${waiting}", ${why}`, warnings: [], outputs: {} });
  return true;
}

/**
 * The uncertain inputs an output depends on: for quantities and formula blocks only those its
 * own expression reaches (q.A does not depend on q.B), for other types every one upstream.
 */
function outputUpstream(prepared: SampledBlock, output: string, blockUpstream: number[], plan: UncertaintyPlan): number[] {
  const { type } = prepared;
  if (!type.freeInputs && type.id !== 'formula') return blockUpstream;
  const input = prepared.inputs.get(type.freeInputs ? output : 'expr');
  if (!input) return [];
  const reached = new Set<number>();
  for (const j of blockUpstream) {
    const declared = plan.inputs[j]!;
    if (declared.block === prepared.block.name) {
      if (declared.input === input.name) reached.add(j);
    }
  }
  for (const reference of input.checked.references) {
    for (const j of plan.upstream.get(reference.block) ?? []) if (blockUpstream.includes(j)) reached.add(j);
  }
  return blockUpstream.filter((j) => reached.has(j));
}

function describeSampleInputs(name: string, plan: UncertaintyPlan, made: Array<Distribution | undefined>, columns: Array<Float64Array | undefined>, k: number): string {
  const upstream = (plan.upstream.get(name) ?? []).filter((j) => columns[j] !== undefined);
  const parts = upstream.slice(0, 3).map((j) => {
    const input = plan.inputs[j]!;
    const label = input.block === name ? input.input : input.key;
    return `${label} = ${describeSample(made[j]!, columns[j]![k]!)}`;
  });
  if (upstream.length > 3) parts.push('…');
  return parts.join(', ');
}
