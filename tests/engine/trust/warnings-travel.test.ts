import { describe, expect, it } from 'vitest';
import { evaluateQuick, evaluateSheet } from '@/lib/engine';
import { block, runBlock, sheet } from '../../support/engine-sheets';

describe('warnings of block types called as functions', () => {
  it('should carry scarp_age warnings from a formula to its block, naming the function', () => {
    // The block form warns for a 40° maximum slope (Roering et al. 1999) and an age under 1 kyr
    // (Kogan & Bendick 2011); the same call in a formula must say the same.
    const asBlock = runBlock('scarp_age', { vertical_offset: '1 m', max_slope: '40 deg', diffusivity: '10 m^2/kyr' });
    expect(asBlock.warnings.length).toBe(2);
    const results = evaluateSheet(sheet([block('age', 'formula', { expr: 'scarp_age(1 m, 0, 40 deg, 10 m^2/kyr)' })]));
    const warnings = results.blocks.age!.warnings;
    expect(warnings).toHaveLength(2);
    for (const warning of warnings) expect(warning).toMatch(/^expr: scarp_age\(…\): /);
    expect(warnings.map((w) => w.replace(/^expr: scarp_age\(…\): /, ''))).toEqual(asBlock.warnings);
  });

  it('should return warnings with a quick calculation', () => {
    expect(evaluateQuick('scarp_age(1 m, 0, 40 deg, 10 m^2/kyr)').warnings).toHaveLength(2);
    expect(evaluateQuick('hilltop_erosion(0.005 m^2/yr, 0.01 1/m)').warnings[0]).toMatch(/hilltop_erosion/);
    expect(evaluateQuick('transport_capacity(0.01, 30000 m^2/yr, -0.01)').warnings[0]).toMatch(/reverse|negative/i);
    expect(evaluateQuick('2 m + 3 m').warnings).toEqual([]);
  });

  it('should warn when degrees were forgotten in a quick calculation (25 read as a gradient)', () => {
    const answer = evaluateQuick('scarp_age(2 m, 0, 25, 1 m^2/kyr) to yr');
    expect(answer.warnings.some((w) => /did you mean degrees\? Write 25 deg/.test(w))).toBe(true);
  });

  it('should carry warnings from a function in a block input', () => {
    const results = evaluateSheet(
      sheet([block('lower', 'denudation_conversion', { rate: '0.1 mm/yr * scarp_age(1 m, 0, 40 deg, 10 m^2/kyr) / scarp_age(1 m, 0, 40 deg, 10 m^2/kyr)', density: '2650 kg/m^3' })]),
    );
    expect(results.blocks.lower!.status).toBe('ok');
    expect(results.blocks.lower!.warnings.some((w) => w.startsWith('rate: scarp_age(…)'))).toBe(true);
  });
});
