import { describe, expect, it } from 'vitest';
import erfc from '@stdlib/math-base-special-erfc';
import quantile from '@stdlib/stats-base-dists-normal-quantile';
import { nextUint32, nextUniform, normalQuantile, streamKey, streamState } from '@/lib/engine/uncertainty/stream';
import { isClose } from '../../support/approx';
import { uncertaintyCase } from './cases';

// P53: test vectors of the specified stream (CONTRACT §8.3; Blackman & Vigna 2021 xoshiro128**,
// FIPS 180-4 SHA-256, Wichura 1988 AS 241).
const p53 = uncertaintyCase('P53');
const vector = (name: string) => p53.expected[name]!.value as number[];

describe('the specified random stream (P53)', () => {
  it('should build the state from the first 16 bytes of SHA-256 of the key, little-endian', () => {
    expect(streamKey(7, 'blk-age', 'diffusivity')).toBe('denudata-rng@1|7|blk-age|diffusivity');
    expect([...streamState('denudata-rng@1|7|blk-age|diffusivity')]).toEqual(vector('rng.state'));
  });

  it('should give xoshiro128** outputs exactly', () => {
    const state = streamState('denudata-rng@1|7|blk-age|diffusivity');
    expect(Array.from({ length: 6 }, () => nextUint32(state))).toEqual(vector('rng.u32'));
  });

  it('should give the 53-bit uniforms exactly, for both keys', () => {
    const state = streamState('denudata-rng@1|7|blk-age|diffusivity');
    expect(Array.from({ length: 5 }, () => nextUniform(state))).toEqual(vector('rng.uniform'));
    const other = streamState('denudata-rng@1|3|blk-den|rate');
    expect(Array.from({ length: 3 }, () => nextUniform(other))).toEqual(vector('rng.uniform_key2'));
  });

  it('should give the AS 241 normals and the first lognormal diffusivities of P48 to 1e-13', () => {
    const state = streamState('denudata-rng@1|7|blk-age|diffusivity');
    const u = Array.from({ length: 5 }, () => nextUniform(state));
    u.map(normalQuantile).forEach((z, i) => expect(isClose(z, vector('rng.normal')[i]!, 1e-13, 1e-15), `z[${i}] = ${z}`).toBe(true));
    // lognormal(1 m^2/kyr, 1.5): median · exp(ln(1.5) · z)
    u.map((p) => Math.exp(Math.log(1.5) * normalQuantile(p))).forEach((k, i) =>
      expect(isClose(k, vector('rng.lognormal_K')[i]!, 1e-13), `K[${i}] = ${k}`).toBe(true),
    );
  });

  it('should keep every uniform strictly inside (0, 1) over many draws (FORMULAS §17.6)', () => {
    const state = streamState('denudata-rng@1|1|x|y');
    let outside = 0;
    for (let i = 0; i < 100_000; i++) {
      const u = nextUniform(state);
      if (!(u > 0 && u < 1)) outside++;
    }
    expect(outside).toBe(0);
  });
});

describe('normalQuantile (AS 241)', () => {
  it('should agree with @stdlib/stats-base-dists-normal-quantile over the central range', () => {
    // The reference library (stdlib, via erfinv) is accurate where 2p − 1 keeps its digits.
    for (let p = 0.01; p < 0.995; p += 0.0137) {
      expect(isClose(normalQuantile(p), quantile(p, 0, 1), 1e-13, 1e-15), `p = ${p}`).toBe(true);
    }
  });

  it('should give the textbook points: 1.959963984540 at 0.975 and −2.326347874041 at 0.01 (common practice)', () => {
    expect(isClose(normalQuantile(0.975), 1.959963984540054, 1e-14)).toBe(true);
    expect(isClose(normalQuantile(0.01), -2.3263478740408408, 1e-14)).toBe(true);
    expect(normalQuantile(0.5)).toBe(0);
  });

  it('should invert the normal CDF in the far tails: Φ(Φ⁻¹(p)) = p with @stdlib erfc down to 1e-300', () => {
    // Φ(z) = erfc(−z/√2)/2, the reference library's complementary error function.
    for (const p of [1e-300, 1e-100, 1e-20, 1e-10, 1e-5, 0.02]) {
      const z = normalQuantile(p);
      expect(Number.isFinite(z)).toBe(true);
      expect(isClose(erfc(-z / Math.SQRT2) / 2, p, 1e-12), `p = ${p}: z = ${z}`).toBe(true);
    }
    // scipy.special.ndtri(1e-10) = −6.361340902404056 (from memory).
    expect(isClose(normalQuantile(1e-10), -6.361340902404056, 1e-14)).toBe(true);
  });
});
