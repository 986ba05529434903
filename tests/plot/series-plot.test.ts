import { describe, expect, it } from 'vitest';
import { geothermPlot, plotForSeries, profilePlot } from '@/lib/plot/series-plot';
import type { SeriesData } from '@/lib/sheet/types';

// A linear conductive geotherm, 10 °C at the surface and 20 K/km (reference case P12's conductive
// gradient, Turcotte & Schubert 2002), sampled every 10 km to 30 km.
const geotherm: SeriesData = {
  x: [0, 10, 20, 30],
  y: [10, 210, 410, 610],
  xLabel: 'Depth',
  yLabel: 'Temperature',
  xUnit: 'km',
  yUnit: 'degC',
};

type MarkWithData = { data?: unknown[] };

describe('geothermPlot', () => {
  it('should put depth on a downward (reversed) vertical axis and temperature across, both labelled with units', () => {
    const { options } = geothermPlot(geotherm, { width: 600 });
    expect(options.y).toMatchObject({ label: 'Depth (km)', reverse: true });
    expect(options.x).toMatchObject({ label: 'Temperature (degC)' });
    expect((options.x as { reverse?: boolean }).reverse).toBeUndefined();
  });

  it('should swap the engine’s depth-as-x series into points of temperature and depth', () => {
    const { options } = geothermPlot(geotherm, { width: 600 });
    const line = (options.marks as MarkWithData[]).find((m) => Array.isArray(m.data) && m.data.length > 1);
    expect(line!.data).toEqual([
      { depth: 0, temperature: 10 },
      { depth: 10, temperature: 210 },
      { depth: 20, temperature: 410 },
      { depth: 30, temperature: 610 },
    ]);
  });

  it('should size the figure from the width and describe it in words', () => {
    const plot = geothermPlot(geotherm, { width: 500 });
    expect(plot.options.width).toBe(500);
    expect(plot.options.height).toBe(300);
    expect(plot.description).toContain('depth increases downward');
    expect(plot.description).toContain('10 to 610 degC');
  });
});

describe('profilePlot', () => {
  it('should keep elevation upward and label both axes with units', () => {
    const series: SeriesData = { x: [-10, 0, 10], y: [-1, 0, 1], xLabel: 'Distance', yLabel: 'Elevation', xUnit: 'm', yUnit: 'm' };
    const { options } = profilePlot(series, { width: 640 });
    expect(options.x).toMatchObject({ label: 'Distance (m)' });
    expect(options.y).toMatchObject({ label: 'Elevation (m)' });
    expect((options.y as { reverse?: boolean }).reverse).toBeUndefined();
  });
});

describe('plotForSeries', () => {
  it('should choose the builder by series name', () => {
    expect(plotForSeries('geotherm', geotherm, { width: 400 }).title).toBe('Geotherm');
    expect(plotForSeries('profile', { ...geotherm, xUnit: 'm', yUnit: 'm' }, { width: 400 }).title).toBe('Scarp profile');
    expect(plotForSeries('other', geotherm, { width: 400 }).title).toBe('other');
  });
});
