/**
 * The spread of one sampled output: Monte Carlo statistics, histogram and rank sensitivities, or the
 * first-order (linear) interval and each input's share of the variance; in the output's display unit.
 */
import { EngineError } from '../errors';
import { formatFromSI, unitTemplate, type FormattedOutput } from '../unit-format';
import type { NumericSpread, SpreadStatistics, UncertaintyPlan, UncertaintySettings } from './plan';
import { averageRanks, histogram, mean, quantileSorted, sortedCopy, spearmanFromRanks, standardDeviation } from './statistics';
import { normalQuantile } from './stream';

/** The value of an output in its display unit, from SI. */
function displayConverter(unit: string): { value(si: number): number; difference(si: number): number } {
  if (unit === '') return { value: (si) => si, difference: (si) => si };
  const template = unitTemplate(unit);
  const value = (si: number): number => formatFromSI(si, unit).value as number;
  if (template && template.noOffset) return { value, difference: value };
  return { value, difference: (si) => value(si) - value(0) };
}

const Z = {
  p2_5: normalQuantile(0.025),
  p16: normalQuantile(0.16),
  p84: normalQuantile(0.84),
  p97_5: normalQuantile(0.975),
};

export function constant(column: Float64Array): boolean {
  const first = column[0];
  for (let k = 1; k < column.length; k++) if (column[k] !== first) return false;
  return true;
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

export function monteCarloSpread(
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

export function linearSpread(
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
