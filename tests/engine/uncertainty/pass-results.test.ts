// What the uncertainty pass writes into the results (lib/engine/uncertainty/propagate.ts): failed points of the
// linear method carried downstream, nominal errors kept, the exact shape of error and blocked results, histogram
// labels of each output, and which distributions a quantity's sensitivities name (CONTRACT §8.3–§8.5).
import { describe, expect, it } from 'vitest';
import { blockCatalog, evaluateSheet, type NumericSpread, type SheetDocument } from '@/lib/engine';
import { isClose } from '../../support/approx';

function sheet(blocks: SheetDocument['blocks'], uncertainty: SheetDocument['uncertainty']): SheetDocument {
  return { format: 'denudata-sheet@1', title: 'Uncertainty results', blocks, uncertainty };
}

describe('failed points of the linear method are failed downstream (CONTRACT §8.4)', () => {
  it('should not evaluate a block at a point where a block it reads failed, even if it could', () => {
    // x.A ~ normal(0.5e-4, 1): its lower point −0.5e-4 makes √ fail in root. down = x.A + (root ≥ 0 ? 0 : 1) could be
    // evaluated there (NaN ≥ 0 is false), but that point is failed upstream, so its difference is one-sided:
    // c·u = (f(x + h) − f(x))/1e-4 = ((1.5e-4) − (0.5e-4))/1e-4 = 1 (the derivative of x.A times u = 1).
    const results = evaluateSheet(
      sheet(
        [
          { id: 'b-x', name: 'x', type: 'quantities', inputs: { A: 'normal(0.5e-4, 1)' } },
          { id: 'b-r', name: 'root', type: 'formula', inputs: { expr: 'sqrt(x.A)' } },
          { id: 'b-d', name: 'down', type: 'formula', inputs: { expr: 'x.A + (root.value >= 0 ? 0 : 1)' } },
        ],
        { method: 'linear', samples: 100, seed: 1 },
      ),
    );
    const spread = results.blocks.down!.outputs.value!.spread as NumericSpread;
    expect(isClose(spread.sd, 1, 1e-9)).toBe(true);
  });

  it('should keep a point failed whichever order the block reads its inputs in', () => {
    // The same as above with root read first: x (read second, failed nowhere) must not clear root's failed point.
    const results = evaluateSheet(
      sheet(
        [
          { id: 'b-x', name: 'x', type: 'quantities', inputs: { A: 'normal(0.5e-4, 1)' } },
          { id: 'b-r', name: 'root', type: 'formula', inputs: { expr: 'sqrt(x.A)' } },
          { id: 'b-d', name: 'down', type: 'formula', inputs: { expr: '(root.value >= 0 ? 0 : 1) + x.A' } },
        ],
        { method: 'linear', samples: 100, seed: 1 },
      ),
    );
    expect(isClose((results.blocks.down!.outputs.value!.spread as NumericSpread).sd, 1, 1e-9)).toBe(true);
  });
});

describe('results the pass writes', () => {
  it('should keep a nominal error of an uncertain block as it was (no sampling of a failed block)', () => {
    // advective_geotherm refuses a depth outside 0..L (CONTRACT §2): 40 km in a 30 km layer.
    const results = evaluateSheet(
      sheet(
        [{
          id: 'b-g', name: 'geo', type: 'advective_geotherm',
          inputs: { velocity: '1 mm/yr', thickness: '30 km', diffusivity: '1e-6 m^2/s', surface_temperature: 'normal(10 degC, 2 degC)', base_temperature: '610 degC', depth: '40 km' },
        }],
        { samples: 100, seed: 1 },
      ),
    );
    const geo = results.blocks.geo!;
    expect(geo.status).toBe('error');
    expect(geo.error).toMatch(/^block "geo", /);
    expect(geo.error).toContain('depth');
    expect(geo.error).not.toContain('sample');
  });

  it('should write error and blocked results with no outputs and no warnings', () => {
    const mc = evaluateSheet(
      sheet(
        [
          { id: 'b-q', name: 'q', type: 'quantities', inputs: { A: 'normal(0.3, 1)' } },
          { id: 'b-s', name: 'rooted', type: 'formula', inputs: { expr: 'sqrt(q.A)' } },
          { id: 'b-t', name: 'twice', type: 'formula', inputs: { expr: 'rooted.value * 2' } },
        ],
        { samples: 100, seed: 3 },
      ),
    );
    expect(mc.blocks.rooted).toEqual({ id: 'b-s', type: 'formula', status: 'error', error: mc.blocks.rooted!.error, warnings: [], outputs: {} });
    expect(mc.blocks.rooted!.error).toMatch(/^block "rooted", sample \d+ of 100 /);
    expect(mc.blocks.twice).toEqual({ id: 'b-t', type: 'formula', status: 'blocked', error: 'waiting on block "rooted", which has an error', warnings: [], outputs: {} });
    const linear = evaluateSheet(
      sheet(
        [
          { id: 'b-q', name: 'q', type: 'quantities', inputs: { A: 'normal(2, 1)' } },
          { id: 'b-s', name: 'rooted', type: 'formula', inputs: { expr: 'sqrt(-(q.A - 2)^2)' } },
          { id: 'b-t', name: 'twice', type: 'formula', inputs: { expr: 'rooted.value * 2' } },
        ],
        { method: 'linear', samples: 100, seed: 3 },
      ),
    );
    expect(linear.blocks.rooted).toEqual({
      id: 'b-s', type: 'formula', status: 'error', warnings: [], outputs: {},
      error: 'block "rooted", linear propagation: the block fails on both sides of q.A (expr: the result is not finite)',
    });
    expect(linear.blocks.twice).toEqual({ id: 'b-t', type: 'formula', status: 'blocked', error: 'waiting on block "rooted", which has an error', warnings: [], outputs: {} });
    // A linear result has no histogram, and no empty series key either.
    expect('series' in linear.blocks.q!).toBe(false);
  });

  it('should label each output’s histogram with that output’s own label (hillslope_diffusion’s two outputs)', () => {
    const results = evaluateSheet(
      sheet(
        [{ id: 'b-h', name: 'hillside', type: 'hillslope_diffusion', inputs: { diffusivity: 'lognormal(5 m^2/kyr, 1.5)', curvature: '-0.01 1/m' } }],
        { samples: 100, seed: 2 },
      ),
    );
    const outputs = blockCatalog().find((t) => t.id === 'hillslope_diffusion')!.outputs;
    const series = results.blocks.hillside!.series!;
    expect(series.hist_dz_dt!.xLabel).toBe(outputs.find((o) => o.name === 'dz_dt')!.label);
    expect(series.hist_lowering_rate!.xLabel).toBe(outputs.find((o) => o.name === 'lowering_rate')!.label);
    expect(series.hist_lowering_rate!.xLabel).not.toBe(series.hist_dz_dt!.xLabel);
  });

  it('should give a quantity’s own distribution only its own sensitivity, even when an upstream input has its name', () => {
    const results = evaluateSheet(
      sheet(
        [
          { id: 'b-q', name: 'q', type: 'quantities', inputs: { C: 'normal(1 m, 0.1 m)', X: 'normal(2 m, 0.1 m)' } },
          { id: 'b-r', name: 'r', type: 'quantities', inputs: { C: 'uniform(1 m, 2 m)', D: 'q.X * 2' } },
        ],
        { samples: 200, seed: 9 },
      ),
    );
    expect((results.blocks.r!.outputs.C!.spread as NumericSpread).sensitivity).toEqual({ 'r.C': 1 });
    expect(Object.keys((results.blocks.r!.outputs.D!.spread as NumericSpread).sensitivity!).sort()).toEqual(['q.C', 'q.X']);
  });
});
