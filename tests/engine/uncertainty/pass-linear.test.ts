// First-order propagation through a chain (lib/engine/uncertainty/propagate.ts; CONTRACT §8.4, GUM JCGM 100:2008
// §5.1.2): blocks that read both certain and uncertain blocks, and the order of the 2m perturbed points.
import { describe, expect, it } from 'vitest';
import { evaluateSheet, type NumericSpread, type SheetDocument } from '@/lib/engine';
import { isClose } from '../../support/approx';

function sheet(blocks: SheetDocument['blocks']): SheetDocument {
  return { format: 'denudata-sheet@1', title: 'Linear chain', blocks, uncertainty: { method: 'linear', samples: 100, seed: 1 } };
}

describe('linear propagation through certain and uncertain blocks', () => {
  it('should combine u² = Σ(c·u)² through a block that also reads a certain block (y = 2A + X − 3B)', () => {
    const results = evaluateSheet(
      sheet([
        { id: 'b-x', name: 'fixed', type: 'quantities', inputs: { X: '5 m' } },
        { id: 'b-q', name: 'q', type: 'quantities', inputs: { A: 'normal(3 m, 0.4 m)', B: 'uniform(1 m, 2 m)' } },
        { id: 'b-y', name: 'mixed', type: 'formula', inputs: { expr: 'fixed.X + 2 * q.A' } },
        { id: 'b-z', name: 'downstream', type: 'formula', inputs: { expr: 'mixed.value - 3 * q.B' } },
      ]),
    );
    const mixed = results.blocks.mixed!.outputs.value!.spread as NumericSpread;
    expect(isClose(mixed.sd, 0.8, 1e-9)).toBe(true);
    expect(mixed.mean).toBe(11);
    // u(B) = (hi − lo)/√12 (GUM §4.3.7); c_B = −3, c_A = 2.
    const uB = 1 / Math.sqrt(12);
    const last = results.blocks.downstream!.outputs.value!.spread as NumericSpread;
    expect(isClose(last.sd, Math.hypot(0.8, 3 * uB), 1e-9)).toBe(true);
    expect(isClose(last.contributions!['q.A']!, 0.64 / (0.64 + 9 * uB * uB), 1e-9)).toBe(true);
    expect(isClose(last.contributions!['q.B']!, (9 * uB * uB) / (0.64 + 9 * uB * uB), 1e-9)).toBe(true);
    expect(results.blocks.fixed!.outputs.X!.spread).toBeUndefined();
  });

  it('should perturb each input on its own: three inputs give three independent terms', () => {
    const results = evaluateSheet(
      sheet([
        { id: 'b-q', name: 'q', type: 'quantities', inputs: { A: 'normal(1, 0.1)', B: 'normal(2, 0.2)', C: 'normal(3, 0.3)' } },
        { id: 'b-p', name: 'product', type: 'formula', inputs: { expr: 'q.A * q.B * q.C' } },
      ]),
    );
    const spread = results.blocks.product!.outputs.value!.spread as NumericSpread;
    // y = ABC at (1, 2, 3): c_A·u_A = 6·0.1, c_B·u_B = 3·0.2, c_C·u_C = 2·0.3, each 0.6 (exact for a product, linear in each).
    expect(isClose(spread.sd, Math.sqrt(3 * 0.36), 1e-7)).toBe(true);
    for (const key of ['q.A', 'q.B', 'q.C']) expect(isClose(spread.contributions![key]!, 1 / 3, 1e-7), key).toBe(true);
    expect(results.uncertainty!.inputs.map((i) => i.input)).toEqual(['A', 'B', 'C']);
  });
});
