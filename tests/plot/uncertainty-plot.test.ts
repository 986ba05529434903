import { describe, expect, it } from 'vitest';
import { evaluateSheet, type NumericSpread } from '@/lib/engine';
import { groupDigits, histogramPlot, intervalText, methodLabel, sensitivityEntries, sensitivityPlot } from '@/lib/plot/uncertainty-plot';
import type { SeriesData } from '@/lib/sheet/types';
import { caseSheet } from '../engine/uncertainty/cases';

type MarkWithData = { data?: unknown[] };

describe('methodLabel (CONTRACT §8.5 labels)', () => {
  it('should label Monte Carlo spreads with N and the seed, and linear ones with their approximation', () => {
    expect(methodLabel({ method: 'monte_carlo', samples: 10000, seed: 7 })).toBe('Monte Carlo, N = 10 000, seed 7');
    expect(methodLabel({ method: 'monte_carlo', samples: 100000, seed: 4294967295 })).toBe('Monte Carlo, N = 100 000, seed 4294967295');
    expect(methodLabel({ method: 'linear' })).toBe('linear (first order), normal approximation');
    expect(groupDigits(500)).toBe('500');
  });
});

describe('histogramPlot and sensitivityPlot on P48 (lognormal K through scarp_age)', () => {
  const results = evaluateSheet(caseSheet('P48'));
  const age = results.blocks.age!;
  const spread = age.outputs.age!.spread as NumericSpread;
  const series = age.series!.hist_age! as SeriesData;

  it('should draw 40 bins of the engine’s counts, edges half a bin around each centre', () => {
    const { options, description } = histogramPlot(series, spread, age.outputs.age!.value as number, { width: 500 });
    const bars = (options.marks as MarkWithData[]).find((m) => Array.isArray(m.data) && m.data.length === 40)!;
    const first = bars.data![0] as { x1: number; x2: number; count: number };
    expect(first.count).toBe(series.y[0]);
    expect(first.x2 - first.x1).toBeCloseTo(series.x[1]! - series.x[0]!, 12);
    expect((first.x1 + first.x2) / 2).toBeCloseTo(series.x[0]!, 12);
    expect(options.x).toMatchObject({ label: 'Age t (kyr)' });
    expect(description).toContain('10 000 samples');
    expect(description).toContain('50 samples below and 50 above');
  });

  it('should state the interval in the display unit', () => {
    expect(intervalText(spread, 'kyr')).toBe('5.737 – 28.95 kyr (95 %)');
  });

  it('should order inputs by |ρ| and span −1…1 for Monte Carlo, 0…1 for linear contributions', () => {
    const mc = sensitivityPlot(spread, { width: 400 });
    expect(mc.options.x).toMatchObject({ domain: [-1, 1] });
    expect(sensitivityEntries(spread)).toEqual([{ input: 'age.diffusivity', value: -1 }]);
    const linear = evaluateSheet(caseSheet('P52')).blocks.total!.outputs.value!.spread as NumericSpread;
    const entries = sensitivityEntries(linear);
    expect(entries.map((e) => e.input)).toEqual(['q.A', 'q.B']);
    expect(entries[0]!.value).toBeCloseTo(0.64, 9);
    expect(sensitivityPlot(linear, { width: 400 }).options.x).toMatchObject({ domain: [0, 1] });
  });
});
