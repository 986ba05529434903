import { describe, expect, it } from 'vitest';
import { formatNumber, formatSlope, locateMessage } from '@/lib/sheet/format';

describe('formatNumber', () => {
  it('should keep six significant figures and use exponents for extreme sizes', () => {
    expect(formatNumber(0.950642634421)).toBe('0.950643');
    expect(formatNumber(1.5844043907e-11)).toBe('1.5844e-11');
    expect(formatNumber(12916.1525152)).toBe('12916.2');
    expect(formatNumber(2.5e7)).toBe('2.5e+7');
    expect(formatNumber(0)).toBe('0');
  });
});

describe('formatNumber with the sheet\'s significant figures (CONTRACT §6b)', () => {
  it('should round to the figures asked for, in both the plain and the exponent form', () => {
    // P12's Péclet number, Turcotte & Schubert 2002: 0.950642634421.
    expect(formatNumber(0.950642634421, 4)).toBe('0.9506');
    expect(formatNumber(0.950642634421, 2)).toBe('0.95');
    expect(formatNumber(0.950642634421, 8)).toBe('0.95064263');
    expect(formatNumber(12916.1525152, 4)).toBe('12920');
    expect(formatNumber(8.9242e10, 4)).toBe('8.924e+10');
    expect(formatNumber(1.5844043907e-11, 3)).toBe('1.58e-11');
    expect(formatNumber(2.5e7, 4)).toBe('2.5e+7');
  });
});

describe('formatSlope', () => {
  it('should show a gradient with its angle: tan 20° = 0.36397 (common practice), 1 = 45°', () => {
    expect(formatSlope(0.363970234266, 4)).toBe('0.364 (20°)');
    expect(formatSlope(1, 4)).toBe('1 (45°)');
    expect(formatSlope(0.05, 3)).toBe('0.05 (2.86°)');
    expect(formatSlope(-0.1, 4)).toBe('-0.1 (-5.711°)');
  });
});

describe('locateMessage', () => {
  it('should point an engine message at the input it names', () => {
    expect(locateMessage('block "pe", velocity: expected a velocity (length per time), got m', ['velocity', 'length'])).toEqual({
      input: 'velocity',
      text: 'expected a velocity (length per time), got m',
    });
  });

  it('should point a display-unit message at its output', () => {
    expect(locateMessage('block "pe", display unit for Pe: the output is dimensionless, so m does not apply', ['velocity'])).toEqual({
      output: 'Pe',
      text: 'the output is dimensionless, so m does not apply',
    });
  });

  it('should leave other messages on the block', () => {
    expect(locateMessage('waiting on block "params", which has an error', ['velocity'])).toEqual({ text: 'waiting on block "params", which has an error' });
  });
});
