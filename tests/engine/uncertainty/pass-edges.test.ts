// Edges of the uncertainty pass (lib/engine/uncertainty/propagate.ts, sample-block.ts): the sample-size cap,
// fixed grids, outputs that a block gives only sometimes, relations that fail or overflow in some samples, and
// which blocks the pass leaves alone. Few samples and fixed seeds (fast enough for mutation testing); each
// failing sample is found here from the contract's stream (CONTRACT §8.3) with the reference library's Φ⁻¹.
import { describe, expect, it } from 'vitest';
import normalQuantileRef from '@stdlib/stats-base-dists-normal-quantile';
import { evaluateSheet, type NumericSpread, type SheetDocument } from '@/lib/engine';
import { streamUniforms } from '@/lib/engine/uncertainty/stream';
import { isClose } from '../../support/approx';

function sheet(blocks: SheetDocument['blocks'], uncertainty: SheetDocument['uncertainty']): SheetDocument {
  return { format: 'denudata-sheet@1', title: 'Uncertainty edges', blocks, uncertainty };
}
function normals(seed: number, blockId: string, input: string, n: number): number[] {
  return Array.from(streamUniforms(seed, blockId, input, n), (u) => normalQuantileRef(u, 0, 1));
}
const shown = (x: number) => Number(x.toPrecision(6));

describe('the sample-size cap of grid blocks (CONTRACT §8.3: samples × nodes × steps ≤ 2e9)', () => {
  const evolution = (samples: number) =>
    sheet(
      [{ id: 'blk-evo', name: 'evo', type: 'profile_evolution', inputs: { diffusivity: 'uniform(0.8 m^2/kyr, 1.2 m^2/kyr)', duration: '10 kyr', vertical_offset: '2 m' } }],
      { samples, seed: 3 },
    );

  it('should refuse 241 nodes × 100 steps × 100 000 samples = 2.41e9 before sampling, naming the numbers', () => {
    const result = evaluateSheet(evolution(100_000)).blocks.evo!;
    expect(result.status).toBe('error');
    expect(result.error).toBe('block "evo", nodes × steps × 100000 samples = 2.41e+9 exceeds the limit of 2e+9; use fewer samples or a coarser grid');
  });

  it('should keep the default grid (dx = √(Kt)/20 at the nominal K) in every sample: dx and nodes have no spread', () => {
    const result = evaluateSheet(evolution(100)).blocks.evo!;
    expect(result.status, result.error).toBe('ok');
    expect(result.outputs.nodes!.value).toBe(241);
    expect(result.outputs.dx!.spread).toBeUndefined();
    expect(result.outputs.nodes!.spread).toBeUndefined();
    // kt = K·t varies with K; its samples are K·10 kyr exactly (uniform: lo + (hi − lo)·u).
    const kt = result.outputs.kt!.spread as NumericSpread;
    const u = Array.from(streamUniforms(3, 'blk-evo', 'diffusivity', 100));
    const mean = u.reduce((a, x) => a + (0.8 + 0.4 * x) * 10, 0) / 100;
    expect(isClose(kt.si.mean, mean, 1e-9)).toBe(true);
  });
});

describe('outputs a block gives only sometimes, and relations that fail in some samples', () => {
  const geotherm = (inputs: Record<string, string>) =>
    evaluateSheet(
      sheet(
        [{
          id: 'blk-geo', name: 'geo', type: 'advective_geotherm',
          inputs: { velocity: '1 mm/yr', thickness: '30 km', diffusivity: '1e-6 m^2/s', surface_temperature: '10 degC', base_temperature: '610 degC', ...inputs },
        }],
        { samples: 300, seed: 6 },
      ),
    ).blocks.geo!;

  it('should sample only the outputs the nominal run gave (no depth, no temperature at depth)', () => {
    const result = geotherm({ surface_temperature: 'normal(10 degC, 2 degC)' });
    expect(result.status, result.error).toBe('ok');
    expect(result.outputs.temperature_at_depth).toBeUndefined();
    expect(result.outputs.surface_gradient!.spread).toBeDefined();
  });

  it('should stop at the first sample whose depth falls below the sampled thickness, with the block’s own message', () => {
    const result = geotherm({ thickness: 'normal(30 km, 2 km)', depth: '28 km' });
    const L = normals(6, 'blk-geo', 'thickness', 300).map((x) => 30 + 2 * x);
    const first = L.findIndex((l) => l < 28);
    expect(first).toBeGreaterThanOrEqual(0);
    expect(result.status).toBe('error');
    expect(result.error!.startsWith(`block "geo", sample ${first + 1} of 300 (thickness = ${shown(L[first]!)} km): `)).toBe(true);
    expect(result.error).toContain('depth');
  });

  it('should stop at a sample whose result overflows: dz/dt = K·C beyond 1.8e308 (hillslope_diffusion, Culling 1960)', () => {
    const result = evaluateSheet(
      sheet(
        [{ id: 'blk-h', name: 'hillside', type: 'hillslope_diffusion', inputs: { diffusivity: 'lognormal(1e290 m^2/s, 1e5)', curvature: '-1e10 1/m' } }],
        { samples: 200, seed: 8 },
      ),
    ).blocks.hillside!;
    const K = normals(8, 'blk-h', 'diffusivity', 200).map((x) => 1e290 * Math.exp(Math.log(1e5) * x));
    const first = K.findIndex((k) => !Number.isFinite(k * -1e10));
    expect(first).toBeGreaterThanOrEqual(0);
    expect(result.status).toBe('error');
    expect(result.error).toMatch(new RegExp(`^block "hillside", sample ${first + 1} of 200 \\(diffusivity = [0-9.e+]+ m\\^2 / s\\): dz_dt: the result is not finite \\(-Infinity\\); check the inputs$`));
  });

  it('should show a plain number as it is when it breaks a range (φ < 1 of net_change, Exner)', () => {
    const result = evaluateSheet(
      sheet(
        [{ id: 'blk-n', name: 'reach', type: 'net_change', inputs: { capacity: '3 m^2/yr', flux: '1 m^2/yr', length_scale: '2 km', porosity: 'normal(0.95, 0.05)' } }],
        { samples: 200, seed: 2 },
      ),
    ).blocks.reach!;
    const phi = normals(2, 'blk-n', 'porosity', 200).map((x) => 0.95 + 0.05 * x);
    const first = phi.findIndex((p) => p >= 1 || p < 0);
    expect(result.error).toBe(`block "reach", sample ${first + 1} of 200 (porosity = ${shown(phi[first]!)}): porosity: must be 0 ≤ φ < 1, got ${shown(phi[first]!)}`);
  });

  it('should use a slope written as a gradient as it is (tan only for angles)', () => {
    // |S| ≥ 0.6 warns (Roering et al. 1999); S ~ normal(0.5, 0.05) as a plain gradient.
    const result = evaluateSheet(
      sheet(
        [{ id: 'blk-s', name: 'hillside', type: 'hillslope_diffusion', inputs: { diffusivity: '5 m^2/kyr', curvature: '-0.01 1/m', slope: 'normal(0.5, 0.05)' } }],
        { samples: 400, seed: 3 },
      ),
    ).blocks.hillside!;
    const S = normals(3, 'blk-s', 'slope', 400).map((x) => 0.5 + 0.05 * x);
    const steep = S.filter((s) => Math.abs(s) >= 0.6).length;
    expect(steep).toBeGreaterThan(0);
    expect(result.warnings).toEqual([
      `in ${steep} of 400 samples: |slope| = … ≥ 0.6: linear diffusion likely underestimates transport here; consider a nonlinear law (Roering et al. 1999).`,
    ]);
  });
});

describe('what the pass leaves alone, and what it names (CONTRACT §8.2, §8.3)', () => {
  it('should leave a certain block’s warnings as the nominal run gave them, and an uncertain block’s nominal error', () => {
    const results = evaluateSheet(
      sheet(
        [
          { id: 'blk-c', name: 'steep', type: 'hillslope_diffusion', inputs: { diffusivity: '5 m^2/kyr', curvature: '-0.01 1/m', slope: '0.7' } },
          { id: 'blk-q', name: 'q', type: 'quantities', inputs: { A: 'normal(1 m, 0.1 m)' } },
          { id: 'blk-n', name: 'reach', type: 'net_change', inputs: { capacity: 'normal(-1 m^2/yr, 0.1 m^2/yr)', flux: '1 m^2/yr', length_scale: '2 km' } },
        ],
        { samples: 100, seed: 1 },
      ),
    );
    expect(results.blocks.steep!.warnings).toEqual([
      '|slope| = 0.700 ≥ 0.6: linear diffusion likely underestimates transport here; consider a nonlinear law (Roering et al. 1999).',
    ]);
    expect(results.blocks.steep!.outputs.dz_dt!.spread).toBeUndefined();
    expect(results.blocks.reach!.status).toBe('error');
    expect(results.blocks.reach!.error).toMatch(/^block "reach", capacity: must be ≥ 0/);
    expect(results.blocks.reach!.error).not.toContain('sample');
  });

  it('should name three inputs without an ellipsis', () => {
    const results = evaluateSheet(
      sheet(
        [
          { id: 'blk-q', name: 'q', type: 'quantities', inputs: { A: 'normal(0.3, 1)', B: 'normal(2, 1)', C: 'normal(1, 1)' } },
          { id: 'blk-s', name: 'summed', type: 'formula', inputs: { expr: 'sqrt(q.A) + q.B + q.C' } },
        ],
        { samples: 200, seed: 3 },
      ),
    );
    expect(results.blocks.summed!.error).toMatch(/^block "summed", sample \d+ of 200 \(q\.A = -[0-9.e-]+, q\.B = [-0-9.e]+, q\.C = [-0-9.e]+\): expr: the result is not finite$/);
  });

  it('should give a quantity that reads another block the sensitivities of that block’s inputs, and its own distribution only its own', () => {
    const results = evaluateSheet(
      sheet(
        [
          { id: 'blk-q', name: 'q', type: 'quantities', inputs: { A: 'normal(3 m, 0.4 m)', B: 'normal(5 m, 0.3 m)' } },
          { id: 'blk-r', name: 'r', type: 'quantities', inputs: { C: 'q.A + 1 m', D: '4 m', E: 'uniform(1 m, 2 m)' } },
        ],
        { samples: 300, seed: 4 },
      ),
    );
    const r = results.blocks.r!;
    expect(Object.keys((r.outputs.C!.spread as NumericSpread).sensitivity!).sort()).toEqual(['q.A', 'q.B']);
    expect((r.outputs.C!.spread as NumericSpread).sensitivity!['q.A']).toBe(1);
    expect((r.outputs.E!.spread as NumericSpread).sensitivity).toEqual({ 'r.E': 1 });
    expect(r.outputs.D!.spread).toBeUndefined();
  });
});
