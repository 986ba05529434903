/**
 * Pure builder: a dataset's rows → Observable Plot options for the small profile figure on the datasets
 * page (measured points joined by a line; distance across, elevation up). No DOM; unit-testable.
 */
import * as Plot from '@observablehq/plot';

export interface DatasetPlotInput {
  kind: 'slope_profile' | 'long_profile';
  columns: { name: string; unit: string }[];
  rows: number[][];
}

/** At most this many points are drawn; longer profiles are thinned evenly (the last point kept). */
export const MAX_PLOTTED_POINTS = 2000;

export function datasetPlot(dataset: DatasetPlotInput, width: number): { options: Plot.PlotOptions; description: string } {
  const distance = dataset.columns.findIndex((c) => c.name === 'distance');
  const elevation = dataset.columns.findIndex((c) => c.name === 'elevation');
  const step = Math.max(1, Math.ceil(dataset.rows.length / MAX_PLOTTED_POINTS));
  const points: { x: number; y: number }[] = [];
  dataset.rows.forEach((row, i) => {
    if (i % step === 0 || i === dataset.rows.length - 1) points.push({ x: row[distance]!, y: row[elevation]! });
  });
  const xUnit = dataset.columns[distance]?.unit ?? '';
  const yUnit = dataset.columns[elevation]?.unit ?? '';
  const across = dataset.kind === 'long_profile' ? 'Distance downstream' : 'Distance';
  const ys = points.map((p) => p.y);
  const description = `${dataset.kind === 'long_profile' ? 'River long profile' : 'Slope profile'}: elevation from ${Math.min(...ys)} to ${Math.max(...ys)} ${yUnit} over ${dataset.rows.length} points; elevation up.`;
  return {
    description,
    options: {
      width,
      height: Math.round(Math.min(260, Math.max(160, width * 0.4))),
      marginLeft: 56,
      marginBottom: 40,
      style: { fontSize: '12px', background: 'transparent', overflow: 'visible' },
      x: { label: `${across} (${xUnit})`, grid: true, labelAnchor: 'center', labelArrow: 'none' },
      y: { label: `Elevation (${yUnit})`, grid: true, labelAnchor: 'center', labelArrow: 'none' },
      marks: [
        Plot.frame({ stroke: 'currentColor', strokeOpacity: 0.25 }),
        Plot.line(points, { x: 'x', y: 'y', stroke: 'var(--slate)', strokeWidth: 1 }),
        Plot.dot(points, { x: 'x', y: 'y', r: 2, fill: 'var(--river)' }),
      ],
    },
  };
}
