import { describe, expect, it } from 'vitest';
import type { BlockResult } from '@/lib/engine';
import { expectClose } from '../../support/approx';
import { outputValue, runBlock, okResult as ok } from '../../support/engine-sheets';

// Checks found missing by mutation testing (DEVELOPERS.md, "Mutation testing") for the scarp, stream-power
// and advective-geotherm types. Each has an outside basis named beside it: a published table value, a
// threshold the block type documents from the literature, or an analytic identity.

// Abramowitz & Stegun (1964) Table 7.1: erf(1) = 0.8427007929, erf(2) = 0.9953222650.
const ERF_1 = 0.8427007929;
const ERF_2 = 0.995322265;

describe('scarp_forward profile: z(x) = a·erf(x/(2√(Kt))) + b·x (Hanks et al. 1984; erf from Abramowitz & Stegun 1964, Table 7.1)', () => {
  // K = 1 m²/kyr over 1 kyr: Kt = 1 m², 2√(Kt) = 2 m; a half-width of 200 m puts nodes every 2 m.
  const inputs = { vertical_offset: '4 m', far_field_slope: '0.05', diffusivity: '1 m^2/kyr', age: '1 kyr', half_width: '200 m' };

  it('should tabulate z at x = 2√(Kt) and 4√(Kt) from erf(1) and erf(2), with the far-field slope added', () => {
    const profile = ok(runBlock('scarp_forward', inputs)).series!.profile!;
    expect(profile.x).toHaveLength(201);
    expect(profile.x[0]).toBeCloseTo(-200, 9);
    expect(profile.x[200]).toBeCloseTo(200, 9);
    expect(profile.x[101]).toBeCloseTo(2, 9);
    expectClose(profile.y[101]!, 2 * ERF_1 + 0.05 * 2, 1e-9);
    expectClose(profile.y[102]!, 2 * ERF_2 + 0.05 * 4, 1e-9);
    expect(profile.y[100]).toBeCloseTo(0, 12);
    expect([profile.xUnit, profile.yUnit]).toEqual(['m', 'm']);
  });

  it('should be odd about the midpoint: z(−x) = −z(x) (erf is odd; symmetry)', () => {
    const profile = ok(runBlock('scarp_forward', inputs)).series!.profile!;
    for (const i of [0, 37, 90, 99]) expectClose(profile.y[200 - i]!, -profile.y[i]!, 1e-12);
  });

  it('should default the half-width to 4√(Kt) + 2a, as its help says', () => {
    const { half_width: _unused, ...rest } = inputs;
    void _unused;
    const profile = ok(runBlock('scarp_forward', rest)).series!.profile!;
    expectClose(profile.x[200]!, 4 * 1 + 2 * 2, 1e-12);
    expectClose(profile.x[0]!, -8, 1e-12);
  });

  it('should warn below 1 kyr only (Kogan & Bendick 2011): none at exactly 1 kyr for a gentle scarp', () => {
    const gentle = { ...inputs, vertical_offset: '1 m' }; // tan θ = 0.5/√π + 0.05 ≈ 0.33
    expect(ok(runBlock('scarp_forward', gentle)).warnings).toEqual([]);
    const young = ok(runBlock('scarp_forward', { ...gentle, age: '999 yr' })).warnings;
    expect(young).toEqual([expect.stringMatching(/Age below 1 kyr.*Kogan & Bendick 2011/)]);
  });

  it('should warn for a maximum slope from 0.6 on (Roering et al. 1999), naming the slope', () => {
    // a/√(πKt) = 1/√π ≈ 0.564 plus b = 0.1 gives tan θ ≈ 0.664.
    const steep = ok(runBlock('scarp_forward', { ...inputs, vertical_offset: '2 m', far_field_slope: '0.1' }));
    expectClose(outputValue(steep, 'max_slope'), 1 / Math.sqrt(Math.PI) + 0.1, 1e-12);
    expect(steep.warnings).toEqual([expect.stringMatching(/^Maximum slope 0\.664 ≥ 0\.6.*Roering et al\. 1999/)]);
  });
});

describe('scarp_age thresholds (Kogan & Bendick 2011; Roering et al. 1999) and its refusal', () => {
  it('should warn for a maximum slope of exactly 0.6 and give Kt = a²/(π(tanθ − b)²) (Hanks et al. 1984)', () => {
    const result = ok(runBlock('scarp_age', { vertical_offset: '2 m', far_field_slope: '0', max_slope: '0.6', diffusivity: '1 m^2/kyr' }));
    expectClose(outputValue(result, 'kt'), 1 / (Math.PI * 0.36), 1e-12);
    expect(result.warnings.some((w) => /≥ 0\.6/.test(w))).toBe(true);
  });

  it('should not warn for an age of exactly 1 kyr, and warn just below it', () => {
    // Kt = a²/(π tan²θ) = 1 m² for a = 1 m, tan θ = 1/√π; K = 1 m²/kyr gives 1 kyr.
    const base = { vertical_offset: '2 m', far_field_slope: '0', max_slope: String(1 / Math.sqrt(Math.PI)) };
    const oneKyr = ok(runBlock('scarp_age', { ...base, diffusivity: '1 m^2/kyr' }));
    expectClose(outputValue(oneKyr, 'age'), 1, 1e-12);
    expect(oneKyr.warnings.filter((w) => /1 kyr/.test(w))).toEqual([]);
    const younger = ok(runBlock('scarp_age', { ...base, diffusivity: '1.01 m^2/kyr' }));
    expect(younger.warnings).toEqual([expect.stringMatching(/^Age below 1 kyr.*Kogan & Bendick 2011/)]);
  });

  it('should refuse a maximum slope equal to the far-field slope (no diffusive age fits: tanθ − b = 0)', () => {
    const result = runBlock('scarp_age', { vertical_offset: '2 m', far_field_slope: '0.1', max_slope: '0.1', diffusivity: '1 m^2/kyr' });
    expect(result.status).toBe('error');
    expect(result.error).toMatch(/max_slope: must be steeper than the far-field slope \(0\.1000 ≤ 0\.1000\)/);
  });
});

describe('stream_power and steady_state_channel: concavity range and the dimension of K (Whipple & Tucker 1999)', () => {
  const power = (m: string, n: string, coefficient = '1e-5 1/yr'): BlockResult =>
    runBlock('stream_power', { coefficient, drainage_area: '1e6 m^2', slope: '0.1', m, n });

  it('should accept m/n at both ends of the commonly reported 0.35–0.6 without a warning, and warn outside', () => {
    // K in m^(1−2m)/yr: m = 0.35 → m^0.3/yr; m = 0.6 → m^-0.2/yr.
    expect(ok(power('0.35', '1', '1e-5 m^0.3/yr')).warnings).toEqual([]);
    expect(ok(power('0.6', '1', '1e-5 m^-0.2/yr')).warnings).toEqual([]);
    expect(ok(power('0.3', '1', '1e-5 m^0.4/yr')).warnings).toEqual([expect.stringMatching(/m\/n = 0\.300 lies outside the commonly reported 0\.35–0\.6/)]);
    expect(ok(power('0.65', '1', '1e-5 m^-0.3/yr')).warnings).toEqual([expect.stringMatching(/m\/n = 0\.650/)]);
  });

  it('should give E = K·A^m·S^n with m = 0.5 and K in 1/yr: 1e-5·1000·0.1 m/yr = 1 mm/yr (hand calculation)', () => {
    expectClose(outputValue(ok(power('0.5', '1')), 'erosion_rate'), 1, 1e-12);
  });

  it('should give zero incision on a flat reach (S = 0 is allowed, limit)', () => {
    expect(outputValue(ok(runBlock('stream_power', { coefficient: '1e-5 1/yr', drainage_area: '1e6 m^2', slope: '0', m: '0.5', n: '1' })), 'erosion_rate')).toBe(0);
  });

  it('should name the expected unit of K for m = 0.5 (1/yr), m = 0 (m/yr) and m = 0.45 (m^0.1/yr), and the dimension given', () => {
    expect(power('0.5', '1', '1e-5 m/yr').error).toMatch(/coefficient: expected L\^\(1−2m\)\/T, that is yr\^-1 for m = 0\.5.*got a quantity of dimension L·T\^-1/);
    expect(power('0', '1', '1e-5 1/yr').error).toMatch(/that is m\/yr for m = 0\b.*dimension T\^-1/);
    expect(power('0.45', '1', '1e-5 kg/yr').error).toMatch(/that is m\^0\.1\/yr for m = 0\.45.*dimension M·T\^-1/);
    expect(power('0.5', '1', '1e-5 1/yr^2').error).toMatch(/dimension T\^-2/);
    expect(power('0.5', '1', '1e-5').error).toMatch(/dimension 1 \(dimensionless\)/);
  });

  it('should refuse K = 0 (the law needs K > 0)', () => {
    expect(power('0.5', '1', '0 1/yr').error).toMatch(/coefficient: must be > 0/);
  });

  it('should give the steepness in m^(2m/n): no unit for m = 0, m for m/n = 0.5, m^0.9 for m/n = 0.45 (Kirby & Whipple 2012)', () => {
    const channel = (m: string, n: string, coefficient: string): BlockResult =>
      ok(runBlock('steady_state_channel', { uplift_rate: '1 mm/yr', coefficient, m, n, drainage_area: '1e6 m^2' }));
    expect(channel('0', '1', '1e-3 m/yr').outputs.steepness!.unit).toBe('');
    expect(channel('0.5', '1', '1e-5 1/yr').outputs.steepness!.unit).toBe('m');
    expect(channel('0.45', '1', '1e-5 m^0.1/yr').outputs.steepness!.unit).toBe('m^0.9');
    // U/K = 1e-3/1e-5 m = 100 m; S = 100·(1e6)^−0.5 = 0.1 (round trip with E = K·A^0.5·S = U).
    expectClose(outputValue(channel('0.5', '1', '1e-5 1/yr'), 'slope'), 0.1, 1e-12);
    expect(channel('0.5', '1', '1e-5 1/yr').warnings).toEqual([]);
  });
});

describe('advective_geotherm boundary conditions (Turcotte & Schubert 2002: T(0) = T0, T(L) = TL)', () => {
  const inputs = { velocity: '1 mm/yr', thickness: '30 km', diffusivity: '1e-6 m^2/s', surface_temperature: '10 degC', base_temperature: '610 degC' };

  it('should give T0 at z = 0 and TL at z = L, whatever Pe (boundary conditions)', () => {
    for (const velocity of ['1 mm/yr', '-1 mm/yr', '0 mm/yr']) {
      expectClose(outputValue(ok(runBlock('advective_geotherm', { ...inputs, velocity, depth: '0 km' })), 'temperature_at_depth'), 10, 1e-9);
      expectClose(outputValue(ok(runBlock('advective_geotherm', { ...inputs, velocity, depth: '30 km' })), 'temperature_at_depth'), 610, 1e-9);
    }
  });

  it('should refuse a depth below the surface or beneath L, naming L in km', () => {
    expect(runBlock('advective_geotherm', { ...inputs, depth: '-1 m' }).error).toMatch(/depth: must lie between 0 and the layer thickness L \(30 km\)/);
    expect(runBlock('advective_geotherm', { ...inputs, depth: '30.001 km' }).error).toMatch(/depth: must lie between 0/);
  });

  it('should give its series in km and °C from T0 at the surface to TL at L, with no warning', () => {
    const result = ok(runBlock('advective_geotherm', inputs));
    const geotherm = result.series!.geotherm!;
    expect([geotherm.xUnit, geotherm.yUnit]).toEqual(['km', 'degC']);
    expect(geotherm.x[0]).toBe(0);
    expectClose(geotherm.x[100]!, 30, 1e-12);
    expectClose(geotherm.x[50]!, 15, 1e-12);
    expectClose(geotherm.y[0]!, 10, 1e-9);
    expectClose(geotherm.y[100]!, 610, 1e-9);
    expect(result.warnings).toEqual([]);
  });
});

describe('the dimension named when K does not fit (SI Brochure, 9th ed. 2019, Table 3: dimension symbols)', () => {
  it('should name each base dimension by its SI symbol (M, L, T, I, Θ, J, N) and mathjs angle and bit, in the order mathjs keeps', () => {
    const given = (unit: string): string | undefined =>
      runBlock('stream_power', { coefficient: `1e-5 ${unit}`, drainage_area: '1e6 m^2', slope: '0.1', m: '0.5', n: '1' }).error;
    expect(given('kg')).toMatch(/dimension M$/);
    expect(given('m^2')).toMatch(/dimension L\^2$/);
    expect(given('A/s')).toMatch(/dimension T\^-1·I$/);
    expect(given('K/s')).toMatch(/dimension T\^-1·Θ$/);
    expect(given('cd/s')).toMatch(/dimension T\^-1·J$/);
    expect(given('mol/s')).toMatch(/dimension T\^-1·N$/);
    expect(given('rad/s')).toMatch(/dimension T\^-1·angle$/);
    expect(given('bit/s')).toMatch(/dimension T\^-1·bit$/);
  });
});

describe('exponents other than n = 1 (Whipple & Tucker 1999: concavity θ = m/n)', () => {
  it('should judge the concavity m/n, not m·n: m = 0.9, n = 2 gives θ = 0.45, inside 0.35–0.6', () => {
    const power = ok(runBlock('stream_power', { coefficient: '1e-5 m^-0.8/yr', drainage_area: '1e6 m^2', slope: '0.1', m: '0.9', n: '2' }));
    expect(power.warnings).toEqual([]);
    const channel = ok(runBlock('steady_state_channel', { uplift_rate: '1 mm/yr', coefficient: '1e-5 m^-0.8/yr', m: '0.9', n: '2', drainage_area: '1e6 m^2' }));
    expectClose(outputValue(channel, 'concavity'), 0.45, 1e-12);
    expect(channel.outputs.steepness!.unit).toBe('m^0.9');
    expect(channel.warnings).toEqual([]);
  });

  it('should warn in steady_state_channel outside 0.35–0.6 and not at its ends', () => {
    const channel = (m: string, coefficient: string): BlockResult =>
      ok(runBlock('steady_state_channel', { uplift_rate: '1 mm/yr', coefficient, m, n: '1', drainage_area: '1e6 m^2' }));
    expect(channel('0.35', '1e-5 m^0.3/yr').warnings).toEqual([]);
    expect(channel('0.6', '1e-5 m^-0.2/yr').warnings).toEqual([]);
    expect(channel('0.3', '1e-5 m^0.4/yr').warnings).toEqual([expect.stringMatching(/m\/n = 0\.300 lies outside/)]);
    expect(channel('0.65', '1e-5 m^-0.3/yr').warnings).toEqual([expect.stringMatching(/m\/n = 0\.650 lies outside/)]);
  });

  it('should refuse K with a mass in it even when its length and time fit (m = 0.5: kg/yr)', () => {
    expect(runBlock('stream_power', { coefficient: '1e-5 kg/yr', drainage_area: '1e6 m^2', slope: '0.1', m: '0.5', n: '1' }).error).toMatch(/dimension M·T\^-1$/);
  });
});

describe('advective_geotherm at |Pe| = 1000 (no overflow; limits of the closed form)', () => {
  const inputs = { thickness: '30 km', diffusivity: '1e-6 m^2/s', surface_temperature: '10 degC', base_temperature: '610 degC', depth: '15 km' };
  // v = Pe·κ/L: Pe = 1000 needs v = 1000·1e-6/3e4 m/s = 3.333e-5 m/s.
  it('should give T → TL at mid-depth for strong exhumation and T → T0 for strong burial (boundary layers)', () => {
    const up = ok(runBlock('advective_geotherm', { ...inputs, velocity: `${1000 * 1e-6 / 3e4} m/s` }));
    expectClose(outputValue(up, 'Pe'), 1000, 1e-9);
    expectClose(outputValue(up, 'temperature_at_depth'), 610, 1e-12);
    const down = ok(runBlock('advective_geotherm', { ...inputs, velocity: `${-1000 * 1e-6 / 3e4} m/s` }));
    expectClose(outputValue(down, 'Pe'), -1000, 1e-9);
    expectClose(outputValue(down, 'temperature_at_depth'), 10, 1e-12);
    expect(down.series!.geotherm!.y.every(Number.isFinite)).toBe(true);
    expect(up.series!.geotherm!.y.every(Number.isFinite)).toBe(true);
  });
});

describe('cosmogenic_denudation saturation message (Lal 1991: N_sat = P/λ)', () => {
  it('should state P/N, λ and N_sat in SI: P = 4 atoms/(g yr), λ = 1e-6 /yr, N = 5e6 atoms/g', () => {
    const result = runBlock('cosmogenic_denudation', { production_rate: '4 atoms/(g yr)', density: '2.7 g/cm^3', attenuation_length: '160 g/cm^2', decay_constant: '1e-6 /yr', concentration: '5e6 atoms/g' });
    // P/N = 8e-7 /yr = 2.535e-14 /s; λ = 3.169e-14 /s; P/λ = 4e6 per g = 4e9 per kg (Julian year, 31 557 600 s).
    expect(result.error).toContain('P/N = 2.535e-14 /s ≤ λ = 3.169e-14 /s, N ≥ P/λ = 4.000e+9 per kg');
  });
});
