import { describe, expect, it } from 'vitest';
import { evaluateSheet, type BlockResult } from '@/lib/engine';
import { expectClose } from '../support/approx';
import { block, outputValue, runBlock, sheet } from '../support/engine-sheets';

// Checks that would fail if a formula were wrong, one block type at a time, for the fourteen calculation
// types of the first release (and the note). Each check is one of:
//   - a value printed in a published table, textbook or standard (source beside it; "from memory" where the
//     number is recalled rather than copied), or
//   - an analytic identity where no published number for the block exists: a limit, a symmetry, or a round
//     trip between a forward and an inverse type. Said so beside each such check.
// The per-block test files hold the independent recomputations of reference/cases.json; this file adds the
// outside anchors. The six deliberate formula mutations of issue 9 are each killed by a test named
// "kills mutation: …" below (DEVELOPERS.md lists them with the mutation score).

const si = (result: BlockResult, output: string): number => {
  if (result.status !== 'ok') throw new Error(`block ${result.status}: ${result.error}`);
  const value = result.outputs[output]?.si;
  if (typeof value !== 'number') throw new Error(`output ${output} missing or not numeric`);
  return value;
};
const text = (result: BlockResult, output: string): string => String(result.outputs[output]?.value);

describe('quantities (published conversion factors)', () => {
  it('should carry exact SI factors: mile, foot and inch (NIST SP 811, 2008, Appendix B.8)', () => {
    const result = runBlock('quantities', { mile: '1 mi', foot: '1 ft', inch: '1 inch' });
    // NIST Special Publication 811 (Thompson & Taylor 2008), B.8: mile (international) = 1.609344 E+03 m,
    // foot = 3.048 E-01 m, inch = 2.54 E-02 m, all exact.
    expectClose(si(result, 'mile'), 1609.344, 1e-12);
    expectClose(si(result, 'foot'), 0.3048, 1e-12);
    expectClose(si(result, 'inch'), 0.0254, 1e-12);
  });

  it('should take the Julian year of 365.25 d = 31 557 600 s (IAU 1976 system of astronomical constants)', () => {
    expectClose(si(runBlock('quantities', { year: '1 yr' }), 'year'), 31_557_600, 1e-12);
  });
});

describe('formula (published function table)', () => {
  it('should reproduce erf at tabulated points (Abramowitz & Stegun 1964, Table 7.1)', () => {
    // A&S Table 7.1: erf(0.5) = 0.52049 98778, erf(1.0) = 0.84270 07929, erf(2.0) = 0.99532 22650.
    expectClose(outputValue(runBlock('formula', { expr: 'erf(0.5)' }), 'value'), 0.5204998778, 1e-9);
    expectClose(outputValue(runBlock('formula', { expr: 'erf(1)' }), 'value'), 0.8427007929, 1e-9);
    expectClose(outputValue(runBlock('formula', { expr: 'erf(2)' }), 'value'), 0.995322265, 1e-9);
  });

  it('should carry units through arithmetic: 1 mm/yr is 1 km/Myr (identity of the units; common practice)', () => {
    const result = runBlock('formula', { expr: '1 mm/yr' }, { value: 'km/Myr' });
    expectClose(outputValue(result, 'value'), 1, 1e-12);
  });
});

describe('note (no calculation)', () => {
  it('should compute nothing: no published number applies; it has no result and a reference to it is refused', () => {
    const results = evaluateSheet(sheet([block('context', 'note', {}, { note: 'Field notes, no numbers.' }), block('calc', 'formula', { expr: 'context.value * 2' })]));
    expect(results.blocks.context).toBeUndefined();
    expect(results.blocks.calc?.status).toBe('error');
    expect(results.blocks.calc?.error).toMatch(/is a note and has no outputs/);
  });
});

describe('hillslope_diffusion and hilltop_erosion (analytic identities; no published table of these numbers)', () => {
  // No published worked number is copied here; the relation dz/dt = K·C (Culling 1960) is checked by
  // identities: the steady-state balance U + K·C = 0 ties the two types together (Roering, Perron &
  // Kirchner 2007, EPSL 264, in rock-equivalent form).
  it('should give a hilltop erosion rate equal to the lowering rate of diffusion at the same K and C (round trip)', () => {
    const K = '0.0045 m^2/yr';
    const C = '-0.021 1/m';
    const lowering = si(runBlock('hillslope_diffusion', { diffusivity: K, curvature: C }), 'lowering_rate');
    const erosion = si(runBlock('hilltop_erosion', { diffusivity: K, hilltop_curvature: C }), 'erosion_rate');
    expectClose(erosion, lowering, 1e-12);
    expectClose(erosion, (0.0045 * 0.021) / 31_557_600, 1e-12);
  });

  it('should change sign with curvature: a concave hollow (C > 0) aggrades as fast as a convex crest lowers (symmetry)', () => {
    const crest = si(runBlock('hillslope_diffusion', { diffusivity: '0.004 m^2/yr', curvature: '-0.008 1/m' }), 'dz_dt');
    const hollow = si(runBlock('hillslope_diffusion', { diffusivity: '0.004 m^2/yr', curvature: '0.008 1/m' }), 'dz_dt');
    expect(crest).toBeLessThan(0);
    expectClose(hollow, -crest, 1e-12);
  });

  it('should scale a soil-volume K by ρs/ρr: half the rate for ρs/ρr = 1/2 (Roering et al. 2007; identity)', () => {
    const rockEquivalent = si(runBlock('hilltop_erosion', { diffusivity: '0.006 m^2/yr', hilltop_curvature: '-0.02 1/m' }), 'erosion_rate');
    const soilVolume = si(
      runBlock('hilltop_erosion', { diffusivity: '0.006 m^2/yr', hilltop_curvature: '-0.02 1/m', rock_density: '2600 kg/m^3', soil_density: '1300 kg/m^3' }),
      'erosion_rate',
    );
    expectClose(soilVolume, rockEquivalent / 2, 1e-12);
  });
});

describe('scarp_forward and scarp_age (Hanks et al. 1984; forward/inverse round trip)', () => {
  it('should date a Bonneville-shoreline-like scarp: K = 1.1 m²/kyr over 15 kyr gives Kt = 16.5 m² (Hanks et al. 1984, from memory)', () => {
    // Hanks, Bucknam, Lajoie & Wallace (1984) JGR 89(B7): Lake Bonneville shoreline scarps, about 15 kyr old,
    // give κ ≈ 1.1 m²/kyr (values recalled, from memory). Kt is their product; max slope a/√(πKt) for 2a = 3 m.
    const result = runBlock('scarp_forward', { vertical_offset: '3 m', diffusivity: '1.1 m^2/kyr', age: '15 kyr' });
    expectClose(si(result, 'kt'), 16.5, 1e-12);
    expectClose(si(result, 'max_slope'), 1.5 / Math.sqrt(Math.PI * 16.5), 1e-12);
  });

  it('kills mutation: scarp profile ignoring the far-field slope b (z(x) − z_b=0(x) = b·x; max slope gains exactly b)', () => {
    const common = { vertical_offset: '4 m', diffusivity: '1 m^2/kyr', age: '10 kyr', half_width: '20 m' };
    const flat = runBlock('scarp_forward', { ...common, far_field_slope: '0' });
    const tilted = runBlock('scarp_forward', { ...common, far_field_slope: '0.05' });
    expectClose(si(tilted, 'max_slope') - si(flat, 'max_slope'), 0.05, 1e-9);
    const f = flat.series!.profile!;
    const t = tilted.series!.profile!;
    expect(t.x).toEqual(f.x);
    for (let i = 0; i < f.x.length; i += 10) expect(t.y[i]! - f.y[i]!).toBeCloseTo(0.05 * f.x[i]!, 9);
    // and the profile is odd about the midpoint (erf is odd; identity)
    expectClose(f.y[0]!, -f.y[f.y.length - 1]!, 1e-12);
  });

  it('should recover the age from the max slope that scarp_forward computed (round trip, with b ≠ 0)', () => {
    const forward = runBlock('scarp_forward', { vertical_offset: '4 m', far_field_slope: '0.05', diffusivity: '1 m^2/kyr', age: '12.5 kyr' });
    const slope = si(forward, 'max_slope');
    const inverse = runBlock('scarp_age', { vertical_offset: '4 m', far_field_slope: '0.05', max_slope: String(slope), diffusivity: '1 m^2/kyr' });
    expectClose(si(inverse, 'kt'), 12.5, 1e-9);
    expectClose(si(inverse, 'age'), 12.5e3 * 31_557_600, 1e-9);
  });

  it('should not ignore b in the inverse: Kt = a²/(π(tanθ − b)²), 26 % larger than without b (Hanks 2000; cases.json P05 note)', () => {
    const withB = si(runBlock('scarp_age', { vertical_offset: '4 m', far_field_slope: '0.05', max_slope: '20 deg', diffusivity: '1 m^2/kyr' }), 'kt');
    const withoutB = si(runBlock('scarp_age', { vertical_offset: '4 m', far_field_slope: '0', max_slope: '20 deg', diffusivity: '1 m^2/kyr' }), 'kt');
    const tan20 = Math.tan((20 * Math.PI) / 180);
    expectClose(withB, 4 / (Math.PI * (tan20 - 0.05) ** 2), 1e-12);
    expectClose(withoutB, 4 / (Math.PI * tan20 ** 2), 1e-12);
  });
});

describe('transport_capacity and net_change (Beaumont et al. 1992; Exner mass balance)', () => {
  it('should be linear in each factor: q_eq = K_f·q_w·S (identity; no published table)', () => {
    const one = si(runBlock('transport_capacity', { coefficient: '0.01', discharge: '30000 m^2/yr', slope: '0.01' }), 'capacity');
    const doubled = si(runBlock('transport_capacity', { coefficient: '0.01', discharge: '60000 m^2/yr', slope: '0.01' }), 'capacity');
    expectClose(doubled, 2 * one, 1e-12);
    expectClose(one, (0.01 * 30000 * 0.01) / 31_557_600, 1e-12);
  });

  it('kills mutation: net-change equilibrium tolerance widened (a 10 % imbalance is deposition, not equilibrium)', () => {
    const result = runBlock('net_change', { capacity: '1 m^2/yr', flux: '1.1 m^2/yr', length_scale: '1000 m' });
    expect(text(result, 'regime')).toBe('deposition');
    // (q_s − q_eq)/l_f = 0.1/1000 m/yr = 0.1 mm/yr (Exner balance, Paola & Voller 2005 eq. 1 without porosity)
    expectClose(outputValue(result, 'dz_dt'), 0.1, 1e-9);
    const eroding = runBlock('net_change', { capacity: '1.1 m^2/yr', flux: '1 m^2/yr', length_scale: '1000 m' });
    expect(text(eroding, 'regime')).toBe('erosion');
    const balanced = runBlock('net_change', { capacity: '1 m^2/yr', flux: '1 m^2/yr', length_scale: '1000 m' });
    expect(text(balanced, 'regime')).toBe('equilibrium');
    expect(si(balanced, 'dz_dt')).toBe(0);
  });

  it('should divide by (1 − φ) for a porous deposit: φ = 0.35 gives 1/0.65 of the solid rate (Paola & Voller 2005; identity)', () => {
    const solid = si(runBlock('net_change', { capacity: '0.03 m^2/yr', flux: '0.05 m^2/yr', length_scale: '200 m' }), 'dz_dt');
    const porous = si(runBlock('net_change', { capacity: '0.03 m^2/yr', flux: '0.05 m^2/yr', length_scale: '200 m', porosity: '0.35' }), 'dz_dt');
    expectClose(porous, solid / 0.65, 1e-12);
  });
});

describe('peclet_number and advective_geotherm (Turcotte & Schubert 2002, heat advection; identities)', () => {
  it('should use κ = 1e-6 m²/s = 31.5576 km²/Myr exactly, so Pe = v[km/Myr]·L[km]/31.5576 (unit identity)', () => {
    const result = runBlock('peclet_number', { velocity: '1 km/Myr', length: '31.5576 km', diffusivity: '1e-6 m^2/s' });
    expectClose(si(result, 'Pe'), 1, 1e-12);
    expect(text(result, 'regime')).toBe('advection');
    expect(text(runBlock('peclet_number', { velocity: '0.05 km/Myr', length: '31.5576 km', diffusivity: '1e-6 m^2/s' }), 'regime')).toBe('conduction');
    expect(text(runBlock('peclet_number', { velocity: '-0.5 km/Myr', length: '31.5576 km', diffusivity: '1e-6 m^2/s' }), 'regime')).toBe('transitional');
  });

  const layer = { thickness: '31.5576 km', diffusivity: '1e-6 m^2/s', surface_temperature: '0 degC', base_temperature: '600 degC' };

  it('kills mutation: geotherm made linear for |Pe| < 0.5 (at Pe = 0.4, T(L/2) lies above the conductive line)', () => {
    // Pe = 0.4: v = 0.4 km/Myr across L = 31.5576 km. T(L/2) = 600·(1 − e^(−0.2))/(1 − e^(−0.4)): the closed
    // form of steady advection–diffusion (Turcotte & Schubert 2002; FORMULAS.md §3), not a printed number.
    const result = runBlock('advective_geotherm', { ...layer, velocity: '0.4 km/Myr', depth: '15.7788 km' });
    const expected = 600 * (-Math.expm1(-0.2) / -Math.expm1(-0.4)) + 273.15;
    expectClose(si(result, 'temperature_at_depth'), expected, 1e-9);
    expect(expected - 273.15).toBeGreaterThan(300 * 1.09); // about 10 % above the line: a linear profile fails
    expectClose(si(result, 'gradient_ratio'), 0.4 / -Math.expm1(-0.4), 1e-12);
  });

  it('kills mutation: burial branch broken (symmetry T_burial(z) = T0 + TL − T_exhumation(L − z))', () => {
    // Identity of the closed form under Pe → −Pe (no published table for burial): reflect the profile.
    for (const velocity of ['0.3 km/Myr', '2 km/Myr', '20 km/Myr']) {
      const up = runBlock('advective_geotherm', { ...layer, velocity }).series!.geotherm!;
      const down = runBlock('advective_geotherm', { ...layer, velocity: `-${velocity}` }).series!.geotherm!;
      const n = up.y.length;
      for (let i = 0; i < n; i += 5) expect(down.y[i]!).toBeCloseTo(600 - up.y[n - 1 - i]!, 9);
    }
    // Strong burial: the surface gradient ratio tends to |Pe|·e^(−|Pe|) → 0 (the heat is swept down).
    const strong = runBlock('advective_geotherm', { ...layer, velocity: '-40 km/Myr' });
    expectClose(si(strong, 'gradient_ratio'), 40 / Math.expm1(40), 1e-9);
  });

  it('should tend to the conductive line as Pe → 0 and to 1 + Pe/2 for the gradient ratio (limit)', () => {
    const tiny = runBlock('advective_geotherm', { ...layer, velocity: '1e-6 km/Myr' });
    expectClose(si(tiny, 'gradient_ratio'), 1 + 0.5e-6, 1e-12);
  });
});

describe('stream_power and steady_state_channel (Howard & Kerby 1983; Whipple & Tucker 1999; round trip)', () => {
  it('kills mutation: stream power ignoring n (E ∝ S^n: doubling S multiplies E by 2^n)', () => {
    const base = { coefficient: '1e-5 1/yr', drainage_area: '1e7 m^2', m: '0.5' };
    for (const n of [1, 1.5, 2]) {
      const e1 = si(runBlock('stream_power', { ...base, n: String(n), slope: '0.05' }), 'erosion_rate');
      const e2 = si(runBlock('stream_power', { ...base, n: String(n), slope: '0.1' }), 'erosion_rate');
      expectClose(e2 / e1, 2 ** n, 1e-12);
    }
    // E = K·A^m·S^n with n = 2: 1e-5·(1e7)^0.5·0.05² m/yr (the law itself, Howard & Kerby 1983; Whipple & Tucker 1999)
    const e = si(runBlock('stream_power', { ...base, n: '2', slope: '0.05' }), 'erosion_rate');
    expectClose(e, (1e-5 * Math.sqrt(1e7) * 0.0025) / 31_557_600, 1e-12);
  });

  it('kills mutation: steady-state slope with A^−m instead of A^(−m/n) (round trip: E(S_ss) = U for n ≠ 1)', () => {
    for (const n of ['1', '2', '0.7']) {
      const inputs = { coefficient: '2e-6 m^0.1/yr', m: '0.45', n, drainage_area: '50 km^2' };
      const steady = runBlock('steady_state_channel', { ...inputs, uplift_rate: '0.5 mm/yr' });
      const slope = si(steady, 'slope');
      const incision = runBlock('stream_power', { coefficient: inputs.coefficient, m: inputs.m, n, drainage_area: inputs.drainage_area, slope: String(slope) });
      // At steady state incision balances uplift (Whipple & Tucker 1999): E = U = 0.5 mm/yr.
      expectClose(outputValue(incision, 'erosion_rate'), 0.5, 1e-9);
      expectClose(si(steady, 'concavity'), 0.45 / Number(n), 1e-12);
    }
  });

  it('should give a concavity m/n of 0.45 in the commonly reported 0.35–0.6 (Whipple & Tucker 1999; Kirby & Whipple 2012, from memory)', () => {
    const steady = runBlock('steady_state_channel', { uplift_rate: '0.5 mm/yr', coefficient: '2e-6 m^0.1/yr', m: '0.45', n: '1', drainage_area: '50 km^2' });
    expect(steady.warnings).toEqual([]);
    const outside = runBlock('steady_state_channel', { uplift_rate: '0.5 mm/yr', coefficient: '2e-6 m^0.1/yr', m: '0.45', n: '0.5', drainage_area: '50 km^2' });
    expect(outside.warnings.join(' ')).toMatch(/0\.35–0\.6/);
  });
});

describe('isostatic_response (Airy; England & Molnar 1990)', () => {
  it('should lower the mean surface by (1 − ρc/ρm) of the eroded thickness, about one sixth (England & Molnar 1990, from memory)', () => {
    // England & Molnar (1990) Geology 18: surface uplift = rock uplift − exhumation; with crust 2700 and mantle
    // 3300 kg/m³ rock uplift is ρc/ρm = 9/11 of the erosion and the mean surface drops by 2/11 (≈ 1/5.5).
    const result = runBlock('isostatic_response', { crust_density: '2700 kg/m^3', mantle_density: '3300 kg/m^3', erosion: '1100 m' });
    expectClose(si(result, 'rock_uplift'), 900, 1e-12);
    expectClose(si(result, 'surface_lowering'), 200, 1e-12);
  });

  it('should follow the density ratio: 2800/3300 gives rock uplift 0.848 of the erosion (identity; the block states it)', () => {
    const result = runBlock('isostatic_response', { crust_density: '2800 kg/m^3', mantle_density: '3300 kg/m^3', erosion: '1000 m' });
    expectClose(si(result, 'rock_uplift'), (1000 * 2800) / 3300, 1e-12);
    expectClose(si(result, 'rock_uplift') + si(result, 'surface_lowering'), 1000, 1e-12);
  });
});

describe('denudation_conversion (Milliman & Meade 1983 yield units)', () => {
  it('should convert 1 mm/yr of rock at 2650 kg/m³ to 2650 t/km²/yr (unit identity: Y[t/km²/yr] = E[mm/yr]·ρ[kg/m³])', () => {
    const result = runBlock('denudation_conversion', { rate: '1 mm/yr', density: '2650 kg/m^3' }, { mass_flux: 't/km^2/yr' });
    expectClose(outputValue(result, 'mass_flux'), 2650, 1e-12);
    const reverse = runBlock('denudation_conversion', { rate: '0.25 mm/yr', density: '2650 kg/m^3' }, { mass_flux: 't/km^2/yr' });
    expectClose(outputValue(reverse, 'mass_flux'), 662.5, 1e-12);
  });
});
