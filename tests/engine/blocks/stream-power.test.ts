import { describe, expect, it } from 'vitest';
import { expectClose } from '../../support/approx';
import { outputValue, runBlock } from '../../support/engine-sheets';
import { expected } from '../../support/reference-cases';

// Reference case P14: Howard & Kerby (1983) GSA Bull. 94:739; Whipple & Tucker (1999) JGR 104:17661 —
// E = K·A^m·S^n.
describe('stream_power', () => {
  const e = expected('P14', 'E_mm_per_yr');

  it('should give the P14 incision rate from 1/yr and m^2 (Howard & Kerby 1983)', () => {
    const result = runBlock('stream_power', { coefficient: '1e-5 / yr', drainage_area: '1e7 m^2', slope: '0.05', m: '0.5', n: '1' });
    expectClose(outputValue(result, 'erosion_rate'), e.value, e.relTol);
  });

  it('should give the P14 rate in m/yr from km^2 and 1/Myr (another unit system)', () => {
    const si = expected('P14', 'E');
    const result = runBlock('stream_power', { coefficient: '10 / Myr', drainage_area: '10 km^2', slope: '0.05', m: '0.5', n: '1' }, { erosion_rate: 'm/yr' });
    expectClose(outputValue(result, 'erosion_rate'), si.value, si.relTol);
  });

  it("should name K's expected dimension when E would not be a velocity", () => {
    const result = runBlock('stream_power', { coefficient: '1e-5 m/yr', drainage_area: '1e7 m^2', slope: '0.05', m: '0.5', n: '1' });
    expect(result.status).toBe('error');
    expect(result.error).toContain('coefficient: expected L^(1−2m)/T, that is yr^-1 for m = 0.5');
  });

  it('should refuse a negative slope and a non-positive area', () => {
    expect(runBlock('stream_power', { coefficient: '1e-5 / yr', drainage_area: '1e7 m^2', slope: '-0.05', m: '0.5', n: '1' }).error).toContain('slope: must be ≥ 0');
    expect(runBlock('stream_power', { coefficient: '1e-5 / yr', drainage_area: '0 m^2', slope: '0.05', m: '0.5', n: '1' }).error).toContain('drainage_area: must be > 0');
  });
});
