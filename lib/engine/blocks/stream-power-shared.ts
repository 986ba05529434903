import { EngineError } from '../errors';
import type { Quantity } from '../units';

const LENGTH = 1;
const TIME = 2;

/** Formats an exponent for a unit text, e.g. 0.1 → "0.1", 0.9000000001 → "0.9". */
export function exponentText(p: number): string {
  return String(Number(p.toPrecision(12)));
}

/** The expected unit of K for a given m: m^(1−2m)/yr. */
export function coefficientUnitText(m: number): string {
  const p = Number((1 - 2 * m).toPrecision(12));
  if (p === 0) return 'yr^-1';
  if (p === 1) return 'm/yr';
  return `m^${exponentText(p)}/yr`;
}

/**
 * Checks that the erodibility K has dimension L^(1−2m)/T, so that K·A^m·S^n is a velocity.
 * Returns K in SI (m^(1−2m)/s).
 */
export function checkErodibility(coefficient: Quantity, m: number): number {
  const expectedLength = 1 - 2 * m;
  const dims = coefficient.dimensions;
  const fits = dims.every((d, i) => {
    if (i === LENGTH) return Math.abs(d - expectedLength) < 1e-9;
    if (i === TIME) return d === -1;
    return d === 0;
  });
  if (!fits) {
    const expected = `L^(1−2m)/T, that is ${coefficientUnitText(m)} for m = ${exponentText(m)}`;
    throw new EngineError(
      `coefficient: expected ${expected}, so that K·A^m·S^n is an erosion rate; got a quantity of dimension ${describeDimensions(dims)}`,
      { input: 'coefficient', expected },
    );
  }
  if (coefficient.si <= 0) throw new EngineError('coefficient: must be > 0', { input: 'coefficient' });
  return coefficient.si;
}

function describeDimensions(dims: readonly number[]): string {
  const names = ['M', 'L', 'T', 'I', 'Θ', 'J', 'N', 'angle', 'bit'];
  const parts = dims.map((d, i) => (d === 0 ? '' : d === 1 ? names[i] : `${names[i]}^${exponentText(d)}`)).filter(Boolean);
  return parts.length === 0 ? '1 (dimensionless)' : parts.join('·');
}

export const STREAM_POWER_SOURCES = [
  'Howard & Kerby (1983) GSA Bull. 94:739–752',
  'Whipple & Tucker (1999) JGR 104(B8):17661–17674',
];

export const STREAM_POWER_CAUTIONS = [
  'K is comparable only between studies that use the same m; it spans orders of magnitude (Stock & Montgomery 1999).',
  'The law ignores erosion thresholds, sediment tools and cover, and channel-width adjustment.',
  'Slopes from noisy DEMs need smoothing or integral (χ) methods.',
];
