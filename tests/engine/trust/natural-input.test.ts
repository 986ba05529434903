import { describe, expect, it } from 'vitest';
import { EngineError, evaluateQuick } from '@/lib/engine';
import { checkBlockName } from '@/lib/engine';
import { expectClose } from '../../support/approx';

const YEAR = 365.25 * 86400; // the Julian year (CONTRACT §3)

function quickError(expr: string): EngineError {
  try {
    evaluateQuick(expr);
  } catch (error) {
    if (error instanceof EngineError) return error;
    throw error;
  }
  throw new Error(`expected "${expr}" to be refused`);
}

describe('natural input', () => {
  it('should read a as the annus, the unit ka, Ma and Ga are multiples of (Holden et al. 2011, IUPAC–IUGS)', () => {
    const rate = evaluateQuick('1 mm/a to mm/yr');
    expectClose(rate.value, 1, 1e-15);
    expectClose(evaluateQuick('5 a').si, 5 * YEAR, 1e-15);
    expectClose(evaluateQuick('1 ka to a').value, 1000, 1e-15);
  });

  it('should reserve a as a block name now that it is a unit', () => {
    expect(checkBlockName('a')).toMatch(/unit/);
  });

  it('should read ° as degrees, °C as degC, and superscript squares and cubes as powers', () => {
    expectClose(evaluateQuick('21°').si, (21 * Math.PI) / 180, 1e-15);
    expect(evaluateQuick('21°C')).toMatchObject({ value: 21, unit: 'degC', si: 294.15 });
    expect(evaluateQuick('3 m²')).toMatchObject({ value: 3, unit: 'm^2' });
    expect(evaluateQuick('2 m³')).toMatchObject({ value: 2, unit: 'm^3' });
    expect(evaluateQuick('"21°"').value).toBe('21°'); // text in quotes is left alone
  });

  it('should read a unit written after a number as 1/m as "per metre"', () => {
    expect(evaluateQuick('-0.02 1/m')).toMatchObject({ value: -0.02, unit: 'm^-1', si: -0.02 });
    expect(evaluateQuick('2 1/m^2')).toMatchObject({ value: 2, unit: 'm^-2' });
    // Not after a number: 1/m stays a division of 1 by a metre.
    expect(evaluateQuick('1/m * 3 m').value).toBe(3);
  });

  it('should refuse ± and +- with a pointer to distributions, marking the position', () => {
    const plusMinus = quickError('1.1 m^2/kyr +- 0.3 m^2/kyr');
    expect(plusMinus.message).toMatch(/normal\(/);
    expect(plusMinus.position).toBe(12);
    const sign = quickError('1.1 ± 0.3');
    expect(sign.message).toMatch(/distribution/);
    expect(sign.position).toBe(4);
  });

  it('should explain a decimal comma and point at it', () => {
    const error = quickError('2,4');
    expect(error.message).toMatch(/use a decimal point \(2\.4\)/);
    expect(error.position).toBe(1);
    // A comma between the inputs of a function stays a separator.
    expect(evaluateQuick('max(2,4)').value).toBe(4);
  });

  it('should put parser errors in plain words with the position in the text as typed', () => {
    const open = quickError('(3');
    expect(open.message).toMatch(/closing parenthesis/);
    expect(open.position).toBe(2);
    const early = quickError('3 +');
    expect(early.message).toMatch(/ends too early/);
    const unknown = quickError('3 m @ 2');
    expect(unknown.message).not.toMatch(/char \d/);
    expect(unknown.position).toBe(4);
    // Positions map back through rewrites: "°" became " deg" before the fault.
    const afterDegree = quickError('21° @');
    expect(afterDegree.position).toBe(4);
  });

  it('should explain to on a plain number instead of a raw type error', () => {
    expect(quickError('atan(2) to deg').message).toMatch(/\(atan\(x\) rad\) to deg/);
    expect(evaluateQuick('atan(1) rad to deg').value).toBeCloseTo(45, 12);
  });
});
