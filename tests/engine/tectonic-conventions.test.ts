import { describe, expect, it } from 'vitest';
import { checkBlockName, evaluateQuick } from '@/lib/engine';
import { reservedNameReason } from '@/lib/engine/expression';
import { textInputWords } from '@/lib/engine/text-words';
import { expectClose } from '../support/approx';
import { block, runBlock, sheet } from '../support/engine-sheets';
import { evaluateSheet } from '@/lib/engine';

// CONTRACT §4b conventions: text inputs as quoted strings, the atoms unit and the at/g trap, reserved names.
describe('tectonic and field-method conventions (CONTRACT §4b)', () => {
  describe('the atoms unit', () => {
    it('should be dimensionless, with atom as an alias: 2.4e5 atoms/g equals 2.4e5 / g', () => {
      const a = evaluateQuick('2.4e5 atoms/g to kg^-1');
      expect(a.value).toBe(2.4e8);
      expect(evaluateQuick('3 atom').value).toBe(3);
      expect(evaluateQuick('(2.4e5 atoms/g) / (2.4e5 / g)').value).toBe(1);
    });

    it('should leave at (attotonne) as mathjs has it, so 2.4e5 at/g is the plain number 2.4e-7 (the trap)', () => {
      expectClose(evaluateQuick('2.4e5 at/g').value, 2.4e-7, 1e-12);
    });
  });

  describe('text inputs', () => {
    it('should know the words of the faulting and plate inputs', () => {
      for (const word of ['broken', 'continuous', 'normal', 'reverse', 'strike-slip', 'strike_slip', 'thrust']) expect(textInputWords().has(word), word).toBe(true);
    });

    it('should say to write a bare word in double quotes in a quick calculation', () => {
      expect(() => evaluateQuick('plate_flexure(2e12 N/m, 34 km, 1000 kg/m^3, 3300 kg/m^3, 70 GPa, 0.25, broken)')).toThrow(
        'write the word in double quotes, such as "broken"',
      );
      expect(() => evaluateQuick('plate_flexure(2e12 N/m, 34 km, 1000 kg/m^3, 3300 kg/m^3, 70 GPa, 0.25, "broken")')).not.toThrow();
    });

    it('should say so for any bare word in a text input, even one that is not a choice', () => {
      const result = runBlock('plate_flexure', { line_load: '2e12 N/m', elastic_thickness: '34 km', infill_density: '1000 kg/m^3', plate: 'cracked' });
      expect(result.error).toContain('write the word in double quotes, such as "continuous" (a bare cracked is read as a name)');
    });

    it('should accept a text input that refers to a text output upstream', () => {
      const doc = sheet([
        block('choice', 'quantities', { kind: '"broken"' }),
        block('plate', 'plate_flexure', { line_load: '1e12 N/m', elastic_thickness: '15 km', infill_density: '2400 kg/m^3', youngs_modulus: '100 GPa', plate: 'choice.kind' }),
      ]);
      const results = evaluateSheet(doc);
      expect(results.blocks.plate!.status, results.blocks.plate!.error).toBe('ok');
      expectClose(results.blocks.plate!.outputs.max_deflection!.value as number, 1865.87394267, 1e-9);
    });
  });

  describe('reserved names', () => {
    for (const name of ['radiogenic_geotherm', 'strength_envelope', 'orogen_flux_balance', 'plate_flexure', 'cosmogenic_denudation', 'closure_exhumation', 'atom', 'atoms']) {
      it(`should refuse "${name}" as a block name`, () => {
        expect(reservedNameReason(name)).not.toBeNull();
        expect(checkBlockName(name)).not.toBeNull();
      });
    }
  });
});
