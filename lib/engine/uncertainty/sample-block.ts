/**
 * One uncertain block's samples: every input as a column of SI values (compiled to a numeric
 * function where possible, else evaluated with mathjs per sample), then the block type's relation on
 * SI numbers for every sample, with ranges re-checked and warnings tallied.
 */
import type { Unit } from 'mathjs';
import type { BlockOutcome, InputSpec, InputValues } from '../block-type';
import { coerceBlockInputs, type RunOptions } from '../block-run';
import { EngineError, toSafeMessage } from '../errors';
import { math } from '../expression';
import { describeValue, type Quantity } from '../units';
import { formatValue, quantityFromSI, unitTemplate } from '../unit-format';
import { isImplausible, typicalRange, type TypicalRange } from '../typical-ranges';
import type { Distribution } from './distributions';
import { compileNumeric, type NumericFunction } from './numeric';
import type { SampledBlock, SampledResult, UncertaintyPlan } from './plan';

type Column = Float64Array | number;

export interface BlockColumns {
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

/** Groups sample warnings whose texts differ only in numbers; varying numbers become "…". */
export class WarningTally {
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

export class SampleFailure extends Error {
  constructor(readonly sample: number, readonly reason: string) {
    super(reason);
  }
}

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

interface InputSource {
  /** Per-sample SI values of the input's mathjs value, or a constant. */
  column: Column | undefined;
  /** The nominal value (mathjs), for coercion kinds and messages. */
  nominal: unknown;
}

export function sampleBlock(
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
