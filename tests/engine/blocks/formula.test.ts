import { describe, expect, it } from 'vitest';
import { evaluateSheet } from '@/lib/engine';
import { expectClose } from '../../support/approx';
import { block, runBlock, sheet } from '../../support/engine-sheets';
import { expected } from '../../support/reference-cases';

const value = (expr: string, display?: string) => {
  const result = runBlock('formula', { expr }, display ? { value: display } : undefined);
  if (result.status !== 'ok') throw new Error(result.error);
  return result.outputs.value!.value as number;
};

describe('formula', () => {
  it('should compute the P19 Exner aggradation rate (Exner 1925; Paola & Voller 2005)', () => {
    const e = expected('P19', 'dz_dt_mm_per_yr');
    expectClose(value('-((0.03 m^2/yr - 0.05 m^2/yr) / (200 m)) / (1 - 0.35) to mm/yr'), e.value, e.relTol);
    const si = expected('P19', 'dz_dt');
    expectClose(value('-((300 cm^2/yr - 500 cm^2/yr) / (0.2 km)) / 0.65', 'm/yr'), si.value, si.relTol);
  });

  it('should compute the P13 thermal time scales (Turcotte & Schubert 2002; Carslaw & Jaeger 1959)', () => {
    const diffusive = expected('P13', 'tau_diffusive_L2_over_kappa');
    const mode1 = expected('P13', 'tau_mode1');
    const advective = expected('P13', 'tau_advective_L_over_v');
    expectClose(value('(30 km)^2 / (1e-6 m^2/s) to Myr'), diffusive.value, diffusive.relTol);
    expectClose(value('(30 km / (1 mm/yr)) to Myr'), advective.value, advective.relTol);
    const pe = 'peclet_number(1 mm/yr, 30 km, 1e-6 m^2/s)';
    expectClose(value(`((30 km)^2 / (1e-6 m^2/s)) / (pi^2 + ${pe}^2 / 4) to Myr`), mode1.value, mode1.relTol);
    expectClose(value('((30000 m)^2 / (31.5576 km^2/Myr)) / (pi^2 + 0.950642634421^2 / 4)', 'kyr'), mode1.value * 1000, mode1.relTol);
  });

  it('should compute the P16 concavity and steepness from two points (Flint 1974; Wobus et al. 2006)', () => {
    const theta = expected('P16', 'theta');
    const ks = expected('P16', 'k_s');
    const ksn = expected('P16', 'k_sn_point1');
    expectClose(value('-log(0.015 / 0.12) / log(2e8 m^2 / (2e6 m^2))'), theta.value, theta.relTol);
    expectClose(value('-log(0.015 / 0.12) / log(200 km^2 / (2 km^2))'), theta.value, theta.relTol);
    const t = theta.value;
    expectClose(value(`0.12 * (2e6)^${t}`), ks.value, ks.relTol);
    expectClose(value('number(0.12 * (2 km^2)^0.45, "m^0.9")'), ksn.value, ksn.relTol);
  });

  it('should compute the P20 FTCS stability limits (Press et al. 2007)', () => {
    const dt1 = expected('P20', 'dt_max_1D');
    const dt2 = expected('P20', 'dt_max_2D_square');
    const r = expected('P20', 'r_trial');
    expectClose(value('(1 m)^2 / (2 * 0.01 m^2/yr) to yr'), dt1.value, dt1.relTol);
    expectClose(value('(100 cm)^2 / (4 * 10 m^2/kyr)', 'yr'), dt2.value, dt2.relTol);
    expectClose(value('0.01 m^2/yr * 40 yr / (1 m)^2'), r.value, r.relTol);
  });

  it('should keep a computed unit simplified and a chosen display unit exact', () => {
    const result = runBlock('formula', { expr: '2 m * 3 m' });
    expect(result.outputs.value!.unit).toBe('m^2');
    expect(runBlock('formula', { expr: '1 km' }, { value: 'm' }).outputs.value!.value).toBe(1000);
  });

  it('should refuse a display unit of another dimension', () => {
    expect(runBlock('formula', { expr: '1 km' }, { value: 's' }).error).toContain('does not fit');
  });

  it('should refuse non-finite results', () => {
    const result = runBlock('formula', { expr: '1 / 0' });
    expect(result.status).toBe('error');
    expect(result.error).toContain('not finite');
    const results = evaluateSheet(sheet([block('p', 'quantities', { x: '0 m' }), block('q', 'formula', { expr: 'log(p.x / (1 m))' })]));
    expect(results.blocks.q!.status).toBe('error');
  });
});
