// Samples repeat the plausibility warnings of typical ranges (lib/engine/typical-ranges.ts), aggregated over
// samples as CONTRACT §2's amendment says ("in 312 of 10000 samples: …"). The count is checked against the
// contract's own stream (§8.3: SHA-256 key, xoshiro128**, inverse-CDF lognormal), computed here independently of
// the sampling pass. Typical range of scarp diffusivities: 0.1 to 20 m^2/kyr (Hanks 2000's compilation).
import { describe, expect, it } from 'vitest';
import { evaluateSheet, parseSheetDocument } from '@/lib/engine';
import { normalQuantile, streamUniforms } from '@/lib/engine/uncertainty/stream';

const sheet = (diffusivity: string) => {
  const parsed = parseSheetDocument({
    format: 'denudata-sheet@1',
    title: 'Wide diffusivity',
    blocks: [{ id: 'blk-age', name: 'age', type: 'scarp_age', inputs: { vertical_offset: '4 m', far_field_slope: '0.05', max_slope: '20 deg', diffusivity } }],
    uncertainty: { method: 'monte_carlo', samples: 10000, seed: 7 },
  });
  if (!parsed.ok) throw new Error(parsed.message);
  return parsed.document;
};

describe('plausibility warnings over samples', () => {
  it('should count the samples of K more than 100 times outside its typical range, as one aggregated warning', () => {
    const results = evaluateSheet(sheet('lognormal(1 m^2/kyr, 20)'));
    const block = results.blocks.age!;
    expect(block.status).toBe('ok');
    // The same samples from the specified stream: K = 1 m^2/kyr · exp(ln 20 · Φ⁻¹(u)).
    const u = streamUniforms(7, 'blk-age', 'diffusivity', 10000);
    let outside = 0;
    for (const x of u) {
      const k = Math.exp(Math.log(20) * normalQuantile(x));
      if (k > 20 * 100 || k < 0.1 / 100) outside++;
    }
    // Expected share Φ(−ln 1000/ln 20) + Φ(−ln 2000/ln 20) ≈ 1.6 %.
    expect(outside).toBeGreaterThan(100);
    expect(outside).toBeLessThan(230);
    const line = block.warnings.find((w) => w.includes('outside the typical range'));
    expect(line).toBe(
      `in ${outside} of 10000 samples: diffusivity more than 100 times outside the typical range 0.1 to 20 m^2/kyr (scarp diffusivities compiled by Hanks 2000): check the distribution and its unit`,
    );
  });

  it('should add no such line when every sample is plausible, nor repeat it per sample when the median is already implausible', () => {
    expect(evaluateSheet(sheet('lognormal(1 m^2/kyr, 1.5)')).blocks.age!.warnings.filter((w) => w.includes('typical range'))).toEqual([]);
    const far = evaluateSheet(sheet('lognormal(5000 m^2/kyr, 1.5)')).blocks.age!.warnings.filter((w) => w.includes('typical range'));
    expect(far).toHaveLength(1);
    expect(far[0]).not.toMatch(/^in \d+ of/);
  });
});
