import { describe, expect, it } from 'vitest';
import { expectClose } from '../../support/approx';
import { outputValue, runBlock } from '../../support/engine-sheets';
import { expected } from '../../support/reference-cases';

// Reference case P07: Beaumont, Fullsack & Hamilton (1992); Kooi & Beaumont (1994) JGR 99:12191 —
// q_eq = K_f·q_w·S.
describe('transport_capacity', () => {
  const qeq = expected('P07', 'q_eq');

  it('should give the P07 capacity in m^2/yr (Beaumont et al. 1992)', () => {
    const result = runBlock('transport_capacity', { coefficient: '0.01', discharge: '30000 m^2/yr', slope: '0.01' });
    expectClose(outputValue(result, 'capacity'), qeq.value, qeq.relTol);
  });

  it('should give the same capacity from m^2/s and an angle slope (another unit system)', () => {
    const result = runBlock('transport_capacity', { coefficient: '0.01', discharge: '(30000 / 31557600) m^2/s', slope: 'atan(0.01) * (1 rad)' });
    expectClose(outputValue(result, 'capacity'), qeq.value, 1e-9);
  });

  it('should give zero capacity and a warning for a reverse slope (common practice, FORMULAS.md §2)', () => {
    const result = runBlock('transport_capacity', { coefficient: '0.01', discharge: '30000 m^2/yr', slope: '-0.01' });
    expect(result.status).toBe('ok');
    expect(outputValue(result, 'capacity')).toBe(0);
    expect(result.warnings).toHaveLength(1);
  });

  it('should refuse a discharge that is a volume per time', () => {
    const result = runBlock('transport_capacity', { coefficient: '0.01', discharge: '30 m^3/s', slope: '0.01' });
    expect(result.status).toBe('error');
    expect(result.error).toContain('discharge: expected an area per time (L^2/T), got 30 m^3 / s');
  });
});
