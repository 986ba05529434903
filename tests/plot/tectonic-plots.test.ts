import { describe, expect, it } from 'vitest';
import { deflectionPlot, plotForSeries, strengthPlot } from '@/lib/plot/series-plot';
import type { SeriesData } from '@/lib/sheet/types';
import { runBlock } from '../support/engine-sheets';

type MarkWithData = { data?: unknown[] };

// Series from the engine for reference cases P25 (Sibson 1974; Gleason & Tullis 1995) and P30
// (Turcotte & Schubert 2002 §3-16), drawn by the pure builders.
const strengthResult = runBlock('strength_envelope', {
  surface_temperature: '10 degC',
  geothermal_gradient: '25 K/km',
  strain_rate: '1e-14/s',
  flow_prefactor: '1.1e-4',
  stress_exponent: '4',
  activation_energy: '223 kJ/mol',
  faulting: '"thrust"',
  max_depth: '30 km',
});
const strength = strengthResult.series!.strength! as SeriesData;
const flexureResult = runBlock('plate_flexure', { line_load: '2e12 N/m', elastic_thickness: '34 km', infill_density: '1000 kg/m^3' });
const deflection = flexureResult.series!.deflection! as SeriesData;

type RuleData = MarkWithData & { data?: unknown[] };
const ruleValues = (marks: unknown) =>
  (marks as RuleData[]).filter((m) => Array.isArray(m.data) && m.data.length === 1 && typeof m.data[0] === 'number').map((m) => m.data![0] as number);

describe('strengthPlot', () => {
  it('should put depth on a downward axis and stress across, labelled with units', () => {
    const { options } = strengthPlot(strength, { width: 600 });
    expect(options.y).toMatchObject({ label: 'Depth (km)', reverse: true });
    expect(options.x).toMatchObject({ label: 'Differential stress (MPa)' });
  });

  it('should mark the transition at the peak of the envelope (P25: 10.83 km, within one 0.15 km sample)', () => {
    const plot = strengthPlot(strength, { width: 600 });
    const marks = plot.options.marks as MarkWithData[];
    const rule = marks.find((m) => Array.isArray(m.data) && m.data.length === 1 && typeof m.data[0] === 'number');
    expect(Math.abs((rule!.data![0] as number) - 10.8323578151)).toBeLessThanOrEqual(0.15);
    expect(plot.description).toContain('brittle–ductile transition');
    expect(plot.description).toContain('depth increasing downward');
  });

  it('should be chosen for a series named strength', () => {
    expect(plotForSeries('strength', strength, { width: 400 }).title).toBe('Strength envelope');
  });
});

describe('marks at the exact outputs', () => {
  it('should mark the P25 transition at 10.8323578151 km when the outputs are given, whatever their display unit', () => {
    const plot = strengthPlot(strength, { width: 600 }, strengthResult.outputs);
    expect(ruleValues(plot.options.marks)[0]).toBeCloseTo(10.8323578151, 9);
    const inMetres = runBlock('strength_envelope', {
      surface_temperature: '10 degC', geothermal_gradient: '25 K/km', strain_rate: '1e-14/s', flow_prefactor: '1.1e-4',
      stress_exponent: '4', activation_energy: '223 kJ/mol', faulting: '"thrust"', max_depth: '30 km',
    }, { brittle_ductile_depth: 'm' });
    expect(ruleValues(strengthPlot(strength, { width: 600 }, inMetres.outputs).options.marks)[0]).toBeCloseTo(10.8323578151, 9);
  });

  it('should mark the P30 forebulge crest at πα = 254.946063018 km when the outputs are given', () => {
    const plot = plotForSeries('deflection', deflection, { width: 600 }, flexureResult.outputs);
    expect(ruleValues(plot.options.marks).find((v) => v !== 0)).toBeCloseTo(254.946063018, 8);
  });
});

describe('deflectionPlot', () => {
  it('should plot deflection positive down against distance, labelled with units', () => {
    const { options } = deflectionPlot(deflection, { width: 600 });
    expect(options.x).toMatchObject({ label: 'Distance from the load (km)' });
    expect(options.y).toMatchObject({ label: 'Deflection, down (m)', reverse: true });
  });

  it('should mark the forebulge crest at πα (P30: 254.95 km, within one 2.55 km sample)', () => {
    const plot = deflectionPlot(deflection, { width: 600 });
    const marks = plot.options.marks as MarkWithData[];
    const rules = marks.filter((m) => Array.isArray(m.data) && m.data.length === 1 && typeof m.data[0] === 'number');
    const crest = rules.map((m) => m.data![0] as number).find((v) => v !== 0)!;
    expect(Math.abs(crest - 254.946063018)).toBeLessThanOrEqual(2.55);
    expect(plot.description).toContain('forebulge crest at about 255 km');
  });

  it('should be chosen for a series named deflection, and the radiogenic geotherm should use the geotherm plot', () => {
    expect(plotForSeries('deflection', deflection, { width: 400 }).title).toBe('Flexure profile');
    const geotherm = runBlock('radiogenic_geotherm', {
      surface_temperature: '8 degC',
      surface_heat_flow: '65 mW/m^2',
      conductivity: '3 W/(m K)',
      heat_production: '2.6 uW/m^3',
      production_depth: '10 km',
    }).series!.geotherm! as SeriesData;
    const plot = plotForSeries('geotherm', geotherm, { width: 400 });
    expect(plot.title).toBe('Geotherm');
    expect(plot.options.y).toMatchObject({ reverse: true });
  });
});
