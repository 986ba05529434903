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
import type { Unit } from 'mathjs';
import type { BlockOutcome, BlockTypeDefinition, InputSpec, InputValues, Series } from '../block-type';
import { coerceBlockInputs, type RunOptions } from '../block-run';
import type { SheetDocument } from '../document';
import { EngineError, toSafeMessage } from '../errors';
import { math } from '../expression';
import { describeValue, formatFromSI, formatValue, quantityFromSI, unitTemplate, type FormattedOutput, type Quantity } from '../units';
import { isImplausible, typicalRange, type TypicalRange } from '../typical-ranges';
import { describeSample, quantileOf, type Distribution } from './distributions';
import { compileNumeric, type NumericFunction } from './numeric';
import { averageRanks, histogram, mean, quantileSorted, sortedCopy, spearmanFromRanks, standardDeviation } from './statistics';
import { streamUniforms, normalQuantile } from './stream';

export type UncertaintyMethod = 'monte_carlo' | 'linear';

export interface UncertaintySettings {
  method: UncertaintyMethod;
  samples: number;
  seed: number;
}

export const DEFAULT_UNCERTAINTY: UncertaintySettings = { method: 'monte_carlo', samples: 10_000, seed: 1 };

/** The settings of a document with the defaults filled in (CONTRACT §8.2). */
export function uncertaintySettings(document: SheetDocument): UncertaintySettings {
  const u = document.uncertainty ?? {};
  return {
    method: u.method ?? DEFAULT_UNCERTAINTY.method,
    samples: u.samples ?? DEFAULT_UNCERTAINTY.samples,
    seed: u.seed ?? DEFAULT_UNCERTAINTY.seed,
  };
}

export interface SpreadStatistics {
  mean: number;
  sd: number;
  p2_5: number;
  p16: number;
  p50: number;
  p84: number;
  p97_5: number;
}

export interface NumericSpread extends SpreadStatistics {
  method: UncertaintyMethod;
  samples?: number;
  seed?: number;
  si: SpreadStatistics;
  outside?: [number, number];
  sensitivity?: Record<string, number>;
  contributions?: Record<string, number>;
}

export interface TextSpread {
  method: 'monte_carlo';
  samples: number;
  seed: number;
  counts: Record<string, number>;
}

export type Spread = NumericSpread | TextSpread;

export interface UncertaintyEcho extends UncertaintySettings {
  inputs: Array<{ block: string; input: string; distribution: string; parameters: Record<string, FormattedOutput> }>;
}

/** What the sampling pass needs of a prepared block (evaluate.ts's PreparedBlock). */
export interface SampledBlock {
  block: { id: string; name: string; type: string; inputs: Record<string, string>; display?: Record<string, string> };
  type: BlockTypeDefinition;
  inputs: Map<string, { name: string; checked: import('../expression').CheckedExpression }>;
  references: ReadonlyArray<{ block: string; output: string }>;
  dependencies: readonly string[];
  problem?: string;
}

export interface SampledResult {
  id: string;
  type: string;
  status: 'ok' | 'error' | 'blocked';
  error?: string;
  warnings: string[];
  outputs: Record<string, FormattedOutput & { spread?: Spread }>;
  series?: Record<string, Series>;
}

/** One declared distribution of the sheet. */
export interface UncertainInput {
  block: string;
  blockId: string;
  input: string;
  /** `<block>.<input>`, the key of sensitivities and contributions. */
  key: string;
}

export interface UncertaintyPlan {
  settings: UncertaintySettings;
  inputs: UncertainInput[];
  /** Blocks that hold a distribution or depend on one, directly or through others. */
  uncertain: Set<string>;
  /** Indices (into inputs) of the uncertain inputs upstream of each uncertain block. */
  upstream: Map<string, number[]>;
}

export const DISTRIBUTION_PARAMETERS_MESSAGE = 'distribution parameters must be certain';
/** A cheap test of whether a document may hold distributions (for incremental evaluation). */
export const DISTRIBUTION_CALL = /\b(?:normal|lognormal|uniform|triangular)\s*\(/;

/**
 * Finds the uncertain inputs and the blocks downstream of them (in dependency order), and marks
 * the structural faults: a distribution whose parameters refer to an uncertain block. Returns
 * null for a sheet without distributions.
 */
export function planUncertainty(
  document: SheetDocument,
  blocks: Map<string, SampledBlock>,
  order: readonly string[],
  setProblem: (name: string, message: string) => void,
): UncertaintyPlan | null {
  const inputs: UncertainInput[] = [];
  const uncertain = new Set<string>();
  const upstream = new Map<string, number[]>();
  for (const name of order) {
    const prepared = blocks.get(name);
    if (!prepared) continue;
    const own: number[] = [];
    for (const input of prepared.inputs.values()) {
      if (!input.checked.distribution) continue;
      const unsure = input.checked.references.find((reference) => uncertain.has(reference.block));
      if (unsure) {
        setProblem(name, `${input.name}: ${DISTRIBUTION_PARAMETERS_MESSAGE} (${unsure.block}.${unsure.output} is uncertain)`);
      }
      own.push(inputs.length);
      inputs.push({ block: name, blockId: prepared.block.id, input: input.name, key: `${name}.${input.name}` });
    }
    const all = new Set(own);
    for (const dependency of prepared.dependencies) for (const i of upstream.get(dependency) ?? []) all.add(i);
    if (all.size > 0) {
      uncertain.add(name);
      upstream.set(name, [...all].sort((a, b) => a - b));
    }
  }
  if (inputs.length === 0 && document.uncertainty === undefined) return null;
  return { settings: uncertaintySettings(document), inputs, uncertain, upstream };
}

/* ------------------------------------------------------------------ helpers */

type Column = Float64Array | number;

interface BlockColumns {
  numbers: Map<string, Column>;
  texts: Map<string, string[]>;
}

function siOf(value: unknown): number | null {
  if (typeof value === 'number') return value;
  if (math.isUnit(value)) {
    const unit = value as Unit;
    if (unit.value === null) return null;
    return unit.toSI().toNumber();
  }
  return null;
}

const ANGLE_INDEX = 7;
function isAngle(value: unknown): boolean {
  if (!math.isUnit(value)) return false;
  const dims = (value as Unit).dimensions;
  return dims.every((d, i) => (i === ANGLE_INDEX ? d === 1 : d === 0));
}

function outOfRange(spec: InputSpec, v: number): boolean {
  const range = spec.range;
  if (!range) return false;
  if (range.min !== undefined && (range.minExclusive ? v <= range.min : v < range.min)) return true;
  if (range.max !== undefined && (range.maxExclusive ? v >= range.max : v > range.max)) return true;
  return false;
}

function close(a: number, b: number): boolean {
  return a === b || Math.abs(a - b) <= 1e-9 * Math.max(Math.abs(a), Math.abs(b)) + 1e-300;
}

/** The value of an output in its display unit, from SI. */
function displayConverter(unit: string): { value(si: number): number; difference(si: number): number } {
  if (unit === '') return { value: (si) => si, difference: (si) => si };
  const template = unitTemplate(unit);
  const value = (si: number): number => formatFromSI(si, unit).value as number;
  if (template && template.noOffset) return { value, difference: value };
  return { value, difference: (si) => value(si) - value(0) };
}

/** Groups sample warnings whose texts differ only in numbers; varying numbers become "…". */
class WarningTally {
  private readonly groups = new Map<string, { count: number; tokens: string[]; varies: boolean[] }>();
  add(text: string): void {
    const tokens = text.split(/(-?\d+(?:\.\d+)?(?:e[+-]?\d+)?)/i);
    const key = tokens.map((t, i) => (i % 2 === 1 ? '#' : t)).join('');
    const group = this.groups.get(key);
    if (!group) {
      if (this.groups.size < 20) this.groups.set(key, { count: 1, tokens, varies: tokens.map(() => false) });
      return;
    }
    group.count++;
    for (let i = 1; i < tokens.length; i += 2) if (tokens[i] !== group.tokens[i]) group.varies[i] = true;
  }
  lines(total: number): string[] {
    return [...this.groups.values()].map(
      (g) => `in ${g.count} of ${total} samples: ${g.tokens.map((t, i) => (g.varies[i] ? '…' : t)).join('')}`,
    );
  }
}

class SampleFailure extends Error {
  constructor(readonly sample: number, readonly reason: string) {
    super(reason);
  }
}

/* --------------------------------------------------------------- the pass */

export interface PropagationContext {
  plan: UncertaintyPlan;
  blocks: Map<string, SampledBlock>;
  order: readonly string[];
  results: Map<string, SampledResult>;
  /** Distributions made in the nominal pass, by `<block>\u0000<input>`. */
  distributions: Map<string, Distribution>;
  /** The nominal value of every input of the uncertain blocks (mathjs values). */
  nominalInputs: Map<string, Map<string, unknown>>;
  /** The run's options (datasets for data inputs). */
  options: RunOptions;
}

const Z = {
  p2_5: normalQuantile(0.025),
  p16: normalQuantile(0.16),
  p84: normalQuantile(0.84),
  p97_5: normalQuantile(0.975),
};

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
    const waiting = prepared.dependencies.find((d) => context.results.get(d)?.status !== 'ok');
    if (waiting) {
      const why = context.results.get(waiting)?.status === 'error' ? 'which has an error' : 'which is itself blocked';
      context.results.set(name, { id: prepared.block.id, type: prepared.block.type, status: 'blocked', error: `waiting on block "${waiting}", ${why}`, warnings: [], outputs: {} });
      continue;
    }
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
    const blockUpstream = (plan.upstream.get(name) ?? []).filter((j) => inputColumns[j] !== undefined);
    const outputs: SampledResult['outputs'] = {};
    let series = result.series;
    for (const [output, formatted] of Object.entries(result.outputs)) {
      const column = own.numbers.get(output);
      const texts = own.texts.get(output);
      let spread: Spread | undefined;
      const upstream = outputUpstream(prepared, output, blockUpstream, plan);
      if (column instanceof Float64Array) {
        if (linear) {
          spread = linearSpread(column, formatted, upstream, plan, failures.get(name)!, name);
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

function constant(column: Float64Array): boolean {
  const first = column[0];
  for (let k = 1; k < column.length; k++) if (column[k] !== first) return false;
  return true;
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

function statisticsIn(convert: ReturnType<typeof displayConverter>, si: SpreadStatistics): SpreadStatistics {
  return {
    mean: convert.value(si.mean),
    sd: convert.difference(si.sd),
    p2_5: convert.value(si.p2_5),
    p16: convert.value(si.p16),
    p50: convert.value(si.p50),
    p84: convert.value(si.p84),
    p97_5: convert.value(si.p97_5),
  };
}

function monteCarloSpread(
  column: Float64Array,
  formatted: FormattedOutput,
  upstream: number[],
  plan: UncertaintyPlan,
  settings: UncertaintySettings,
  ranksOf: (j: number) => Float64Array,
): { spread: NumericSpread; centres: number[]; counts: number[] } {
  const sorted = sortedCopy(column);
  const m = mean(column);
  const si: SpreadStatistics = {
    mean: m,
    sd: standardDeviation(column, m),
    p2_5: quantileSorted(sorted, 0.025),
    p16: quantileSorted(sorted, 0.16),
    p50: quantileSorted(sorted, 0.5),
    p84: quantileSorted(sorted, 0.84),
    p97_5: quantileSorted(sorted, 0.975),
  };
  const convert = displayConverter(formatted.unit);
  const hist = histogram(column, sorted);
  const sensitivity: Record<string, number> = {};
  const outputRanks = averageRanks(column, sorted);
  for (const j of upstream) sensitivity[plan.inputs[j]!.key] = spearmanFromRanks(ranksOf(j), outputRanks);
  return {
    spread: {
      method: 'monte_carlo',
      samples: settings.samples,
      seed: settings.seed,
      ...statisticsIn(convert, si),
      si,
      outside: hist.outside,
      sensitivity,
    },
    centres: hist.centres.map((c) => convert.value(c)),
    counts: hist.counts,
  };
}

function linearSpread(
  column: Float64Array,
  formatted: FormattedOutput,
  upstream: number[],
  plan: UncertaintyPlan,
  failed: Array<string | undefined>,
  name: string,
): NumericSpread | undefined {
  const y0 = formatted.si as number;
  const terms: Array<[string, number]> = [];
  for (const j of upstream) {
    const input = plan.inputs[j]!;
    const plus = 2 * j;
    const minus = 2 * j + 1;
    const x = column;
    // h is recovered from nothing here: the caller's columns carry y only, so the derivative
    // times u is formed from the symmetric design: c·u = (y+ − y−)/(2h)·u with h = 1e-4·u.
    let cu: number;
    if (!failed[plus] && !failed[minus]) cu = (x[plus]! - x[minus]!) / 2e-4;
    else if (!failed[plus]) cu = (x[plus]! - y0) / 1e-4;
    else if (!failed[minus]) cu = (y0 - x[minus]!) / 1e-4;
    else {
      throw new EngineError(`block "${name}", linear propagation: the block fails on both sides of ${input.key} (${failed[plus]})`);
    }
    terms.push([input.key, cu]);
  }
  let variance = 0;
  for (const [, cu] of terms) variance += cu * cu;
  const uc = Math.sqrt(variance);
  if (!(uc > 0)) return undefined;
  const si: SpreadStatistics = {
    mean: y0,
    sd: uc,
    p2_5: y0 + Z.p2_5 * uc,
    p16: y0 + Z.p16 * uc,
    p50: y0,
    p84: y0 + Z.p84 * uc,
    p97_5: y0 + Z.p97_5 * uc,
  };
  const contributions: Record<string, number> = {};
  for (const [key, cu] of terms) contributions[key] = (cu * cu) / variance;
  return { method: 'linear', ...statisticsIn(displayConverter(formatted.unit), si), si, contributions };
}

/* ------------------------------------------------------- one block's samples */

interface InputSource {
  /** Per-sample SI values of the input's mathjs value, or a constant. */
  column: Column | undefined;
  /** The nominal value (mathjs), for coercion kinds and messages. */
  nominal: unknown;
}

function sampleBlock(
  prepared: SampledBlock,
  context: PropagationContext,
  columns: Map<string, BlockColumns>,
  inputColumns: Array<Float64Array | undefined>,
  made: Array<Distribution | undefined>,
  count: number,
  linear: boolean,
  failed: Array<string | undefined>,
  tally: WarningTally,
): { columns: BlockColumns; failed: Array<string | undefined> } {
  const { block, type } = prepared;
  const nominalInputs = context.nominalInputs.get(block.name) ?? new Map<string, unknown>();
  const fail = (k: number, reason: string): void => {
    if (!linear) throw new SampleFailure(k, reason);
    failed[k] ??= reason;
  };

  // Slots for the references this block reads.
  const slots = new Map<string, number>();
  const slotColumns: Column[] = [];
  const slotUnits: string[] = [];
  for (const reference of prepared.references) {
    const key = `${reference.block}.${reference.output}`;
    if (slots.has(key)) continue;
    const upstream = context.results.get(reference.block)!;
    const formatted = upstream.outputs[reference.output];
    if (!formatted || typeof formatted.si !== 'number') continue;
    const sampled = columns.get(reference.block)?.numbers.get(reference.output);
    slots.set(key, slotColumns.length);
    slotColumns.push(sampled ?? formatted.si);
    slotUnits.push(formatted.unit);
  }
  const env = new Float64Array(slotColumns.length);
  const fillEnv = (k: number): void => {
    for (let i = 0; i < slotColumns.length; i++) {
      const c = slotColumns[i]!;
      env[i] = typeof c === 'number' ? c : c[k]!;
    }
  };
  const varyingSlots = (names: ReadonlyArray<{ block: string; output: string }>): boolean =>
    names.some((r) => {
      const i = slots.get(`${r.block}.${r.output}`);
      return i === undefined ? context.plan.uncertain.has(r.block) : typeof slotColumns[i] !== 'number';
    });

  // A mathjs scope for the fallback path.
  const scopeFor = (k: number): Map<string, unknown> => {
    const scope = new Map<string, unknown>();
    for (const reference of prepared.references) {
      let object = scope.get(reference.block) as Record<string, unknown> | undefined;
      if (!object) {
        object = {};
        scope.set(reference.block, object);
      }
      const upstream = context.results.get(reference.block)!;
      const formatted = upstream.outputs[reference.output];
      if (!formatted) continue;
      const i = slots.get(`${reference.block}.${reference.output}`);
      const c = i === undefined ? undefined : slotColumns[i];
      if (typeof formatted.si !== 'number' || c === undefined) {
        object[reference.output] = formatted.value;
      } else {
        const si = typeof c === 'number' ? c : c[k]!;
        object[reference.output] = formatted.unit === '' ? si : quantityFromSI(si, formatted.unit);
      }
    }
    return scope;
  };

  // Every input as per-sample SI values.
  const sources = new Map<string, InputSource>();
  for (const [inputName, input] of prepared.inputs) {
    const nominal = nominalInputs.get(inputName);
    if (input.checked.distribution) {
      const j = context.plan.inputs.findIndex((i) => i.block === block.name && i.input === inputName);
      sources.set(inputName, { column: inputColumns[j], nominal });
      continue;
    }
    if (!varyingSlots(input.checked.references)) {
      const si = siOf(nominal);
      sources.set(inputName, { column: si ?? undefined, nominal });
      continue;
    }
    const nominalSi = siOf(nominal);
    const compiled: NumericFunction | null = nominalSi === null ? null : compileNumeric(input.checked.node, (b, o) => slots.get(`${b}.${o}`) ?? null);
    const column = new Float64Array(count);
    let numeric = false;
    if (compiled && nominalSi !== null && !slotUnits.some((u) => u !== '' && !(unitTemplate(u)?.noOffset ?? false))) {
      // The nominal point: every slot at its nominal value.
      for (let i = 0; i < slotColumns.length; i++) {
        const reference = [...slots.keys()][i]!;
        const [b, o] = [reference.slice(0, reference.indexOf('.')), reference.slice(reference.indexOf('.') + 1)];
        env[i] = context.results.get(b)!.outputs[o]!.si as number;
      }
      numeric = close(compiled(env), nominalSi);
    }
    if (numeric) {
      for (let k = 0; k < count; k++) {
        if (failed[k]) continue;
        fillEnv(k);
        column[k] = compiled!(env);
      }
    } else {
      for (let k = 0; k < count; k++) {
        if (failed[k]) continue;
        let si: number | null;
        try {
          const value = input.checked.evaluate(scopeFor(k));
          si = siOf(type.id === 'formula' || type.freeInputs ? formatValue(value, block.display?.[type.freeInputs ? inputName : 'value']).si : value);
          if (si === null) throw new EngineError(`the sample gave ${describeValue(value)}, not a number`);
        } catch (error) {
          fail(k, `${inputName}: ${toSafeMessage(error)}`);
          continue;
        }
        column[k] = si;
      }
    }
    sources.set(inputName, { column, nominal });
  }

  const out: BlockColumns = { numbers: new Map(), texts: new Map() };

  // quantities and formula: the outputs are the inputs' values.
  if (type.freeInputs || type.id === 'formula') {
    for (const [inputName, source] of sources) {
      const outputName = type.freeInputs ? inputName : 'value';
      const c = source.column;
      if (c === undefined) continue;
      if (typeof c !== 'number') {
        for (let k = 0; k < count; k++) {
          if (!failed[k] && !Number.isFinite(c[k]!)) fail(k, `${inputName}: the result is not finite`);
        }
      }
      out.numbers.set(outputName, c);
    }
    return { columns: out, failed };
  }

  // A block type: its relation on SI numbers for every sample.
  const nominalValues: Record<string, unknown> = {};
  for (const spec of type.inputs) nominalValues[spec.name] = nominalInputs.get(spec.name);
  const { coerced: nominalCoerced, other } = coerceBlockInputs(type, nominalValues, context.options);
  let relation = type.evaluate!;
  if (type.sampleRelation || type.sampleCost) {
    const nominalOutcome = type.evaluate!(nominalCoerced, other);
    const cost = type.sampleCost?.(nominalCoerced, other, nominalOutcome);
    if (cost && cost.cost * count > cost.limit) {
      throw new EngineError(`${cost.what} × ${count} samples = ${(cost.cost * count).toExponential(2)} exceeds the limit of ${cost.limit.toExponential(0)}; use fewer samples or a coarser grid`);
    }
    if (type.sampleRelation) relation = type.sampleRelation(nominalCoerced, other, nominalOutcome);
  }
  // `range`: the input's typical range (typical-ranges.ts), when the nominal value is inside it: samples more than
  // 100 times outside are counted as a warning ("in 12 of 10000 samples: diffusivity … is more than 100 times
  // outside the typical range …"). When the nominal value is itself outside, the block already says so once.
  interface Varying { spec: InputSpec; column: Float64Array; tan: boolean; dimensions: readonly number[]; unit: string; range?: TypicalRange }
  const varying: Varying[] = [];
  const base: InputValues = { ...nominalCoerced };
  for (const spec of type.inputs) {
    const source = sources.get(spec.name);
    if (!source || !(source.column instanceof Float64Array)) continue;
    const q = nominalCoerced[spec.name] as Quantity;
    const nominal = source.nominal;
    const unit = math.isUnit(nominal) ? (nominal as Unit).formatUnits() : '';
    const typical = typicalRange(type.id, spec.name);
    const range = typical && !isImplausible(typical, q.si) ? typical : undefined;
    varying.push({ spec, column: source.column, tan: spec.dimension === 'slope' && isAngle(nominal), dimensions: q.dimensions, unit, range });
  }
  const numberOutputs = type.outputs.filter((o) => o.kind === 'quantity');
  const textOutputs = type.outputs.filter((o) => o.kind === 'text');
  const nominalResult = context.results.get(block.name)!;
  const numberColumns = new Map<string, Float64Array>();
  for (const o of numberOutputs) if (o.name in nominalResult.outputs) numberColumns.set(o.name, new Float64Array(count));
  const textColumns = new Map<string, string[]>();
  for (const o of textOutputs) if (o.name in nominalResult.outputs) textColumns.set(o.name, new Array<string>(count));

  const inputs: InputValues = { ...base };
  for (let k = 0; k < count; k++) {
    if (failed[k]) continue;
    let bad: string | null = null;
    for (const v of varying) {
      const x = v.column[k]!;
      const si = v.tan ? Math.tan(x) : x;
      if (outOfRange(v.spec, si)) {
        const shown = v.unit === '' ? describeValue(x) : describeValue(quantityFromSI(x, v.unit));
        bad = `${v.spec.name}: must be ${v.spec.range!.text}, got ${shown}`;
        break;
      }
      inputs[v.spec.name] = { si, dimensions: v.dimensions };
      if (!linear && v.range && isImplausible(v.range, si)) {
        tally.add(`${v.spec.name} more than 100 times outside the typical range ${v.range.text} (${v.range.source}): check the distribution and its unit`);
      }
    }
    if (bad) {
      fail(k, bad);
      continue;
    }
    let outcome: BlockOutcome;
    try {
      outcome = relation(inputs, other);
    } catch (error) {
      fail(k, toSafeMessage(error));
      continue;
    }
    let problem: string | null = null;
    for (const [name, target] of numberColumns) {
      const output = outcome.outputs[name];
      if (!output || !('si' in output)) {
        problem = `${name}: the sample gave no value`;
        break;
      }
      if (!Number.isFinite(output.si)) {
        problem = `${name}: the result is not finite (${output.si}); check the inputs`;
        break;
      }
      target[k] = output.si;
    }
    if (problem) {
      fail(k, problem);
      continue;
    }
    for (const [name, target] of textColumns) {
      const output = outcome.outputs[name];
      target[k] = output && 'text' in output ? output.text : '';
    }
    if (!linear) for (const w of outcome.warnings) tally.add(w);
  }
  for (const [name, c] of numberColumns) out.numbers.set(name, c);
  for (const [name, c] of textColumns) out.texts.set(name, c);
  return { columns: out, failed };
}
