/**
 * The specified random stream of CONTRACT §8.3: one stream per uncertain input, seeded from
 * SHA-256 of `denudata-rng@1|<seed>|<block id>|<input>`, xoshiro128** 1.1 (Blackman & Vigna
 * 2021) and uniforms with 53 random bits offset by half an ulp, so never 0 or 1. The standard
 * normal quantile is Wichura's AS 241 (PPND16, Appl. Stat. 37:477–484, 1988).
 */
import { createHash } from 'node:crypto';

/** The key of an input's stream (UTF-8). */
export function streamKey(seed: number, blockId: string, input: string): string {
  return `denudata-rng@1|${seed}|${blockId}|${input}`;
}

/** The four 32-bit state words: bytes 0–15 of SHA-256(key) little-endian (16–31 if all zero). */
export function streamState(key: string): Uint32Array {
  const digest = createHash('sha256').update(key, 'utf8').digest();
  const state = new Uint32Array(4);
  for (let i = 0; i < 4; i++) state[i] = digest.readUInt32LE(4 * i);
  if (state[0] === 0 && state[1] === 0 && state[2] === 0 && state[3] === 0) {
    for (let i = 0; i < 4; i++) state[i] = digest.readUInt32LE(16 + 4 * i);
  }
  return state;
}

function rotl(x: number, k: number): number {
  return ((x << k) | (x >>> (32 - k))) >>> 0;
}

/** xoshiro128** 1.1: the next 32-bit output; advances the state in place. */
export function nextUint32(s: Uint32Array): number {
  const s0 = s[0]!;
  const s1 = s[1]!;
  const result = Math.imul(rotl(Math.imul(s1, 5) >>> 0, 7), 9) >>> 0;
  const t = (s1 << 9) >>> 0;
  let s2 = s[2]! ^ s0;
  let s3 = s[3]! ^ s1;
  s[1] = s1 ^ s2;
  s[0] = s0 ^ s3;
  s2 ^= t;
  s3 = rotl(s3 >>> 0, 11);
  s[2] = s2;
  s[3] = s3;
  return result;
}

const TWO_26 = 67108864;
const TWO_53 = 9007199254740992;

/** u = ((a >>> 5)·2²⁶ + (b >>> 6) + 0.5)/2⁵³ from two consecutive outputs: exact, inside (0, 1). */
export function nextUniform(s: Uint32Array): number {
  const a = nextUint32(s);
  const b = nextUint32(s);
  return ((a >>> 5) * TWO_26 + (b >>> 6) + 0.5) / TWO_53;
}

/** N uniforms of an input's stream. */
export function streamUniforms(seed: number, blockId: string, input: string, count: number): Float64Array {
  const state = streamState(streamKey(seed, blockId, input));
  const out = new Float64Array(count);
  for (let k = 0; k < count; k++) out[k] = nextUniform(state);
  return out;
}

/* ------------------------------------------------------- Φ⁻¹: AS 241 PPND16 */
// Coefficients of Wichura (1988), Algorithm AS 241, Appl. Statist. 37(3):477–484.
const A = [3.3871328727963666080, 1.3314166789178437745e2, 1.9715909503065514427e3, 1.3731693765509461125e4,
  4.5921953931549871457e4, 6.7265770927008700853e4, 3.3430575583588128105e4, 2.5090809287301226727e3];
const B = [1, 4.2313330701600911252e1, 6.8718700749205790830e2, 5.3941960214247511077e3,
  2.1213794301586595867e4, 3.9307895800092710610e4, 2.8729085735721942674e4, 5.2264952788528545610e3];
const C = [1.42343711074968357734, 4.63033784615654529590, 5.76949722146069140550, 3.64784832476320460504,
  1.27045825245236838258, 2.41780725177450611770e-1, 2.27238449892691845833e-2, 7.74545014278341407640e-4];
const D = [1, 2.05319162663775882187, 1.67638483018380384940, 6.89767334985100004550e-1,
  1.48103976427480074590e-1, 1.51986665636164571966e-2, 5.47593808499534494600e-4, 1.05075007164441684324e-9];
const E = [6.65790464350110377720, 5.46378491116411436990, 1.78482653991729133580, 2.96560571828504891230e-1,
  2.65321895265761230930e-2, 1.24266094738807843860e-3, 2.71155556874348757815e-5, 2.01033439929228813265e-7];
const F = [1, 5.99832206555887937690e-1, 1.36929880922735805310e-1, 1.48753612908506148525e-2,
  7.86869131145613259100e-4, 1.84631831751005468180e-5, 1.42151175831644588870e-7, 2.04426310338993978564e-15];

function ratio(num: number[], den: number[], r: number): number {
  let n = num[7]!;
  let d = den[7]!;
  for (let i = 6; i >= 0; i--) {
    n = n * r + num[i]!;
    d = d * r + den[i]!;
  }
  return n / d;
}

/** The standard normal quantile Φ⁻¹(p) for 0 < p < 1 (AS 241, relative error about 1e-16). */
export function normalQuantile(p: number): number {
  if (!(p > 0 && p < 1)) {
    if (p === 0) return -Infinity;
    if (p === 1) return Infinity;
    return NaN;
  }
  const q = p - 0.5;
  if (Math.abs(q) <= 0.425) return q * ratio(A, B, 0.180625 - q * q);
  let r = Math.sqrt(-Math.log(q < 0 ? p : 1 - p));
  const value = r <= 5 ? ratio(C, D, (r -= 1.6)) : ratio(E, F, (r -= 5));
  return q < 0 ? -value : value;
}
