import { describe, expect, it } from 'vitest';
import { MAX_DATASET_ROWS, SECONDS_PER_YEAR, estimatedRows, median, series, short } from '@/lib/engine/blocks/data-shared';

// The small facts the three data-driven block types share.
const SHA = 'ab'.repeat(32);

describe('data-shared helpers', () => {
  it('should use the Julian year of 365.25 days (IAU; CONTRACT §3)', () => {
    expect(SECONDS_PER_YEAR).toBe(31_557_600);
  });

  it('should take the median as the middle value, or the mean of the two middle values (common practice)', () => {
    expect(median([5, 1, 3])).toBe(3);
    expect(median([4, 1, 3, 2])).toBe(2.5);
    expect(median([10, -2])).toBe(4);
    expect(median([7])).toBe(7);
    expect(median(new Float64Array([3, 30, 2, 20, 1]))).toBe(3);
    expect(median([])).toBeNaN();
  });

  it('should leave the caller’s list in its order', () => {
    const values = [3, 1, 2];
    median(values);
    expect(values).toEqual([3, 1, 2]);
  });

  it('should print 4 significant digits without trailing noise, and 0 as 0', () => {
    expect(short(0)).toBe('0');
    expect(short(1234.5678)).toBe('1235');
    expect(short(0.1 + 0.2)).toBe('0.3');
    expect(short(-2.5)).toBe('-2.5');
    expect(short(1.23456e-9)).toBe('1.235e-9');
    expect(short(6.02214e23)).toBe('6.022e+23');
  });

  it('should copy typed arrays into plain lists with their labels', () => {
    const labels = { xLabel: 'Distance', yLabel: 'Elevation', xUnit: 'm', yUnit: 'm' };
    const s = series(new Float64Array([0, 1]), [2, 3], labels);
    expect(s).toEqual({ x: [0, 1], y: [2, 3], ...labels });
    expect(Array.isArray(s.x)).toBe(true);
  });

  it('should estimate the rows of a data input: the caller’s count, the largest allowed, or none', () => {
    const text = `dataset("${SHA}")`;
    expect(estimatedRows(undefined)).toBeNull();
    expect(estimatedRows('dataset("nothex")')).toBeNull();
    expect(estimatedRows(text)).toBe(MAX_DATASET_ROWS);
    expect(MAX_DATASET_ROWS).toBe(20_000);
    expect(estimatedRows(text, (sha) => (sha === SHA ? 321 : undefined))).toBe(321);
    expect(estimatedRows(text, () => undefined)).toBeNull();
  });
});
