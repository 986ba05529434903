import canonicalize from 'canonicalize';
import { describe, expect, it } from 'vitest';
import {
  evaluateQuick,
  evaluateSheet,
  evaluateSheetIncremental,
  hashSheetDocument,
  parseSheetDocument,
  hashDataset,
  type DatasetCanonical,
  type NumericSpread,
  type SheetDocument,
  type TextSpread,
} from '@/lib/engine';
import { canonicalSheetJson } from '@/lib/engine/document';
import { normalQuantile, streamUniforms } from '@/lib/engine/uncertainty/stream';
import { isClose } from '../../support/approx';
import { caseSheet } from './cases';

function doc(blocks: SheetDocument['blocks'], uncertainty?: SheetDocument['uncertainty']): SheetDocument {
  const d: SheetDocument = { format: 'denudata-sheet@1', title: 'Uncertainty test', blocks };
  if (uncertainty) d.uncertainty = uncertainty;
  return d;
}

function spreadOf(d: SheetDocument, block: string, output: string): NumericSpread {
  const result = evaluateSheet(d).blocks[block]!;
  expect(result.status, result.error).toBe('ok');
  const spread = result.outputs[output]!.spread;
  expect(spread).toBeDefined();
  return spread as NumericSpread;
}

const scarp = (diffusivity: string) => ({
  id: 'blk-age',
  name: 'age',
  type: 'scarp_age',
  inputs: { vertical_offset: '4 m', far_field_slope: '0.05', max_slope: '20 deg', diffusivity },
});

describe('reproducibility (CONTRACT §8.6)', () => {
  it('should give bit-identical results for the same document twice', () => {
    const a = evaluateSheet(caseSheet('P49'));
    const b = evaluateSheet(caseSheet('P49'));
    expect(JSON.stringify(a)).toBe(JSON.stringify(b));
  });

  it('should leave every other input’s samples unchanged when a distribution is added (one stream per input)', () => {
    const withBoth = caseSheet('P49');
    const onlyA = structuredClone(withBoth);
    onlyA.blocks[0]!.inputs.B = '5 m';
    const more = structuredClone(withBoth);
    more.blocks.push({ id: 'blk-extra', name: 'extra', type: 'quantities', inputs: { C: 'uniform(1 m, 2 m)' } });
    const a = spreadOf(withBoth, 'q', 'A');
    expect(spreadOf(onlyA, 'q', 'A')).toEqual(a);
    expect(spreadOf(more, 'q', 'A')).toEqual(a);
    // B is certain now, so it has no spread and the total follows A alone (Spearman exactly 1).
    expect(evaluateSheet(onlyA).blocks.q!.outputs.B!.spread).toBeUndefined();
    expect(spreadOf(onlyA, 'total', 'value').sensitivity).toEqual({ 'q.A': 1 });
  });

  it('should change the samples with the seed, and keep the nominal value', () => {
    const seven = caseSheet('P48');
    const eight = structuredClone(seven);
    eight.uncertainty!.seed = 8;
    expect(spreadOf(eight, 'age', 'age').mean).not.toBe(spreadOf(seven, 'age', 'age').mean);
    expect(evaluateSheet(eight).blocks.age!.outputs.age!.value).toBe(evaluateSheet(seven).blocks.age!.outputs.age!.value);
  });

  it('should evaluate an uncertain sheet in full on an incremental request (settings change every sample)', () => {
    const seven = caseSheet('P48');
    const first = evaluateSheet(seven);
    const eight = structuredClone(seven);
    eight.uncertainty!.seed = 8;
    const again = evaluateSheetIncremental(eight, first, []);
    expect(again.results.blocks.age!.outputs.age!.spread).toEqual(evaluateSheet(eight).blocks.age!.outputs.age!.spread);
  });
});

describe('failing samples (CONTRACT §8.3)', () => {
  it('should make the block an error naming the first failing sample of a normal diffusivity that crosses zero', () => {
    const d = doc(
      [scarp('normal(0.05 m^2/kyr, 0.05 m^2/kyr)'), { id: 'blk-next', name: 'next', type: 'formula', inputs: { expr: 'age.age * 2' } }],
      { samples: 1000, seed: 5 },
    );
    const results = evaluateSheet(d);
    // The first sample of the stream below zero (mean + sd·z < 0 when z < −1), 1-based.
    const u = streamUniforms(5, 'blk-age', 'diffusivity', 1000);
    const first = u.findIndex((p) => 0.05 + 0.05 * normalQuantile(p) < 0) + 1;
    expect(first).toBeGreaterThan(0);
    expect(results.blocks.age!.status).toBe('error');
    expect(results.blocks.age!.error).toMatch(
      new RegExp(`^block "age", sample ${first} of 1000 \\(diffusivity = -[0-9.e-]+ m\\^2 / kyr\\): diffusivity: must be > 0, got -`),
    );
    expect(results.blocks.next!.status).toBe('blocked');
    expect(results.blocks.next!.error).toContain('waiting on block "age"');
  });

  it('should pass with a lognormal diffusivity of the same median (positive by construction)', () => {
    const results = evaluateSheet(doc([scarp('lognormal(0.05 m^2/kyr, 2)')], { samples: 1000 }));
    expect(results.blocks.age!.status).toBe('ok');
  });
});

describe('first-order propagation against Monte Carlo (JCGM 100:2008 §5.1; JCGM 101:2008)', () => {
  it('should agree for a linear relation (P49/P52: sd 0.5 m within 5 standard errors)', () => {
    const monteCarlo = spreadOf(caseSheet('P49'), 'total', 'value');
    const linear = spreadOf(caseSheet('P52'), 'total', 'value');
    expect(isClose(linear.sd, 0.5, 1e-9)).toBe(true);
    expect(Math.abs(monteCarlo.sd - linear.sd)).toBeLessThan(5 * 0.0071 * 0.5);
    expect(Math.abs(monteCarlo.p97_5 - linear.p97_5)).toBeLessThan(5 * 0.027 * 0.5);
    expect(linear.contributions!['q.A']! + linear.contributions!['q.B']!).toBeCloseTo(1, 12);
  });

  it('should carry a temperature spread as a difference: T(z) of the advected geotherm has sd 2(1 − F) K (FORMULAS §17.3, §3)', () => {
    const geotherm = (method: 'linear' | 'monte_carlo') =>
      doc(
        [{
          id: 'blk-g', name: 'geo', type: 'advective_geotherm',
          inputs: {
            velocity: '1 mm/yr', thickness: '30 km', diffusivity: '1e-6 m^2/s',
            surface_temperature: 'normal(10 degC, 2 degC)', base_temperature: '610 degC', depth: '10 km',
          },
        }],
        { method, samples: 10000, seed: 3 },
      );
    const pe = ((1e-3 / (365.25 * 86400)) * 30e3) / 1e-6;
    const f = -Math.expm1((-pe * 10) / 30) / -Math.expm1(-pe);
    const result = evaluateSheet(geotherm('linear')).blocks.geo!;
    expect(result.outputs.temperature_at_depth!.unit).toBe('degC');
    const linear = result.outputs.temperature_at_depth!.spread as NumericSpread;
    expect(isClose(linear.sd, 2 * (1 - f), 1e-7)).toBe(true);
    expect(isClose(linear.si.sd, 2 * (1 - f), 1e-7)).toBe(true);
    expect(isClose(linear.mean, result.outputs.temperature_at_depth!.value as number, 1e-12)).toBe(true);
    const monteCarlo = spreadOf(geotherm('monte_carlo'), 'geo', 'temperature_at_depth');
    expect(Math.abs(monteCarlo.sd - 2 * (1 - f))).toBeLessThan(5 * 0.0071 * 2 * (1 - f));
    // The surface temperature's own spread is shown in degC: mean near 10, sd near 2 (not 275 K).
    expect(Math.abs(monteCarlo.mean - (result.outputs.temperature_at_depth!.value as number))).toBeLessThan(5 * 0.01 * 2);
  });
});

describe('text outputs and warnings over samples', () => {
  it('should count every regime label, zeros included, binomially as FORMULAS §17.3 gives', () => {
    // Pe = v·L/κ ≥ 1 when v ≥ v* = κ/L; v ~ triangular(0.5, 1, 1.5) mm/yr, P(v ≥ v*) = (hi − v*)²/((hi − lo)(hi − c)).
    const d = doc(
      [{ id: 'blk-pe', name: 'pe', type: 'peclet_number', inputs: { velocity: 'triangular(0.5 mm/yr, 1 mm/yr, 1.5 mm/yr)', length: '30 km', diffusivity: '1e-6 m^2/s' } }],
      { samples: 10000, seed: 9 },
    );
    const spread = evaluateSheet(d).blocks.pe!.outputs.regime!.spread as TextSpread;
    const vStar = (1e-6 / 30e3) * 365.25 * 86400 * 1000; // mm/yr
    const p = (1.5 - vStar) ** 2 / (1 * 0.5);
    expect(spread.method).toBe('monte_carlo');
    expect(Object.keys(spread.counts).sort()).toEqual(['advection', 'conduction', 'transitional']);
    expect(spread.counts.conduction).toBe(0);
    expect(spread.counts.advection! + spread.counts.transitional!).toBe(10000);
    expect(Math.abs(spread.counts.advection! - 10000 * p)).toBeLessThan(5 * Math.sqrt(10000 * p * (1 - p)));
  });

  it('should aggregate warnings raised in samples with their count', () => {
    // age = Kt/K < 1 kyr when K > Kt/(1 kyr) = 12.916 m^2/kyr; K ~ lognormal(5, 3): P = 1 − Φ(ln(12.916/5)/ln 3).
    const results = evaluateSheet(doc([scarp('lognormal(5 m^2/kyr, 3)')], { samples: 10000, seed: 2 }));
    const line = results.blocks.age!.warnings.find((w) => w.startsWith('in '));
    expect(line).toMatch(/^in \d+ of 10000 samples: Age below 1 kyr/);
    const count = Number(/^in (\d+)/.exec(line!)![1]);
    const z = Math.log(12.9161525152 / 5) / Math.log(3);
    const p = 1 - (1 + Math.tanh(z * 0.7978845608 * (1 + 0.044715 * z * z))) / 2; // Φ by the tanh approximation (common practice, 1e-3)
    expect(Math.abs(count - 10000 * p)).toBeLessThan(5 * Math.sqrt(10000 * p * (1 - p)) + 10);
  });

  it('should give no spread to an output that does not vary (kt of scarp_age with only K uncertain, P48)', () => {
    const results = evaluateSheet(caseSheet('P48'));
    expect(results.blocks.age!.outputs.kt!.spread).toBeUndefined();
    expect(results.blocks.age!.series?.hist_kt).toBeUndefined();
    expect(results.blocks.age!.series?.hist_age?.yLabel).toBe('samples');
  });
});

describe('declaring distributions (CONTRACT §8.1)', () => {
  const one = (expr: string, uncertainty?: SheetDocument['uncertainty']) =>
    evaluateSheet(doc([{ id: 'blk-q', name: 'q', type: 'quantities', inputs: { X: expr } }], uncertainty)).blocks.q!;

  it('should take the median as the nominal value of every distribution (FORMULAS §17.1)', () => {
    expect(one('normal(3 m, 0.4 m)').outputs.X!.value).toBe(3);
    expect(one('lognormal(2 m^2/kyr, 1.5)').outputs.X!.value).toBeCloseTo(2, 12);
    expect(one('uniform(1 m, 3 m)').outputs.X!.value).toBe(2);
    // triangular(0, 1, 4): mode < midpoint, median = hi − √((hi − lo)(hi − mode)/2) = 4 − √6.
    expect(one('triangular(0 m, 1 m, 4 m)').outputs.X!.value).toBeCloseTo(4 - Math.sqrt(6), 12);
    expect(one('normal(10 degC, 2 degC)').outputs.X!.unit).toBe('degC');
    expect(one('normal(10 degC, 2 degC)').outputs.X!.value).toBeCloseTo(10, 12);
  });

  it('should convert units inside the arguments (normal(1.1 m^2/kyr, 200 m^2/Myr))', () => {
    const spread = one('normal(1.1 m^2/kyr, 200 m^2/Myr)', { samples: 1000 }).outputs.X!.spread as NumericSpread;
    expect(Math.abs(spread.sd - 0.2)).toBeLessThan(5 * 0.022 * 0.2);
  });

  it('should refuse invalid arguments with the rule in the message', () => {
    expect(one('normal(3 m, 0 m)').error).toContain('sd must be > 0');
    expect(one('normal(3 m, 0.1 s)').error).toContain('same dimension');
    expect(one('lognormal(1 m, 0.9)').error).toContain('factor must be a plain number > 1');
    expect(one('lognormal(1 m, 1.5 m)').error).toContain('factor must be a plain number > 1');
    expect(one('lognormal(10 degC, 1.5)').error).toContain('use K');
    expect(one('lognormal(-1 m, 1.5)').error).toContain('median must be > 0');
    expect(one('uniform(3 m, 1 m)').error).toContain('lo must be less than hi');
    expect(one('triangular(0 m, 5 m, 4 m)').error).toContain('mode must lie between lo and hi');
    expect(one('normal(3 m)').error).toContain('takes 2 arguments');
  });

  it('should refuse a distribution inside arithmetic, and distribution parameters that are uncertain', () => {
    expect(one('2 * normal(1 m, 0.1 m)').error).toContain('a distribution must be the whole expression of an input');
    const chained = evaluateSheet(doc([
      { id: 'a', name: 'q', type: 'quantities', inputs: { A: 'normal(1 m, 0.1 m)' } },
      { id: 'b', name: 'r', type: 'quantities', inputs: { B: 'normal(q.A, 0.1 m)' } },
    ]));
    expect(chained.blocks.r!.error).toContain('distribution parameters must be certain');
    const certain = evaluateSheet(doc([
      { id: 'a', name: 'q', type: 'quantities', inputs: { A: '1 m' } },
      { id: 'b', name: 'r', type: 'quantities', inputs: { B: 'normal(q.A, 0.1 m)' } },
    ], { samples: 500 }));
    expect(certain.blocks.r!.status).toBe('ok');
  });

  it('should keep the random functions refused (the only randomness is the seeded stream)', () => {
    expect(one('random()').error).toContain('not available');
    expect(one('pickRandom([1, 2])').error).toContain('not available');
  });

  it('should refuse distributions in a quick calculation', () => {
    expect(() => evaluateQuick('normal(1 m, 0.1 m)')).toThrow('distributions need a sheet');
    expect(() => evaluateQuick('2 * uniform(1 m, 2 m)')).toThrow('distributions need a sheet');
  });

  it('should refuse the distribution names as block names (CONTRACT §1 amendment)', () => {
    for (const name of ['normal', 'lognormal', 'uniform', 'triangular']) {
      const parsed = parseSheetDocument(doc([{ id: 'x', name, type: 'quantities', inputs: {} }]));
      expect(parsed.ok).toBe(false);
      if (!parsed.ok) expect(parsed.message).toContain('distribution');
    }
  });
});

describe('the uncertainty settings in the document (CONTRACT §1, §8.2)', () => {
  it('should name the field of an invalid setting', () => {
    const bad = (uncertainty: unknown) => parseSheetDocument({ ...doc([]), uncertainty });
    const samples = bad({ samples: 50 });
    expect(samples.ok || samples.path).toBe('uncertainty.samples');
    expect(bad({ method: 'bootstrap' }).ok || (bad({ method: 'bootstrap' }) as { path: string }).path).toBe('uncertainty.method');
    expect(bad({ seed: -1 }).ok || (bad({ seed: -1 }) as { path: string }).path).toBe('uncertainty.seed');
    expect(bad({ seed: 1.5 }).ok).toBe(false);
    expect(bad({ seed: 4294967296 }).ok).toBe(false);
    expect(bad({ samples: 100001 }).ok).toBe(false);
    const unknown = bad({ samples: 1000, bins: 3 });
    expect(unknown.ok).toBe(false);
    if (!unknown.ok) expect(unknown.message).toContain('bins');
  });

  it('should fill the defaults (Monte Carlo, 10 000 samples, seed 1) and hash the settings with the document', () => {
    const d = doc([{ id: 'a', name: 'q', type: 'quantities', inputs: { A: 'normal(1 m, 0.1 m)' } }]);
    expect(evaluateSheet(d).uncertainty).toMatchObject({ method: 'monte_carlo', samples: 10000, seed: 1 });
    const withSettings = { ...d, uncertainty: { seed: 2 } };
    expect(hashSheetDocument(withSettings)).not.toBe(hashSheetDocument(d));
    const checked = parseSheetDocument(withSettings);
    expect(checked.ok).toBe(true);
    if (checked.ok) expect(canonicalSheetJson(checked.document)).toBe(canonicalize(checked.document));
  });

  it('should leave documents without distributions and their results unchanged (no uncertainty key)', () => {
    const d = doc([{ id: 'a', name: 'q', type: 'quantities', inputs: { A: '1 m' } }]);
    const results = evaluateSheet(d);
    expect('uncertainty' in results).toBe(false);
    expect(results.blocks.q!.outputs.A).toEqual({ value: 1, unit: 'm', si: 1, siUnit: 'm' });
  });
});

describe('data-driven blocks through their own evaluate function', () => {
  it('should propagate a uniform K_f through channel_march: the outflux is affine in K_f (FORMULAS §16, §17.3)', () => {
    const data: DatasetCanonical = {
      columns: [{ name: 'distance', unit: 'm' }, { name: 'elevation', unit: 'm' }, { name: 'discharge', unit: 'm^2/yr' }],
      format: 'denudata-dataset@1',
      kind: 'long_profile',
      rows: [[0, 10, 100], [500, 9, 100], [1000, 8, 100]],
    };
    const sha = hashDataset(data);
    const sheetFor = (method: 'linear' | 'monte_carlo'): SheetDocument => doc(
      [{ id: 'blk-m', name: 'march', type: 'channel_march', inputs: { data: `dataset("${sha}")`, coefficient: 'uniform(0.005, 0.015)', length_scale: '2 km' } }],
      { method, samples: 2000, seed: 4 },
    );
    const options = { datasets: new Map([[sha, data]]) };
    const mc = evaluateSheet(sheetFor('monte_carlo'), options).blocks.march!;
    expect(mc.status, mc.error).toBe('ok');
    const spread = mc.outputs.outgoing_flux!.spread as NumericSpread;
    expect(spread.sensitivity!['march.coefficient']).toBe(1);
    const linear = evaluateSheet(sheetFor('linear'), options).blocks.march!.outputs.outgoing_flux!.spread as NumericSpread;
    expect(linear.contributions).toEqual({ 'march.coefficient': 1 });
    // An affine map of a uniform: the Monte Carlo sd converges on the linear one (5 standard errors, N = 2000).
    expect(Math.abs(spread.sd - linear.sd)).toBeLessThan(5 * linear.sd * Math.sqrt((1.8 - 1) / (4 * 2000)));
    // A distribution in a data input is refused like any other non-dataset text there.
    const bad = structuredClone(sheetFor('monte_carlo'));
    bad.blocks[0]!.inputs.data = 'normal(1 m, 0.1 m)';
    expect(evaluateSheet(bad, options).blocks.march!.status).toBe('error');
  });
});
