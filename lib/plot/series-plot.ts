/**
 * Pure builders: a block's series → Observable Plot options (no DOM). The figure component
 * hands the options to Plot.plot; the tests read them as data.
 */
import * as Plot from '@observablehq/plot';
import type { OutputValue, SeriesData } from '@/lib/sheet/types';

/** A block's outputs, for marks placed at exact values (SI values are read, so display units do not matter). */
export type PlotOutputs = Record<string, OutputValue> | undefined;

function siOf(outputs: PlotOutputs, name: string): number | undefined {
  const si = outputs?.[name]?.si;
  return typeof si === 'number' && Number.isFinite(si) ? si : undefined;
}

export interface PlotSize {
  width: number;
  height?: number;
}

export interface SeriesPlot {
  /** A short title for the figure and file names. */
  title: string;
  /** Text for screen readers and the figure caption. */
  description: string;
  options: Plot.PlotOptions;
}

const LINE_COLOUR = 'var(--river)';

const axisLabel = (label: string, unit: string) => (unit ? `${label} (${unit})` : label);

function points(series: SeriesData): { x: number; y: number }[] {
  const n = Math.min(series.x.length, series.y.length);
  return Array.from({ length: n }, (_, i) => ({ x: series.x[i]!, y: series.y[i]! }));
}

function extent(values: number[]): [number, number] {
  let lo = Infinity;
  let hi = -Infinity;
  for (const v of values) {
    if (v < lo) lo = v;
    if (v > hi) hi = v;
  }
  return [lo, hi];
}

/**
 * A geotherm: temperature across, depth down (depth increases downward, as in a borehole log).
 * The engine's series has depth as x and temperature as y, so the axes swap here.
 */
export function geothermPlot(series: SeriesData, size: PlotSize): SeriesPlot {
  const data = points(series).map((p) => ({ depth: p.x, temperature: p.y }));
  const [t0, t1] = extent(series.y);
  const [d0, d1] = extent(series.x);
  return {
    title: 'Geotherm',
    description: `Temperature from ${t0.toFixed(0)} to ${t1.toFixed(0)} ${series.yUnit} over depths ${d0} to ${d1} ${series.xUnit}; depth increases downward.`,
    options: {
      width: size.width,
      height: size.height ?? Math.round(Math.min(420, Math.max(260, size.width * 0.6))),
      marginLeft: 56,
      marginBottom: 42,
      style: { fontSize: '12px', background: 'transparent', overflow: 'visible' },
      x: { label: axisLabel(series.yLabel || 'Temperature', series.yUnit), grid: true, labelAnchor: 'center', labelArrow: 'none' },
      y: { label: axisLabel(series.xLabel || 'Depth', series.xUnit), reverse: true, grid: true, labelAnchor: 'center', labelArrow: 'none' },
      marks: [
        Plot.frame({ stroke: 'currentColor', strokeOpacity: 0.25 }),
        Plot.line(data, { x: 'temperature', y: 'depth', stroke: LINE_COLOUR, strokeWidth: 2, sort: { channel: 'y' } }),
      ],
    },
  };
}

/** A scarp profile: distance across, elevation relative to the midpoint up. */
export function profilePlot(series: SeriesData, size: PlotSize): SeriesPlot {
  const data = points(series).map((p) => ({ distance: p.x, elevation: p.y }));
  const [z0, z1] = extent(series.y);
  return {
    title: 'Scarp profile',
    description: `Elevation from ${z0.toFixed(2)} to ${z1.toFixed(2)} ${series.yUnit} across ${series.x.length} points; elevation up.`,
    options: {
      width: size.width,
      height: size.height ?? Math.round(Math.min(360, Math.max(220, size.width * 0.45))),
      marginLeft: 56,
      marginBottom: 42,
      style: { fontSize: '12px', background: 'transparent', overflow: 'visible' },
      x: { label: axisLabel(series.xLabel || 'Distance', series.xUnit), grid: true, labelAnchor: 'center', labelArrow: 'none' },
      y: { label: axisLabel(series.yLabel || 'Elevation', series.yUnit), grid: true, labelAnchor: 'center', labelArrow: 'none' },
      marks: [
        Plot.frame({ stroke: 'currentColor', strokeOpacity: 0.25 }),
        Plot.ruleY([0], { stroke: 'currentColor', strokeOpacity: 0.35, strokeDasharray: '3,3' }),
        Plot.line(data, { x: 'distance', y: 'elevation', stroke: LINE_COLOUR, strokeWidth: 2 }),
      ],
    },
  };
}

/** The index of the largest (sign 1) or smallest (sign −1) y. */
function extremeIndex(values: number[], sign: 1 | -1): number {
  let best = 0;
  for (let i = 1; i < values.length; i++) if (sign * values[i]! > sign * values[best]!) best = i;
  return best;
}

const MARK_COLOUR = 'var(--ochre)';

/**
 * A strength envelope: differential stress across, depth down. The brittle–ductile transition
 * is the peak of the envelope (the series point of greatest stress), marked with a dashed rule.
 */
export function strengthPlot(series: SeriesData, size: PlotSize, outputs?: PlotOutputs): SeriesPlot {
  const data = points(series).map((p) => ({ depth: p.x, stress: p.y }));
  const depth = siOf(outputs, 'brittle_ductile_depth');
  const stress = siOf(outputs, 'transition_strength');
  // The exact transition when the block's outputs are at hand (series in km and MPa), else the series peak.
  const peak =
    depth !== undefined && stress !== undefined && series.xUnit === 'km' && series.yUnit === 'MPa'
      ? { depth: depth / 1000, stress: stress / 1e6 }
      : (data[extremeIndex(series.y, 1)] ?? { depth: 0, stress: 0 });
  const [d0, d1] = extent(series.x);
  return {
    title: 'Strength envelope',
    description: `Differential stress over depths ${d0} to ${d1} ${series.xUnit}, depth increasing downward; peak ${peak.stress.toFixed(0)} ${series.yUnit} at about ${peak.depth.toFixed(1)} ${series.xUnit}, the brittle–ductile transition.`,
    options: {
      width: size.width,
      height: size.height ?? Math.round(Math.min(420, Math.max(260, size.width * 0.6))),
      marginLeft: 56,
      marginBottom: 42,
      style: { fontSize: '12px', background: 'transparent', overflow: 'visible' },
      x: { label: axisLabel(series.yLabel || 'Differential stress', series.yUnit), grid: true, labelAnchor: 'center', labelArrow: 'none' },
      y: { label: axisLabel(series.xLabel || 'Depth', series.xUnit), reverse: true, grid: true, labelAnchor: 'center', labelArrow: 'none' },
      marks: [
        Plot.frame({ stroke: 'currentColor', strokeOpacity: 0.25 }),
        Plot.ruleY([peak.depth], { stroke: MARK_COLOUR, strokeDasharray: '4,3' }),
        Plot.text([peak], { x: 'stress', y: 'depth', text: () => 'brittle–ductile transition', dy: -8, textAnchor: 'end', fill: 'currentColor' }),
        Plot.line(data, { x: 'stress', y: 'depth', stroke: LINE_COLOUR, strokeWidth: 2, sort: { channel: 'y' } }),
      ],
    },
  };
}

/**
 * A flexure profile: distance from the load across, deflection positive down (so the axis points
 * down and the basin looks like a basin); the forebulge crest (the most negative w) is marked.
 */
export function deflectionPlot(series: SeriesData, size: PlotSize, outputs?: PlotOutputs): SeriesPlot {
  const data = points(series).map((p) => ({ distance: p.x, deflection: p.y }));
  const distance = siOf(outputs, 'forebulge_distance');
  const height = siOf(outputs, 'forebulge_height');
  // The exact crest from the outputs (w is positive down, the height positive up), else the series minimum.
  const crest =
    distance !== undefined && height !== undefined && series.xUnit === 'km' && series.yUnit === 'm'
      ? { distance: distance / 1000, deflection: -height }
      : (data[extremeIndex(series.y, -1)] ?? { distance: 0, deflection: 0 });
  const [w0, w1] = extent(series.y);
  return {
    title: 'Flexure profile',
    description: `Deflection from ${w0.toFixed(1)} to ${w1.toFixed(1)} ${series.yUnit} (positive down) over ${series.x.length} points from the load; forebulge crest at about ${crest.distance.toFixed(0)} ${series.xUnit}.`,
    options: {
      width: size.width,
      height: size.height ?? Math.round(Math.min(360, Math.max(220, size.width * 0.45))),
      marginLeft: 56,
      marginBottom: 42,
      style: { fontSize: '12px', background: 'transparent', overflow: 'visible' },
      x: { label: axisLabel(series.xLabel || 'Distance from the load', series.xUnit), grid: true, labelAnchor: 'center', labelArrow: 'none' },
      y: { label: axisLabel(`${series.yLabel || 'Deflection'}, down`, series.yUnit), reverse: true, grid: true, labelAnchor: 'center', labelArrow: 'none' },
      marks: [
        Plot.frame({ stroke: 'currentColor', strokeOpacity: 0.25 }),
        Plot.ruleY([0], { stroke: 'currentColor', strokeOpacity: 0.35, strokeDasharray: '3,3' }),
        Plot.ruleX([crest.distance], { stroke: MARK_COLOUR, strokeDasharray: '4,3' }),
        Plot.text([crest], { x: 'distance', y: 'deflection', text: () => 'forebulge', dy: -10, fill: 'currentColor' }),
        Plot.line(data, { x: 'distance', y: 'deflection', stroke: LINE_COLOUR, strokeWidth: 2 }),
      ],
    },
  };
}

/** Any other series: x across, y up. */
export function genericSeriesPlot(series: SeriesData, size: PlotSize, title: string): SeriesPlot {
  return {
    title,
    description: `${series.yLabel} against ${series.xLabel}, ${series.x.length} points.`,
    options: {
      width: size.width,
      height: size.height ?? 280,
      marginLeft: 56,
      marginBottom: 42,
      style: { fontSize: '12px', background: 'transparent', overflow: 'visible' },
      x: { label: axisLabel(series.xLabel, series.xUnit), grid: true, labelAnchor: 'center', labelArrow: 'none' },
      y: { label: axisLabel(series.yLabel, series.yUnit), grid: true, labelAnchor: 'center', labelArrow: 'none' },
      marks: [Plot.frame({ stroke: 'currentColor', strokeOpacity: 0.25 }), Plot.line(points(series), { x: 'x', y: 'y', stroke: LINE_COLOUR, strokeWidth: 2 })],
    },
  };
}

/** The builder for a named series of a block result. */
export function plotForSeries(seriesName: string, series: SeriesData, size: PlotSize, outputs?: PlotOutputs): SeriesPlot {
  if (seriesName === 'geotherm') return geothermPlot(series, size);
  if (seriesName === 'profile') return profilePlot(series, size);
  if (seriesName === 'strength') return strengthPlot(series, size, outputs);
  if (seriesName === 'deflection') return deflectionPlot(series, size, outputs);
  return genericSeriesPlot(series, size, seriesName);
}
