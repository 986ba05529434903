/**
 * The density of a declared input distribution (CONTRACT §8.1), for the small sketch beside an uncertain
 * input, and the same distribution described in words. Pure and client-safe (no mathjs): it works on the
 * parameters the results echo (`results.uncertainty.inputs[i].parameters`), in SI, and shows numbers in the
 * unit of the first parameter. Densities and quantiles are the textbook closed forms (common practice;
 * e.g. Forbes, Evans, Hastings & Peacock, Statistical Distributions, 4th ed., 2011); the standard normal
 * quantile is @stdlib's.
 */
import normalQuantile from '@stdlib/stats-base-dists-normal-quantile';

export type DistributionKind = 'normal' | 'lognormal' | 'uniform' | 'triangular';

export interface EchoParameter {
  value: number | string;
  unit: string;
  si: number | string;
  siUnit: string;
}

export interface DensitySketch {
  kind: DistributionKind;
  /** Points of the density over the central 99.8 % (or the whole support), x in the display unit. */
  x: number[];
  y: number[];
  unit: string;
  median: number;
  lo95: number;
  hi95: number;
  /** One or two sentences for screen readers and the caption. */
  description: string;
}

const POINTS = 81;
const SQRT_2PI = Math.sqrt(2 * Math.PI);

const fmt = (v: number) => {
  if (!Number.isFinite(v)) return String(v);
  if (v === 0) return '0';
  const size = Math.abs(v);
  if (size >= 1e6 || size < 1e-3) return v.toExponential(2).replace(/\.?0+e/, 'e');
  return String(Number(v.toPrecision(3)));
};

const num = (p: EchoParameter | undefined): number | null => (p && typeof p.si === 'number' && Number.isFinite(p.si) ? p.si : null);

/** SI to the display unit of the first parameter (a plain scale; a temperature's offset is kept apart). */
function scaleOf(first: EchoParameter): { toShown: (si: number) => number; unit: string } {
  const value = typeof first.value === 'number' ? first.value : NaN;
  const si = typeof first.si === 'number' ? first.si : NaN;
  // degC and degF carry an offset: show those in SI (K), where a difference is a plain difference.
  if (/deg[CF]/.test(first.unit) || !Number.isFinite(value) || !Number.isFinite(si) || si === 0 || value === 0) {
    return { toShown: (v) => v, unit: first.siUnit };
  }
  const factor = value / si;
  return { toShown: (v) => v * factor, unit: first.unit };
}

/** The sketch of one declared distribution, or null when its parameters are not usable numbers. */
export function densitySketch(kind: string, parameters: Record<string, EchoParameter>): DensitySketch | null {
  const ordered = Object.values(parameters);
  if (!ordered.length) return null;
  let quantile: (p: number) => number;
  let density: (x: number) => number;
  let lo: number;
  let hi: number;
  let shape = '';
  let first: EchoParameter;
  switch (kind) {
    case 'normal': {
      const mean = num(parameters.mean);
      const sd = num(parameters.sd);
      if (mean === null || sd === null || !(sd > 0)) return null;
      first = parameters.mean!;
      quantile = (p) => mean + sd * normalQuantile(p, 0, 1);
      density = (x) => Math.exp(-0.5 * ((x - mean) / sd) ** 2) / (sd * SQRT_2PI);
      lo = quantile(0.001);
      hi = quantile(0.999);
      shape = 'symmetric about the mean';
      break;
    }
    case 'lognormal': {
      const median = num(parameters.median);
      const factor = num(parameters.factor);
      if (median === null || factor === null || !(median > 0) || !(factor > 1)) return null;
      first = parameters.median!;
      const s = Math.log(factor);
      const mu = Math.log(median);
      quantile = (p) => Math.exp(mu + s * normalQuantile(p, 0, 1));
      density = (x) => (x <= 0 ? 0 : Math.exp(-0.5 * ((Math.log(x) - mu) / s) ** 2) / (x * s * SQRT_2PI));
      lo = quantile(0.001);
      hi = quantile(0.999);
      shape = `skewed to the right: 68 % of values lie within a factor ${fmt(factor)} of the median, and none are negative`;
      break;
    }
    case 'uniform': {
      const a = num(parameters.lo);
      const b = num(parameters.hi);
      if (a === null || b === null || !(b > a)) return null;
      first = parameters.lo!;
      quantile = (p) => a + (b - a) * p;
      density = (x) => (x >= a && x <= b ? 1 / (b - a) : 0);
      lo = a;
      hi = b;
      shape = 'every value between the limits equally likely';
      break;
    }
    case 'triangular': {
      const a = num(parameters.lo);
      const c = num(parameters.mode);
      const b = num(parameters.hi);
      if (a === null || b === null || c === null || !(b > a) || c < a || c > b) return null;
      first = parameters.lo!;
      const fc = (c - a) / (b - a);
      quantile = (p) => (p < fc ? a + Math.sqrt(p * (b - a) * (c - a)) : b - Math.sqrt((1 - p) * (b - a) * (b - c)));
      density = (x) => (x < a || x > b ? 0 : x < c ? (2 * (x - a)) / ((b - a) * (c - a)) : x > c ? (2 * (b - x)) / ((b - a) * (b - c)) : 2 / (b - a));
      lo = a;
      hi = b;
      shape = `most likely near ${'{mode}'}, falling to zero at the limits`;
      break;
    }
    default:
      return null;
  }
  const { toShown, unit } = scaleOf(first);
  const x: number[] = [];
  const y: number[] = [];
  for (let i = 0; i < POINTS; i++) {
    const si = lo + ((hi - lo) * i) / (POINTS - 1);
    x.push(toShown(si));
    // The density per shown unit: divide by the scale so the area stays 1.
    y.push(density(si) / Math.abs(toShown(1) - toShown(0) || 1));
  }
  const median = toShown(quantile(0.5));
  const lo95 = toShown(quantile(0.025));
  const hi95 = toShown(quantile(0.975));
  const u = unit ? ` ${unit}` : '';
  const modeText = kind === 'triangular' ? `${fmt(toShown(num(parameters.mode)!))}${u}` : '';
  const title = kind.charAt(0).toUpperCase() + kind.slice(1);
  const description =
    `${title} distribution: median ${fmt(median)}${u}; 95 % of values between ${fmt(lo95)} and ${fmt(hi95)}${u}; ` +
    `${shape.replace('{mode}', modeText)}.`;
  return { kind: kind as DistributionKind, x, y, unit, median, lo95, hi95, description };
}

/** SVG path data of a sketch, in a box of the given size (y up, filled to the base line). */
export function sketchPath(sketch: DensitySketch, width: number, height: number, pad = 2): { line: string; area: string; at: (x: number) => number } {
  const x0 = sketch.x[0]!;
  const x1 = sketch.x[sketch.x.length - 1]!;
  const top = Math.max(...sketch.y) || 1;
  const sx = (x: number) => pad + ((x - x0) / (x1 - x0 || 1)) * (width - 2 * pad);
  const sy = (y: number) => height - pad - (y / top) * (height - 2 * pad);
  const points = sketch.x.map((x, i) => `${sx(x).toFixed(1)},${sy(sketch.y[i]!).toFixed(1)}`);
  const line = `M${points.join('L')}`;
  const area = `${line}L${sx(x1).toFixed(1)},${(height - pad).toFixed(1)}L${sx(x0).toFixed(1)},${(height - pad).toFixed(1)}Z`;
  return { line, area, at: sx };
}

const DISTRIBUTION_ARGUMENTS: Record<DistributionKind, string[]> = {
  normal: ['mean', 'sd'],
  lognormal: ['median', 'factor'],
  uniform: ['lo', 'hi'],
  triangular: ['lo', 'mode', 'hi'],
};
const NUMBER = /^([+-]?(?:\d+(?:\.\d*)?|\.\d+)(?:e[+-]?\d+)?)\s*(.*)$/i;

/**
 * A distribution written as an input's whole expression with plain numbers and one unit, as the sheet page
 * sees it while the user types (`lognormal(1.1 m^2/kyr, 1.5)`, `normal(10 degC, 2 degC)`), read without the
 * engine: the parameters in the written unit. Anything else (references to other blocks, arithmetic, mixed
 * units) gives null and no sketch; the engine's results remain the authority.
 */
export function parseDistributionText(text: string): { kind: DistributionKind; parameters: Record<string, EchoParameter> } | null {
  if (text.length > 300) return null;
  const call = /^\s*(normal|lognormal|uniform|triangular)\s*\(([^()]*)\)\s*$/.exec(text);
  if (!call) return null;
  const kind = call[1] as DistributionKind;
  const args = call[2]!.split(',').map((a) => a.trim());
  const names = DISTRIBUTION_ARGUMENTS[kind];
  if (args.length !== names.length) return null;
  const parameters: Record<string, EchoParameter> = {};
  let unit: string | null = null;
  for (let i = 0; i < args.length; i++) {
    const match = NUMBER.exec(args[i]!);
    if (!match) return null;
    const value = Number(match[1]);
    const written = match[2]!.replace(/\s+/g, ' ').trim();
    if (!Number.isFinite(value)) return null;
    if (kind === 'lognormal' && names[i] === 'factor') {
      if (written !== '') return null;
      parameters.factor = { value, unit: '', si: value, siUnit: '' };
      continue;
    }
    if (unit === null) unit = written;
    else if (written !== unit) return null;
    parameters[names[i]!] = { value, unit: written, si: value, siUnit: written };
  }
  return { kind, parameters };
}
