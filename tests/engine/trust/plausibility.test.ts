import { describe, expect, it } from 'vitest';
import { blockCatalog, evaluateQuick } from '@/lib/engine';
import { NO_TYPICAL_RANGE, TYPICAL_RANGES } from '@/lib/engine/typical-ranges';
import { BLOCK_TYPES } from '@/lib/engine/registry';
import { block, runBlock, sheet } from '../../support/engine-sheets';
import { evaluateSheet } from '@/lib/engine';

const FREE_FORM = new Set(['formula', 'quantities', 'note']);

describe('plausibility warnings', () => {
  it('should give every input of the surface-process types a typical range with a source', () => {
    const covered = ['hillslope_diffusion', 'hilltop_erosion', 'scarp_forward', 'scarp_age', 'transport_capacity', 'net_change', 'peclet_number', 'advective_geotherm', 'stream_power', 'steady_state_channel', 'isostatic_response', 'denudation_conversion'];
    for (const type of BLOCK_TYPES.filter((t) => covered.includes(t.id) && !FREE_FORM.has(t.id))) {
      for (const input of type.inputs) {
        const key = `${type.id}.${input.name}`;
        if (NO_TYPICAL_RANGE.has(key)) continue;
        const range = TYPICAL_RANGES[key];
        expect(range, key).toBeDefined();
        expect(range!.min).toBeLessThan(range!.max);
        expect(range!.source.length, key).toBeGreaterThan(5);
      }
    }
  });

  it('should warn, naming the range, for a diffusivity far beyond it (1e308 m^2/kyr)', () => {
    const result = runBlock('hillslope_diffusion', { diffusivity: '1e308 m^2/kyr', curvature: '-0.01 1/m' });
    expect(result.status).toBe('ok');
    expect(result.warnings[0]).toMatch(/diffusivity = .* typical range 1e-4 to 5e-2 m\^2\/yr/);
  });

  it('should not warn just inside the factor of 100, nor for zero or defaults', () => {
    // 5e-2 m^2/yr × 99 is inside the allowance.
    expect(runBlock('hillslope_diffusion', { diffusivity: '4.95 m^2/yr', curvature: '-0.01 1/m' }).warnings).toEqual([]);
    expect(runBlock('hillslope_diffusion', { diffusivity: '5.05 m^2/yr', curvature: '-0.01 1/m' }).warnings).toHaveLength(1);
    expect(runBlock('hillslope_diffusion', { diffusivity: '0.004 m^2/yr', curvature: '0 1/m' }).warnings).toEqual([]);
  });

  it('should ask "did you mean degrees?" for a bare channel slope above 0.3', () => {
    const capacity = runBlock('transport_capacity', { coefficient: '0.01', discharge: '30000 m^2/yr', slope: '2' });
    expect(capacity.warnings[0]).toMatch(/did you mean degrees\? Write 2 deg/);
    const power = runBlock('stream_power', { coefficient: '1e-5 /yr', drainage_area: '10 km^2', slope: '3', m: '0.5', n: '1' });
    expect(power.warnings[0]).toMatch(/did you mean degrees/);
    // Written as an angle, or a gradient under 0.3: no question.
    expect(runBlock('transport_capacity', { coefficient: '0.01', discharge: '30000 m^2/yr', slope: '2 deg' }).warnings).toEqual([]);
    expect(runBlock('transport_capacity', { coefficient: '0.01', discharge: '30000 m^2/yr', slope: '0.01' }).warnings).toEqual([]);
  });

  it('should refuse angles of 90° or more instead of wrapping through tan', () => {
    for (const angle of ['90 deg', '100 deg', '-95 deg']) {
      const result = runBlock('transport_capacity', { coefficient: '0.01', discharge: '30000 m^2/yr', slope: angle });
      expect(result.status).toBe('error');
      expect(result.error).toMatch(/90°/);
    }
    expect(runBlock('transport_capacity', { coefficient: '0.01', discharge: '30000 m^2/yr', slope: '89 deg' }).status).toBe('ok');
  });

  it('should refuse a negative capacity or flux in net_change with the reason', () => {
    expect(() => evaluateQuick('net_change(-1 m^2/yr, 0 m^2/yr, 1 km)')).toThrow(/capacity: must be ≥ 0 \(a transport capacity is a magnitude/);
    const result = runBlock('net_change', { capacity: '1 m^2/yr', flux: '-2 m^2/yr', length_scale: '1 km' });
    expect(result.status).toBe('error');
    expect(result.error).toMatch(/flux: must be ≥ 0/);
  });

  it('should give no plausibility warning on any registry worked example (public reference cases)', () => {
    for (const type of blockCatalog()) {
      if (!type.example) continue;
      const results = evaluateSheet(sheet([block('subject', type.id, type.example.inputs)]));
      const warnings = results.blocks.subject?.warnings ?? [];
      expect(warnings.filter((w) => /typical range|did you mean degrees/.test(w)), `${type.id}: ${type.example.source}`).toEqual([]);
    }
  });
});
