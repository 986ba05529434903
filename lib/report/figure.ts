/**
 * Figures of a report as plain vector geometry: the same numbers draw the SVG of the report page and
 * the Svg primitives of the PDF. Pure.
 */
export interface FigureSeries {
  x: number[];
  y: number[];
  xLabel: string;
  yLabel: string;
  xUnit: string;
  yUnit: string;
}

export interface FigureTick {
  /** Position along the axis in figure units. */
  at: number;
  label: string;
}

export interface FigureModel {
  name: string;
  title: string;
  width: number;
  height: number;
  plot: { left: number; top: number; right: number; bottom: number };
  /** "x,y x,y …" in figure units, for an SVG polyline. */
  points: string;
  xTicks: FigureTick[];
  yTicks: FigureTick[];
  xAxisLabel: string;
  yAxisLabel: string;
  /** Depth plotted increasing downward (the geotherm). */
  yDownward: boolean;
  pointCount: number;
}

/** The most points a figure draws (a longer series is thinned evenly, keeping the last point). */
export const MAX_FIGURE_POINTS = 600;

const axisLabel = (label: string, unit: string) => (unit ? `${label} (${unit})` : label);

/** Round tick steps: 1, 2 or 5 times a power of ten, about `count` ticks over [lo, hi]. */
export function niceTicks(lo: number, hi: number, count = 5): number[] {
  if (!Number.isFinite(lo) || !Number.isFinite(hi)) return [];
  if (lo === hi) return [lo];
  const raw = (hi - lo) / count;
  const power = 10 ** Math.floor(Math.log10(raw));
  const step = [1, 2, 5, 10].map((m) => m * power).find((s) => s >= raw) ?? 10 * power;
  const ticks: number[] = [];
  for (let v = Math.ceil(lo / step) * step; v <= hi + step * 1e-9; v += step) ticks.push(Math.abs(v) < step * 1e-9 ? 0 : Number(v.toPrecision(12)));
  return ticks.slice(0, 20);
}

function tickLabel(value: number): string {
  const size = Math.abs(value);
  if (value !== 0 && (size >= 1e5 || size < 1e-3)) return value.toExponential(1);
  return String(Number(value.toPrecision(6)));
}

function thin(x: number[], y: number[]): { x: number[]; y: number[] } {
  const n = Math.min(x.length, y.length);
  if (n <= MAX_FIGURE_POINTS) return { x: x.slice(0, n), y: y.slice(0, n) };
  const k = Math.ceil(n / MAX_FIGURE_POINTS);
  const xs: number[] = [];
  const ys: number[] = [];
  for (let i = 0; i < n; i += k) {
    xs.push(x[i]!);
    ys.push(y[i]!);
  }
  if ((n - 1) % k !== 0) {
    xs.push(x[n - 1]!);
    ys.push(y[n - 1]!);
  }
  return { x: xs, y: ys };
}

function extent(values: number[]): [number, number] {
  let lo = Infinity;
  let hi = -Infinity;
  for (const v of values) {
    if (v < lo) lo = v;
    if (v > hi) hi = v;
  }
  if (lo === hi) return [lo - 1, hi + 1];
  return [lo, hi];
}

/**
 * A line figure of one series. Geotherms are drawn as temperature across and depth down, the usual
 * way to read them (their x is depth); every other series as x across, y up.
 */
export function buildFigure(name: string, series: FigureSeries, options: { width?: number; height?: number } = {}): FigureModel {
  const width = options.width ?? 480;
  const height = options.height ?? 220;
  const plot = { left: 56, top: 10, right: width - 12, bottom: height - 38 };
  const geotherm = name === 'geotherm';
  const thinned = thin(series.x, series.y);
  // Horizontal and vertical data.
  const across = geotherm ? thinned.y : thinned.x;
  const up = geotherm ? thinned.x : thinned.y;
  const acrossLabel = geotherm ? axisLabel(series.yLabel, series.yUnit) : axisLabel(series.xLabel, series.xUnit);
  const upLabel = geotherm ? axisLabel(series.xLabel, series.xUnit) : axisLabel(series.yLabel, series.yUnit);
  const [a0, a1] = extent(across);
  const [u0, u1] = extent(up);
  const ax = (v: number) => plot.left + ((v - a0) / (a1 - a0)) * (plot.right - plot.left);
  // Upward axis: larger values higher, or lower when depth increases downward.
  const uy = (v: number) =>
    geotherm ? plot.top + ((v - u0) / (u1 - u0)) * (plot.bottom - plot.top) : plot.bottom - ((v - u0) / (u1 - u0)) * (plot.bottom - plot.top);
  const points = across.map((v, i) => `${ax(v).toFixed(2)},${uy(up[i]!).toFixed(2)}`).join(' ');
  return {
    name,
    title: `${series.yLabel} against ${series.xLabel}`,
    width,
    height,
    plot,
    points,
    xTicks: niceTicks(a0, a1).map((v) => ({ at: ax(v), label: tickLabel(v) })),
    yTicks: niceTicks(u0, u1, 4).map((v) => ({ at: uy(v), label: tickLabel(v) })),
    xAxisLabel: acrossLabel,
    yAxisLabel: upLabel,
    yDownward: geotherm,
    pointCount: across.length,
  };
}
