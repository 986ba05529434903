/**
 * The four distributions of CONTRACT §8.1: argument rules, the nominal value (the median),
 * the standard uncertainty for first-order propagation and inverse-CDF sampling, all in SI.
 * Formulas: reference FORMULAS §17.1 (medians and standard deviations; GUM JCGM 100:2008
 * §4.3.7–4.3.9 for the bounded forms).
 */
import type { Unit } from 'mathjs';
import { EngineError } from '../errors';
import { math } from '../expression';
import { describeValue } from '../units';
import { quantityFromSI, type FormattedOutput } from '../unit-format';
import { normalQuantile } from './stream';

export const DISTRIBUTION_NAMES = ['normal', 'lognormal', 'uniform', 'triangular'] as const;
export type DistributionName = (typeof DISTRIBUTION_NAMES)[number];

export function isDistributionName(name: string): name is DistributionName {
  return (DISTRIBUTION_NAMES as readonly string[]).includes(name);
}

const PARAMETER_NAMES: Record<DistributionName, readonly string[]> = {
  normal: ['mean', 'sd'],
  lognormal: ['median', 'factor'],
  uniform: ['lo', 'hi'],
  triangular: ['lo', 'mode', 'hi'],
};

const SIGNATURES: Record<DistributionName, string> = {
  normal: 'normal(mean, sd)',
  lognormal: 'lognormal(median, factor)',
  uniform: 'uniform(lo, hi)',
  triangular: 'triangular(lo, mode, hi)',
};

/** A checked distribution with its parameters in SI (sd as a difference). */
export interface Distribution {
  name: DistributionName;
  /** SI parameters in the order of PARAMETER_NAMES (lognormal: median SI, factor). */
  params: number[];
  /** The unit the values are written in ('' for plain numbers), e.g. "m^2 / kyr". */
  unit: string;
  /** Base dimensions of the values (all zero for plain numbers). */
  dimensions: readonly number[];
  /** The parameters as written, formatted (sd: si is the difference). */
  parameters: Record<string, FormattedOutput>;
  median: number;
  /** Standard deviation (the standard uncertainty of GUM). */
  sd: number;
}

const ZERO = [0, 0, 0, 0, 0, 0, 0, 0, 0];

interface Argument {
  value: number | Unit;
  si: number;
  dimensions: readonly number[];
  offset: boolean;
}

type UnitParts = { units: Array<{ unit: { offset: number } }> };

function fail(name: DistributionName, message: string): never {
  throw new EngineError(`${name}: ${message}`);
}

function readArgument(name: DistributionName, parameter: string, value: unknown): Argument {
  if (typeof value === 'number') {
    if (!Number.isFinite(value)) fail(name, `${parameter} is not finite`);
    return { value, si: value, dimensions: ZERO, offset: false };
  }
  if (math.isUnit(value)) {
    const unit = value as Unit;
    if (unit.value === null) fail(name, `${parameter} must be a value with its unit, got the unit ${unit.formatUnits()} alone`);
    const si = unit.toSI().toNumber();
    if (!Number.isFinite(si)) fail(name, `${parameter} is not finite`);
    const offset = (unit as unknown as UnitParts).units.some((part) => part.unit.offset !== 0);
    return { value: unit, si, dimensions: [...unit.dimensions], offset };
  }
  fail(name, `${parameter} must be a number or a quantity, got ${describeValue(value)}`);
}

function sameDimensions(a: readonly number[], b: readonly number[]): boolean {
  for (let i = 0; i < 9; i++) if ((a[i] ?? 0) !== (b[i] ?? 0)) return false;
  return true;
}

/** A difference in SI: `2 degC` as a spread is 2 K (no offset). */
function differenceSI(arg: Argument): number {
  if (!arg.offset || typeof arg.value === 'number') return arg.si;
  const unit = arg.value;
  const text = unit.formatUnits();
  const own = unit.toNumber(text);
  const scale = (math.unit(1000, text).toSI().toNumber() - math.unit(0, text).toSI().toNumber()) / 1000;
  return own * scale;
}

function formatArgument(arg: Argument, si: number, siUnit: string): FormattedOutput {
  if (typeof arg.value === 'number') return { value: arg.value, unit: '', si: arg.value, siUnit: '' };
  const unit = arg.value;
  return { value: unit.toNumber(unit.formatUnits()), unit: unit.formatUnits(), si, siUnit };
}

function siUnitText(arg: Argument): string {
  if (typeof arg.value === 'number') return '';
  const valueless = arg.value.clone();
  (valueless as unknown as { value: number | null }).value = null;
  return valueless.toSI().formatUnits();
}

/** Checks the arguments of a distribution call (evaluated mathjs values) against §8.1. */
export function makeDistribution(name: DistributionName, values: unknown[]): Distribution {
  const names = PARAMETER_NAMES[name];
  if (values.length !== names.length) {
    fail(name, `takes ${names.length} arguments, ${SIGNATURES[name]}, got ${values.length}`);
  }
  const args = values.map((value, i) => readArgument(name, names[i]!, value));
  const first = args[0]!;
  const siUnit = siUnitText(first);
  const parameters: Record<string, FormattedOutput> = {};
  let params: number[];
  let median: number;
  let sd: number;
  if (name === 'lognormal') {
    if (first.offset) fail(name, 'a median in degC or degF is refused: use K');
    if (!(first.si > 0)) fail(name, `median must be > 0, got ${describeValue(first.value)}`);
    const factor = args[1]!;
    if (typeof factor.value !== 'number') fail(name, `factor must be a plain number > 1, got ${describeValue(factor.value)}`);
    if (!(factor.si > 1)) fail(name, `factor must be a plain number > 1, got ${describeValue(factor.value)}`);
    params = [first.si, factor.si];
    median = first.si;
    const s = Math.log(factor.si);
    sd = median * Math.exp((s * s) / 2) * Math.sqrt(Math.expm1(s * s));
    parameters.median = formatArgument(first, first.si, siUnit);
    parameters.factor = formatArgument(factor, factor.si, '');
  } else {
    args.forEach((arg, i) => {
      if (i > 0 && !sameDimensions(arg.dimensions, first.dimensions)) {
        fail(name, `${names[i]} must have the same dimension as ${names[0]} (${describeValue(first.value)}), got ${describeValue(arg.value)}`);
      }
    });
    if (name === 'normal') {
      const spread = differenceSI(args[1]!);
      if (!(spread > 0)) fail(name, `sd must be > 0, got ${describeValue(args[1]!.value)}`);
      params = [first.si, spread];
      median = first.si;
      sd = spread;
      parameters.mean = formatArgument(first, first.si, siUnit);
      parameters.sd = formatArgument(args[1]!, spread, siUnit);
    } else if (name === 'uniform') {
      const [lo, hi] = [args[0]!.si, args[1]!.si];
      if (!(lo < hi)) fail(name, `lo must be less than hi (${describeValue(args[0]!.value)} ≥ ${describeValue(args[1]!.value)})`);
      params = [lo, hi];
      median = (lo + hi) / 2;
      sd = (hi - lo) / Math.sqrt(12);
      parameters.lo = formatArgument(args[0]!, lo, siUnit);
      parameters.hi = formatArgument(args[1]!, hi, siUnit);
    } else {
      const [lo, mode, hi] = [args[0]!.si, args[1]!.si, args[2]!.si];
      if (!(lo < hi)) fail(name, `lo must be less than hi (${describeValue(args[0]!.value)} ≥ ${describeValue(args[2]!.value)})`);
      if (!(lo <= mode && mode <= hi)) fail(name, `mode must lie between lo and hi, got ${describeValue(args[1]!.value)}`);
      params = [lo, mode, hi];
      median = mode >= (lo + hi) / 2 ? lo + Math.sqrt(((hi - lo) * (mode - lo)) / 2) : hi - Math.sqrt(((hi - lo) * (hi - mode)) / 2);
      sd = Math.sqrt((lo * lo + mode * mode + hi * hi - lo * mode - lo * hi - mode * hi) / 18);
      parameters.lo = formatArgument(args[0]!, lo, siUnit);
      parameters.mode = formatArgument(args[1]!, mode, siUnit);
      parameters.hi = formatArgument(args[2]!, hi, siUnit);
    }
  }
  const unit = typeof first.value === 'number' ? '' : first.value.formatUnits();
  return { name, params, unit, dimensions: first.dimensions, parameters, median, sd };
}

/** The inverse CDF at u (0 < u < 1), SI. */
export function quantileOf(d: Distribution, u: number): number {
  const p = d.params;
  switch (d.name) {
    case 'normal':
      return p[0]! + p[1]! * normalQuantile(u);
    case 'lognormal':
      return p[0]! * Math.exp(Math.log(p[1]!) * normalQuantile(u));
    case 'uniform':
      return p[0]! + (p[1]! - p[0]!) * u;
    case 'triangular': {
      const [lo, mode, hi] = p as [number, number, number];
      return u < (mode - lo) / (hi - lo) ? lo + Math.sqrt(u * (hi - lo) * (mode - lo)) : hi - Math.sqrt((1 - u) * (hi - lo) * (hi - mode));
    }
  }
}

/** A mathjs value holding an SI value in the distribution's unit (the nominal or a sample). */
export function valueOf(d: Distribution, si: number): unknown {
  return d.unit === '' ? si : quantityFromSI(si, d.unit);
}

/** The value in the distribution's own unit, for messages, e.g. "-0.02 m^2 / kyr". */
export function describeSample(d: Distribution, si: number): string {
  return describeValue(valueOf(d, si));
}
