// The uncertainty pass's slower path (lib/engine/uncertainty/sample-block.ts): an input whose expression the numeric
// compiler does not cover (here floor(), numeric.ts) is evaluated with mathjs for every sample, with the upstream
// samples put back into their units. The samples are rebuilt here from the contract's stream (CONTRACT §8.3;
// uniform: lo + (hi − lo)·u) and the results compared exactly (common practice: floor of a known number).
import { describe, expect, it } from 'vitest';
import normalQuantileRef from '@stdlib/stats-base-dists-normal-quantile';
import { evaluateSheet, type NumericSpread, type SheetDocument } from '@/lib/engine';
import { streamUniforms } from '@/lib/engine/uncertainty/stream';
import { isClose } from '../../support/approx';

function sheet(blocks: SheetDocument['blocks']): SheetDocument {
  return { format: 'denudata-sheet@1', title: 'Uncertainty fallback', blocks, uncertainty: { samples: 200, seed: 5 } };
}
const mean = (x: number[]) => x.reduce((a, b) => a + b, 0) / x.length;

describe('inputs evaluated with mathjs per sample (the fallback of the numeric compiler)', () => {
  const blocks = (expr: string): SheetDocument['blocks'] => [
    { id: 'blk-q', name: 'q', type: 'quantities', inputs: { L: 'uniform(1 km, 5 km)', M: 'uniform(2 km, 3 km)' } },
    { id: 'blk-c', name: 'fixed', type: 'quantities', inputs: { X: '1 km' } },
    { id: 'blk-f', name: 'counted', type: 'formula', inputs: { expr } },
  ];
  const L = () => Array.from(streamUniforms(5, 'blk-q', 'L', 200), (u) => 1 + 4 * u);
  const M = () => Array.from(streamUniforms(5, 'blk-q', 'M', 200), (u) => 2 + u);

  it('should give each sample its units back and read two outputs of one block', () => {
    const result = evaluateSheet(sheet(blocks('floor(q.L / (1 km)) + floor(q.M / (1 km))'))).blocks.counted!;
    expect(result.status, result.error).toBe('ok');
    const expected = L().map((l, k) => Math.floor(l) + Math.floor(M()[k]!));
    const spread = result.outputs.value!.spread as NumericSpread;
    expect(isClose(spread.si.mean, mean(expected), 1e-12)).toBe(true);
    // Sample standard deviation with N − 1 (common practice).
    const m = mean(expected);
    expect(isClose(spread.si.sd, Math.sqrt(expected.reduce((a, v) => a + (v - m) ** 2, 0) / 199), 1e-12)).toBe(true);
    expect(Object.keys(spread.sensitivity!).sort()).toEqual(['q.L', 'q.M']);
  });

  it('should read a certain block’s output at its nominal value beside the samples', () => {
    const result = evaluateSheet(sheet(blocks('floor(q.L / fixed.X) * 1 m'))).blocks.counted!;
    expect(result.status, result.error).toBe('ok');
    const expected = L().map((l) => Math.floor(l));
    const spread = result.outputs.value!.spread as NumericSpread;
    expect(isClose(spread.si.mean, mean(expected), 1e-12)).toBe(true);
    expect(result.outputs.value!.unit).toBe('m');
  });
});

describe('a slope written with a unit that is not an angle', () => {
  it('should leave a gradient in m/m as it is (tan only for angles; Roering et al. 1999: |S| ≥ 0.6 warns)', () => {
    const result = evaluateSheet({
      format: 'denudata-sheet@1',
      title: 'Gradient in m/m',
      blocks: [{ id: 'blk-s', name: 'hillside', type: 'hillslope_diffusion', inputs: { diffusivity: '5 m^2/kyr', curvature: '-0.01 1/m', slope: 'normal(0.5 m/m, 0.05 m/m)' } }],
      uncertainty: { samples: 300, seed: 3 },
    }).blocks.hillside!;
    expect(result.status, result.error).toBe('ok');
    const S = Array.from(streamUniforms(3, 'blk-s', 'slope', 300), (u) => 0.5 + 0.05 * normalQuantileRef(u, 0, 1));
    const steep = S.filter((s) => Math.abs(s) >= 0.6).length;
    expect(steep).toBeGreaterThan(0);
    expect(result.warnings).toEqual([
      `in ${steep} of 300 samples: |slope| = … ≥ 0.6: linear diffusion likely underestimates transport here; consider a nonlinear law (Roering et al. 1999).`,
    ]);
  });
});

describe('a block type whose inputs read uncertain blocks', () => {
  it('should give hillslope_diffusion the samples of the blocks it reads: dz/dt = K·C sample by sample (Culling 1960)', () => {
    const result = evaluateSheet({
      format: 'denudata-sheet@1',
      title: 'Inputs from other blocks',
      blocks: [
        { id: 'blk-p', name: 'p', type: 'quantities', inputs: { K: 'lognormal(5 m^2/kyr, 1.5)', C: 'uniform(-0.02 1/m, -0.01 1/m)' } },
        { id: 'blk-h', name: 'hillside', type: 'hillslope_diffusion', inputs: { diffusivity: 'p.K', curvature: 'p.C' } },
        { id: 'blk-f', name: 'rounded', type: 'hillslope_diffusion', inputs: { diffusivity: 'p.K * floor(2.5)', curvature: 'p.C' } },
      ],
      uncertainty: { samples: 200, seed: 4 },
    }).blocks;
    const perSecond = 1 / (1000 * 365.25 * 86400);
    const K = Array.from(streamUniforms(4, 'blk-p', 'K', 200), (u) => 5 * perSecond * Math.exp(Math.log(1.5) * normalQuantileRef(u, 0, 1)));
    const C = Array.from(streamUniforms(4, 'blk-p', 'C', 200), (u) => -0.02 + 0.01 * u);
    const rates = K.map((k, i) => k * C[i]!);
    for (const name of ['hillside', 'rounded'] as const) {
      const block = result[name]!;
      expect(block.status, block.error).toBe('ok');
      const factor = name === 'rounded' ? 2 : 1;
      expect(isClose((block.outputs.dz_dt!.spread as NumericSpread).si.mean, factor * mean(rates), 1e-9), name).toBe(true);
    }
  });
});
