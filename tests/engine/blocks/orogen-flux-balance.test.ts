import { describe, expect, it } from 'vitest';
import { expectClose } from '../../support/approx';
import { outputValue, runBlock } from '../../support/engine-sheets';
import { checkCaseBothSystems } from '../../support/tectonic-cases';

// Willett & Brandon (2002) Geology 30:175 (flux steady state); Whipple & Meade (2004) JGR 109:F01011;
// Dahlen (1990) Annu. Rev. Earth Planet. Sci. 18:55 (self-similar wedge). The response time is derived
// from the flux balance (FORMULAS §10). Reference cases P28–P29.
describe('orogen_flux_balance', () => {
  const p28 = { convergence_rate: '10 mm/yr', accreted_thickness: '5 km', erosion_rate: '0.8 mm/yr', width: '60 km', taper: '0.175' };

  it('should reproduce P28, a near-steady orogen within the default 10 % (Willett & Brandon 2002), in case and SI units', () => {
    checkCaseBothSystems('P28');
  });

  it('should reproduce P29, a growing orogen with a taper given as an angle (tan 12°), in case and SI units', () => {
    checkCaseBothSystems('P29');
  });

  it('should give P28 from m/yr, metres and m/Myr (a third unit system) and m^2/yr = km^2/Myr', () => {
    const result = runBlock(
      'orogen_flux_balance',
      { convergence_rate: '0.01 m/yr', accreted_thickness: '5000 m', erosion_rate: '800 m/Myr', width: '60000 m', taper: '0.175' },
      { influx: 'm^2/yr' },
    );
    expectClose(outputValue(result, 'influx'), 50, 1e-12);
    expectClose(outputValue(result, 'steady_width'), 62.5, 1e-12);
    expectClose(outputValue(result, 'response_time'), 13.671875, 1e-12);
  });

  it('should make the response time the e-folding time of the nonlinear balance near steady state (derived; checked by integrating dW/dt = (F_a − Ē·W)/(t·W))', () => {
    // Integrate the wedge balance with RK4 from W = 1.001·W_ss and find when the excess falls to 1/e.
    const fa = 50; // km^2/Myr
    const e = 0.8; // km/Myr
    const taper = 0.175;
    const wss = fa / e;
    const tau = outputValue(runBlock('orogen_flux_balance', p28), 'response_time');
    const rate = (w: number) => (fa - e * w) / (taper * w);
    let w = wss * 1.001;
    let t = 0;
    const dt = 1e-3;
    while (w - wss > (0.001 * wss) / Math.E) {
      const k1 = rate(w);
      const k2 = rate(w + (dt * k1) / 2);
      const k3 = rate(w + (dt * k2) / 2);
      const k4 = rate(w + dt * k3);
      w += (dt * (k1 + 2 * k2 + 2 * k3 + k4)) / 6;
      t += dt;
    }
    expectClose(t, tau, 2e-3);
  });

  it('should call the regime growing, steady or decaying by the tolerance', () => {
    const regime = (erosion: string, tol?: string) =>
      runBlock('orogen_flux_balance', { ...p28, erosion_rate: erosion, ...(tol ? { steady_tolerance: tol } : {}) }).outputs.regime!.value;
    expect(regime('0.8 mm/yr')).toBe('steady');
    expect(regime('0.8 mm/yr', '0.01')).toBe('growing');
    expect(regime('0.5 mm/yr')).toBe('growing');
    expect(regime('1.2 mm/yr')).toBe('decaying');
    expect(regime('1.2 mm/yr', '0.5')).toBe('steady');
  });

  it('should leave out the response time and width change without a taper', () => {
    const { taper: _, ...noTaper } = p28;
    const result = runBlock('orogen_flux_balance', noTaper);
    expect(result.outputs.response_time).toBeUndefined();
    expect(result.outputs.width_change_rate).toBeUndefined();
    expectClose(outputValue(result, 'flux_ratio'), 0.96, 1e-12);
  });

  it('should be a function in expressions returning the flux ratio (CONTRACT §4b function form, P28)', () => {
    const result = runBlock('formula', { expr: 'orogen_flux_balance(10 mm/yr, 5 km, 0.8 mm/yr, 60 km)' });
    expect(result.status, result.error).toBe('ok');
    expectClose(result.outputs.value!.value, 0.96, 1e-12);
    expect(result.outputs.value!.unit).toBe('');
  });

  describe('errors', () => {
    const cases: [string, Record<string, string>, string][] = [
      ['v ≤ 0', { convergence_rate: '0 mm/yr' }, 'convergence_rate: must be > 0'],
      ['h ≤ 0', { accreted_thickness: '-5 km' }, 'accreted_thickness: must be > 0'],
      ['Ē ≤ 0', { erosion_rate: '0 mm/yr' }, 'erosion_rate: must be > 0'],
      ['W ≤ 0', { width: '0 km' }, 'width: must be > 0'],
      ['taper ≤ 0', { taper: '0' }, 'taper: must be > 0'],
      ['a negative taper angle', { taper: '-5 deg' }, 'taper: must be > 0'],
      ['tol ≥ 1', { steady_tolerance: '1' }, 'steady_tolerance: must be 0 ≤ tol < 1'],
      ['tol < 0', { steady_tolerance: '-0.1' }, 'steady_tolerance: must be 0 ≤ tol < 1'],
    ];
    for (const [label, change, message] of cases) {
      it(`should refuse ${label}`, () => {
        const result = runBlock('orogen_flux_balance', { ...p28, ...change });
        expect(result.status).toBe('error');
        expect(result.error).toContain(message);
      });
    }
  });

  describe('warnings', () => {
    it('should warn when the flux ratio is above 100 or below 0.01 (a units slip)', () => {
      expect(runBlock('orogen_flux_balance', { ...p28, erosion_rate: '0.8 m/yr' }).warnings.join(' ')).toContain('a units slip is likely');
      expect(runBlock('orogen_flux_balance', { ...p28, erosion_rate: '0.8 um/yr' }).warnings.join(' ')).toContain('a units slip is likely');
      expect(runBlock('orogen_flux_balance', p28).warnings).toEqual([]);
    });
  });
});
