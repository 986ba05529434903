import { describe, expect, it } from 'vitest';
import { expectClose } from '../../support/approx';
import { outputValue, runBlock } from '../../support/engine-sheets';
import { expected } from '../../support/reference-cases';

// Reference case P15: Whipple & Tucker (1999); Flint (1974) WRR 10:969; Kirby & Whipple (2012) —
// S = (U/K)^(1/n)·A^(−m/n), k_s = (U/K)^(1/n) in m^(2m/n), θ = m/n.
describe('steady_state_channel', () => {
  const inputs = { uplift_rate: '0.5 mm/yr', coefficient: '2e-6 m^0.1/yr', m: '0.45', n: '1', drainage_area: '50 km^2' };

  it('should give the P15 slope, steepness in m^0.9 and concavity (Whipple & Tucker 1999; Flint 1974)', () => {
    const result = runBlock('steady_state_channel', inputs);
    const s = expected('P15', 'S');
    const ks = expected('P15', 'k_s');
    const theta = expected('P15', 'theta');
    expectClose(outputValue(result, 'slope'), s.value, s.relTol);
    expectClose(outputValue(result, 'steepness'), ks.value, ks.relTol);
    expect(result.outputs.steepness!.unit).toBe('m^0.9');
    expectClose(outputValue(result, 'concavity'), theta.value, theta.relTol);
  });

  it('should give the P15 slope from m/Myr, m^0.1/Myr and m^2 (another unit system)', () => {
    const s = expected('P15', 'S');
    const result = runBlock('steady_state_channel', { ...inputs, uplift_rate: '500 m/Myr', coefficient: '2 m^0.1/Myr', drainage_area: '5e7 m^2' });
    expectClose(outputValue(result, 'slope'), s.value, s.relTol);
  });

  it('should refuse a non-positive uplift rate', () => {
    const result = runBlock('steady_state_channel', { ...inputs, uplift_rate: '0 mm/yr' });
    expect(result.status).toBe('error');
    expect(result.error).toContain('uplift_rate: must be > 0');
  });

  it('should refuse an erodibility whose dimension does not fit m', () => {
    const result = runBlock('steady_state_channel', { ...inputs, coefficient: '2e-6 / yr' });
    expect(result.error).toContain('m^0.1/yr for m = 0.45');
  });
});
