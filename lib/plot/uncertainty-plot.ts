/**
 * Pure builders for uncertain outputs (CONTRACT §8.5): the method label, the 95 % interval in
 * words, the Monte Carlo histogram and the sensitivity bars as Observable Plot options (no DOM).
 */
import * as Plot from '@observablehq/plot';
import type { NumericSpreadData, SeriesData, SpreadData } from '@/lib/sheet/types';
import type { PlotSize, SeriesPlot } from './series-plot';

/** Groups of three digits separated by a space: 10000 → "10 000". */
export function groupDigits(n: number): string {
  return String(Math.round(n)).replace(/\B(?=(\d{3})+(?!\d))/g, ' ');
}

/** The label every spread travels with: "Monte Carlo, N = 10 000, seed 7" or the linear one. */
export function methodLabel(spread: Pick<SpreadData, 'method'> & { samples?: number; seed?: number }): string {
  if (spread.method === 'linear') return 'linear (first order), normal approximation';
  return `Monte Carlo, N = ${groupDigits(spread.samples ?? 0)}, seed ${spread.seed ?? 0}`;
}

/** A number to `digits` significant figures, without exponent for ordinary magnitudes. */
export function significant(value: number, digits = 4): string {
  if (!Number.isFinite(value)) return String(value);
  if (value === 0) return '0';
  const magnitude = Math.abs(value);
  if (magnitude >= 1e-3 && magnitude < 1e7) return String(Number(value.toPrecision(digits)));
  return value.toExponential(digits - 1);
}

/** "5.737 – 28.95 kyr (95 %)". */
export function intervalText(spread: NumericSpreadData, unit: string): string | null {
  if (spread.p2_5 === undefined || spread.p97_5 === undefined) return null;
  return `${significant(spread.p2_5)} – ${significant(spread.p97_5)}${unit ? ` ${unit}` : ''} (95 %)`;
}

const BAR = 'var(--river)';
const MARK = 'var(--ochre)';

/** A Monte Carlo histogram: counts per bin, with the nominal value and the 95 % interval marked. */
export function histogramPlot(series: SeriesData, spread: NumericSpreadData, nominal: number, size: PlotSize): SeriesPlot {
  const n = Math.min(series.x.length, series.y.length);
  const width = n > 1 ? series.x[1]! - series.x[0]! : 1;
  const bins = Array.from({ length: n }, (_, i) => ({ x1: series.x[i]! - width / 2, x2: series.x[i]! + width / 2, count: series.y[i]! }));
  const interval: number[] = [];
  if (spread.p2_5 !== undefined) interval.push(spread.p2_5);
  if (spread.p97_5 !== undefined) interval.push(spread.p97_5);
  const unit = series.xUnit;
  const outside = spread.outside ? `; ${spread.outside[0]} samples below and ${spread.outside[1]} above the plotted range` : '';
  return {
    title: 'Distribution of samples',
    description: `Histogram of ${groupDigits(spread.samples ?? 0)} samples of ${series.xLabel} in ${n} bins${unit ? ` (${unit})` : ''}, nominal ${significant(nominal)}, 95 % interval ${intervalText(spread, unit) ?? 'not available'}${outside}.`,
    options: {
      width: size.width,
      height: size.height ?? 180,
      marginLeft: 48,
      marginBottom: 38,
      style: { fontSize: '12px', background: 'transparent', overflow: 'visible' },
      x: { label: unit ? `${series.xLabel} (${unit})` : series.xLabel, labelAnchor: 'center', labelArrow: 'none' },
      y: { label: 'samples', grid: true, labelArrow: 'none' },
      marks: [
        Plot.rectY(bins, { x1: 'x1', x2: 'x2', y: 'count', fill: BAR, fillOpacity: 0.55, inset: 0.5 }),
        Plot.ruleX(interval, { stroke: MARK, strokeWidth: 1.5, strokeDasharray: '4,3' }),
        Plot.ruleX([nominal], { stroke: MARK, strokeWidth: 2 }),
        Plot.ruleY([0]),
      ],
    },
  };
}

/** Inputs by how much they matter: Spearman ρ (Monte Carlo) or share of variance (linear). */
export function sensitivityEntries(spread: NumericSpreadData): Array<{ input: string; value: number }> {
  const source = spread.method === 'linear' ? spread.contributions : spread.sensitivity;
  return Object.entries(source ?? {})
    .map(([input, value]) => ({ input, value }))
    .sort((a, b) => Math.abs(b.value) - Math.abs(a.value) || a.input.localeCompare(b.input));
}

/** Horizontal bars: Spearman ρ in −1…1, or contributions in 0…1, largest first. */
export function sensitivityPlot(spread: NumericSpreadData, size: PlotSize): SeriesPlot {
  const entries = sensitivityEntries(spread);
  const linear = spread.method === 'linear';
  const label = linear ? 'share of the variance' : 'Spearman ρ';
  return {
    title: linear ? 'Contributions' : 'Sensitivity',
    description: `${label} by input: ${entries.map((e) => `${e.input} ${e.value.toFixed(3)}`).join(', ') || 'none'}.`,
    options: {
      width: size.width,
      height: size.height ?? Math.max(60, 26 * entries.length + 40),
      marginLeft: Math.min(200, 12 + 7 * Math.max(4, ...entries.map((e) => e.input.length))),
      marginBottom: 34,
      style: { fontSize: '12px', background: 'transparent', overflow: 'visible' },
      x: { domain: linear ? [0, 1] : [-1, 1], label, grid: true, labelAnchor: 'center', labelArrow: 'none' },
      y: { domain: entries.map((e) => e.input), label: null },
      marks: [
        Plot.barX(entries, { x: 'value', y: 'input', fill: (d: { value: number }) => (d.value < 0 ? 'var(--oxide)' : BAR), fillOpacity: 0.7 }),
        Plot.ruleX([0]),
        Plot.text(entries, { x: 'value', y: 'input', text: (d: { value: number }) => d.value.toFixed(2), dx: 4, textAnchor: 'start', fill: 'currentColor' }),
      ],
    },
  };
}
