/**
 * Figures of the data-driven blocks (pure builders, as series-plot.ts): a block's series are
 * combined into figures — scarp_fit: the measured points with the fitted curve, and a residual
 * panel; profile_evolution: the initial and final profiles (and the measured one); channel_march:
 * capacity and sediment flux with eroding and aggrading reaches shaded, and dz/dt per reach.
 * Other block types keep one figure per series.
 */
import * as Plot from '@observablehq/plot';
import type { SeriesData } from '@/lib/sheet/types';
import { plotForSeries, type PlotOutputs, type PlotSize, type SeriesPlot } from './series-plot';

const LINE = 'var(--river)';
const POINTS = 'var(--basalt)';
const EROSION = 'var(--oxide)';
const DEPOSITION = 'var(--moss)';
const STYLE = { fontSize: '12px', background: 'transparent', overflow: 'visible' } as const;
const AXIS = { grid: true, labelAnchor: 'center', labelArrow: 'none' } as const;

const label = (text: string, unit: string) => (unit ? `${text} (${unit})` : text);

function pointsOf(series: SeriesData): { x: number; y: number }[] {
  const n = Math.min(series.x.length, series.y.length);
  return Array.from({ length: n }, (_, i) => ({ x: series.x[i]!, y: series.y[i]! }));
}

const defaultHeight = (size: PlotSize, ratio: number, lo: number, hi: number) => size.height ?? Math.round(Math.min(hi, Math.max(lo, size.width * ratio)));

/** Measured points and the fitted erf curve. */
export function scarpFitPlot(measured: SeriesData, fitted: SeriesData, size: PlotSize): SeriesPlot {
  return {
    title: 'Scarp fit',
    description: `${measured.x.length} measured points (dots) and the fitted erf model (line), elevation in ${measured.yUnit} against distance in ${measured.xUnit}.`,
    options: {
      width: size.width,
      height: defaultHeight(size, 0.45, 240, 380),
      marginLeft: 60,
      marginBottom: 42,
      style: STYLE,
      x: { label: label('Distance', measured.xUnit), ...AXIS },
      y: { label: label('Elevation', measured.yUnit), ...AXIS },
      marks: [
        Plot.frame({ stroke: 'currentColor', strokeOpacity: 0.25 }),
        Plot.dot(pointsOf(measured), { x: 'x', y: 'y', r: 2.2, fill: POINTS, fillOpacity: 0.75 }),
        Plot.line(pointsOf(fitted), { x: 'x', y: 'y', stroke: LINE, strokeWidth: 2 }),
      ],
    },
  };
}

/** Residuals z_obs − model against distance, around a zero line. */
export function residualPlot(residual: SeriesData, size: PlotSize): SeriesPlot {
  const largest = residual.y.reduce((m, v) => Math.max(m, Math.abs(v)), 0);
  return {
    title: 'Residuals',
    description: `Residuals of ${residual.x.length} points, largest ${largest.toPrecision(2)} ${residual.yUnit}.`,
    options: {
      width: size.width,
      height: size.height ?? 150,
      marginLeft: 60,
      marginBottom: 42,
      style: STYLE,
      x: { label: label('Distance', residual.xUnit), ...AXIS },
      y: { label: label('Residual', residual.yUnit), ...AXIS, domain: largest > 0 ? [-largest * 1.1, largest * 1.1] : [-1, 1] },
      marks: [
        Plot.frame({ stroke: 'currentColor', strokeOpacity: 0.25 }),
        Plot.ruleY([0], { stroke: 'currentColor', strokeOpacity: 0.45 }),
        Plot.ruleX(pointsOf(residual), { x: 'x', y1: 0, y2: 'y', stroke: LINE, strokeOpacity: 0.5 }),
        Plot.dot(pointsOf(residual), { x: 'x', y: 'y', r: 2, fill: LINE }),
      ],
    },
  };
}

/** Initial (dashed) and final (solid) profiles, with the measured points when there are any. */
export function evolutionPlot(initial: SeriesData, final: SeriesData, measured: SeriesData | undefined, size: PlotSize): SeriesPlot {
  const marks: Plot.Markish[] = [
    Plot.frame({ stroke: 'currentColor', strokeOpacity: 0.25 }),
    Plot.line(pointsOf(initial), { x: 'x', y: 'y', stroke: 'currentColor', strokeOpacity: 0.55, strokeDasharray: '4,3', strokeWidth: 1.5 }),
    Plot.line(pointsOf(final), { x: 'x', y: 'y', stroke: LINE, strokeWidth: 2 }),
  ];
  if (measured) marks.push(Plot.dot(pointsOf(measured), { x: 'x', y: 'y', r: 2, fill: POINTS, fillOpacity: 0.7 }));
  return {
    title: 'Profile evolution',
    description: `Initial profile (dashed) and final profile (solid)${measured ? ` with ${measured.x.length} measured points (dots)` : ''}, elevation in ${final.yUnit} against distance in ${final.xUnit}.`,
    options: {
      width: size.width,
      height: defaultHeight(size, 0.45, 240, 380),
      marginLeft: 60,
      marginBottom: 42,
      style: STYLE,
      x: { label: label('Distance', final.xUnit), ...AXIS },
      y: { label: label('Elevation', final.yUnit), ...AXIS },
      marks,
    },
  };
}

export interface Reach {
  x1: number;
  x2: number;
  regime: 'erosion' | 'deposition' | 'equilibrium';
}

/** Reach i runs from flux.x[i] to flux.x[i + 1]; its regime is the sign of dz/dt_i. */
export function reaches(flux: SeriesData, dzdt: SeriesData): Reach[] {
  return dzdt.y.map((rate, i) => ({
    x1: flux.x[i]!,
    x2: flux.x[i + 1]!,
    regime: rate < 0 ? 'erosion' : rate > 0 ? 'deposition' : 'equilibrium',
  }));
}

/** Capacity (steps, one value per reach) and sediment flux (line), eroding and aggrading reaches shaded. */
export function marchFluxPlot(capacity: SeriesData, flux: SeriesData, dzdt: SeriesData, size: PlotSize): SeriesPlot {
  const spans = reaches(flux, dzdt);
  const eroding = spans.filter((r) => r.regime === 'erosion').length;
  const aggrading = spans.filter((r) => r.regime === 'deposition').length;
  const steps = spans.map((span, i) => ({ x1: span.x1, x2: span.x2, y: capacity.y[i]! }));
  return {
    title: 'Capacity and sediment flux',
    description: `Transport capacity per reach (steps) and sediment flux (line) in ${flux.yUnit} downstream; ${eroding} eroding reach(es) shaded red, ${aggrading} aggrading reach(es) shaded green.`,
    options: {
      width: size.width,
      height: defaultHeight(size, 0.42, 240, 360),
      marginLeft: 60,
      marginBottom: 42,
      style: STYLE,
      x: { label: label('Distance downstream', flux.xUnit), ...AXIS },
      y: { label: label('Flux per unit width', flux.yUnit), ...AXIS },
      marks: [
        Plot.rectY(spans.filter((r) => r.regime !== 'equilibrium'), {
          x1: 'x1',
          x2: 'x2',
          y1: 0,
          y2: () => Math.max(...capacity.y, ...flux.y),
          fill: (r: Reach) => (r.regime === 'erosion' ? EROSION : DEPOSITION),
          fillOpacity: 0.1,
        }),
        Plot.frame({ stroke: 'currentColor', strokeOpacity: 0.25 }),
        Plot.ruleY([0], { stroke: 'currentColor', strokeOpacity: 0.35 }),
        Plot.link(steps, { x1: 'x1', x2: 'x2', y1: 'y', y2: 'y', stroke: 'currentColor', strokeOpacity: 0.7, strokeWidth: 1.5 }),
        Plot.line(pointsOf(flux), { x: 'x', y: 'y', stroke: LINE, strokeWidth: 2 }),
        Plot.dot(pointsOf(flux), { x: 'x', y: 'y', r: 2, fill: LINE }),
      ],
    },
  };
}

/** dz/dt per reach as bars: down (red) is erosion, up (green) is deposition. */
export function marchRatePlot(flux: SeriesData, dzdt: SeriesData, size: PlotSize): SeriesPlot {
  const bars = reaches(flux, dzdt).map((span, i) => ({ ...span, rate: dzdt.y[i]! }));
  return {
    title: 'Bed change per reach',
    description: `dz/dt in ${dzdt.yUnit} for ${bars.length} reach(es): bars below zero (red) erode, above zero (green) aggrade.`,
    options: {
      width: size.width,
      height: size.height ?? 200,
      marginLeft: 60,
      marginBottom: 42,
      style: STYLE,
      x: { label: label('Distance downstream', dzdt.xUnit), ...AXIS },
      y: { label: label('dz/dt', dzdt.yUnit), ...AXIS },
      marks: [
        Plot.frame({ stroke: 'currentColor', strokeOpacity: 0.25 }),
        Plot.rectY(bars, { x1: 'x1', x2: 'x2', y1: 0, y2: 'rate', fill: (b: Reach) => (b.regime === 'erosion' ? EROSION : DEPOSITION), fillOpacity: 0.7, inset: 0.5 }),
        Plot.ruleY([0], { stroke: 'currentColor', strokeOpacity: 0.6 }),
      ],
    },
  };
}

/** The figures a block's series make, in order (names for file names and keys). */
export function figureNames(blockType: string, series: Record<string, SeriesData>): string[] {
  const has = (name: string) => name in series;
  if (blockType === 'scarp_fit' && has('fitted') && has('measured')) return ['fit', ...(has('residual') ? ['residual'] : [])];
  if (blockType === 'profile_evolution' && has('initial') && has('final')) return ['profiles'];
  if (blockType === 'channel_march' && has('capacity') && has('flux') && has('dz_dt')) return ['fluxes', 'dz_dt'];
  return Object.keys(series);
}

/** Builds one figure named by figureNames. */
export function buildFigure(blockType: string, name: string, series: Record<string, SeriesData>, size: PlotSize, outputs?: PlotOutputs): SeriesPlot {
  if (blockType === 'scarp_fit' && name === 'fit') return scarpFitPlot(series.measured!, series.fitted!, size);
  if (blockType === 'scarp_fit' && name === 'residual') return residualPlot(series.residual!, size);
  if (blockType === 'profile_evolution' && name === 'profiles') return evolutionPlot(series.initial!, series.final!, series.measured, size);
  if (blockType === 'channel_march' && name === 'fluxes') return marchFluxPlot(series.capacity!, series.flux!, series.dz_dt!, size);
  if (blockType === 'channel_march' && name === 'dz_dt' && series.flux) return marchRatePlot(series.flux, series.dz_dt!, size);
  return plotForSeries(name, series[name]!, size, outputs);
}
