import { describe, expect, it } from 'vitest';
import { formatNumber, locateMessage } from '@/lib/sheet/format';

describe('formatNumber', () => {
  it('should keep six significant figures and use exponents for extreme sizes', () => {
    expect(formatNumber(0.950642634421)).toBe('0.950643');
    expect(formatNumber(1.5844043907e-11)).toBe('1.5844e-11');
    expect(formatNumber(12916.1525152)).toBe('12916.2');
    expect(formatNumber(2.5e7)).toBe('2.5e+7');
    expect(formatNumber(0)).toBe('0');
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
