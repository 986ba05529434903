import { describe, expect, it } from 'vitest';
import { evaluateSheet } from '@/lib/engine';
import { buildFigure, figureNames, marchFluxPlot, marchRatePlot, reaches, residualPlot, scarpFitPlot } from '@/lib/plot/data-block-plots';
import type { SeriesData } from '@/lib/sheet/types';
import { caseDatasets, dataCase } from '../support/data-cases';

// Figures of the data blocks from the engine's series for the public cases: P41 (scarp fit of
// P06's profile; Hanks et al. 1984), P43 (diffusion of a step; Crank & Nicolson 1947) and P46
// (P10's march; Beaumont et al. 1992), whose signs of dz/dt are erosion on the first three
// reaches and deposition on the last two.

type MarkWithData = { data?: unknown[]; ariaLabel?: string };
/** The data of the marks that draw records (frames and rules carry placeholder data). */
const markData = (marks: unknown) =>
  (marks as MarkWithData[]).map((m) => m.data).filter((d): d is unknown[] => Array.isArray(d) && typeof d[0] === 'object' && d[0] !== null);

function seriesOf(id: string, block: string): Record<string, SeriesData> {
  const c = dataCase(id);
  return evaluateSheet(c.sheet!, { datasets: caseDatasets(c) }).blocks[block]!.series!;
}

describe('scarp_fit figures', () => {
  const series = seriesOf('P41', 'fit');
  it('should combine measured points and the fitted curve, then a residual panel', () => {
    expect(figureNames('scarp_fit', series)).toEqual(['fit', 'residual']);
    const { options, description } = scarpFitPlot(series.measured!, series.fitted!, { width: 600 });
    const data = markData(options.marks);
    expect(data.map((d) => d.length)).toEqual([41, 201]); // 41 dots, 201 fitted points
    expect(data[0]![0]).toEqual({ x: -20, y: 97.223 });
    expect(description).toContain('41 measured points');
    expect(options.y).toMatchObject({ label: 'Elevation (m)' });
  });

  it('should centre the residual panel on zero with a symmetric domain from the largest residual', () => {
    const { options } = residualPlot(series.residual!, { width: 600 });
    const largest = Math.max(...series.residual!.y.map(Math.abs));
    expect(largest).toBeCloseTo(0.0344031002, 4); // P41's largest residual
    expect((options.y as { domain: number[] }).domain).toEqual([-largest * 1.1, largest * 1.1]);
  });

  it('should show only the measured points when the fit failed', () => {
    expect(figureNames('scarp_fit', { measured: series.measured! })).toEqual(['measured']);
  });
});

describe('profile_evolution figure', () => {
  it('should draw the initial and final profiles together', () => {
    const series = seriesOf('P43', 'evo');
    expect(figureNames('profile_evolution', series)).toEqual(['profiles']);
    const { options, description } = buildFigure('profile_evolution', 'profiles', series, { width: 600 });
    const data = markData(options.marks);
    expect(data.map((d) => d.length)).toEqual([241, 241]);
    expect(description).toContain('Initial profile (dashed) and final profile (solid)');
    expect(description).not.toContain('measured');
  });
});

describe('channel_march figures', () => {
  const series = seriesOf('P46', 'march');
  it('should shade eroding and aggrading reaches from the sign of dz/dt (P10: three eroding, two aggrading)', () => {
    const spans = reaches(series.flux!, series.dz_dt!);
    expect(spans.map((r) => r.regime)).toEqual(['erosion', 'erosion', 'erosion', 'deposition', 'deposition']);
    expect(spans[0]).toMatchObject({ x1: 0, x2: 500 });
    const { description, options } = marchFluxPlot(series.capacity!, series.flux!, series.dz_dt!, { width: 700 });
    expect(description).toContain('3 eroding reach(es)');
    expect(description).toContain('2 aggrading reach(es)');
    const data = markData(options.marks);
    // shading (5 reaches), capacity steps (5), flux line and dots (6 rows each)
    expect(data.map((d) => d.length)).toEqual([5, 5, 6, 6]);
    expect(data[1]![1]).toEqual({ x1: 500, x2: 1000, y: 2.4 });
  });

  it('should draw dz/dt as one bar per reach', () => {
    const { options } = marchRatePlot(series.flux!, series.dz_dt!, { width: 700 });
    const bars = markData(options.marks)[0] as Array<{ rate: number; x1: number; x2: number }>;
    expect(bars).toHaveLength(5);
    expect(bars[4]!.rate).toBeCloseTo(0.607421875, 12); // P10's last dz/dt in mm/yr
    expect(figureNames('channel_march', series)).toEqual(['fluxes', 'dz_dt']);
  });
});

describe('other block types', () => {
  it('should keep one figure per series', () => {
    const profile: SeriesData = { x: [0, 1], y: [0, 1], xLabel: 'Distance', yLabel: 'Elevation', xUnit: 'm', yUnit: 'm' };
    expect(figureNames('scarp_forward', { profile })).toEqual(['profile']);
    expect(buildFigure('scarp_forward', 'profile', { profile }, { width: 500 }).title).toBe('Scarp profile');
  });
});
