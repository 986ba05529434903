import { describe, expect, it } from 'vitest';
import { estimateProfileCost } from '@/lib/engine/blocks/profile-evolution-cost';
import { MAX_NODES } from '@/lib/engine/blocks/profile-evolution-grid';
import { MAX_DATASET_ROWS } from '@/lib/engine/blocks/data-shared';
import { estimateEvaluationCost } from '@/lib/engine/cost';
import type { SheetDocument } from '@/lib/engine';

// profile_evolution's cost estimate (CONTRACT §6b): nodes × steps / 1e4 cost units, ten times that for the
// nonlinear law, read from the inputs as written before anything is evaluated. The node counts are those of a
// uniform grid: ±W at spacing dx holds 2·W/dx + 1 nodes (common practice: a closed interval of length L cut
// into L/dx intervals has L/dx + 1 end points). Unit conversions are the SI definitions (1 cm = 0.01 m,
// 1 km = 1000 m; BIPM SI Brochure, 9th ed., 2019, prefixes).
// Every value is computed inside its test (tests/support/per-test.ts explains why).

const SHA = 'ab'.repeat(32);
const DATA = `dataset("${SHA}")`;
const cost = (inputs: Record<string, string>, datasetRows?: (sha256: string) => number | undefined) => estimateProfileCost({ inputs, datasetRows });
/** The default grid: W = 6√(Kt), dx = √(Kt)/20, so 2·120 + 1 nodes whatever K and t are. */
const DEFAULT_NODES = 2 * (6 * 20) + 1;

describe('profile_evolution cost estimate: the steps read from the text', () => {
  it('should use 100 steps when steps is not written, empty or blank (the input default)', () => {
    expect(DEFAULT_NODES).toBe(241);
    for (const steps of [undefined, '', '   ']) {
      const inputs: Record<string, string> = steps === undefined ? {} : { steps };
      expect(cost(inputs), JSON.stringify(steps)).toBeCloseTo((241 * 100) / 1e4, 12);
    }
  });

  it('should read a plain number of steps (241 nodes × 250 steps / 1e4 = 6.025)', () => {
    expect(cost({ steps: '250' })).toBeCloseTo(6.025, 12);
    expect(cost({ steps: ' 2 * 125 ' })).toBeCloseTo(6.025, 12);
  });

  it('should fall back to 100 steps when the text refers to another block or an unknown name', () => {
    expect(cost({ steps: 'grid.steps' })).toBeCloseTo(2.41, 12);
    expect(cost({ steps: 'n_steps' })).toBeCloseTo(2.41, 12);
    expect(cost({ steps: 'grid.steps * 2' })).toBeCloseTo(2.41, 12);
  });

  it('should fall back to 100 steps when the text is neither a number nor a quantity (a text in quotes)', () => {
    expect(cost({ steps: '"many"' })).toBeCloseTo(2.41, 12);
  });
});

describe('profile_evolution cost estimate: the grid of a step from dx and half_width', () => {
  it('should count 2·round(W/dx) + 1 nodes: W = 30 m, dx = 0.5 m, 10 steps → 121 × 10 / 1e4', () => {
    expect(cost({ half_width: '30 m', dx: '0.5 m', steps: '10' })).toBeCloseTo(0.121, 12);
  });

  it('should convert both lengths to metres first (W = 0.03 km = 30 m, dx = 50 cm = 0.5 m; SI prefixes)', () => {
    expect(cost({ half_width: '0.03 km', dx: '50 cm', steps: '10' })).toBeCloseTo(0.121, 12);
    // The same numbers in other units give a different grid: W = 30 cm, dx = 0.5 m → round(0.6) = 1 → 3 nodes.
    expect(cost({ half_width: '30 cm', dx: '0.5 m', steps: '10' })).toBeCloseTo(0.003, 12);
  });

  it('should round W/dx to the nearest whole number of intervals (W/dx = 3.4 → 3, 3.6 → 4)', () => {
    expect(cost({ half_width: '3.4 m', dx: '1 m', steps: '1' })).toBeCloseTo(7 / 1e4, 15);
    expect(cost({ half_width: '3.6 m', dx: '1 m', steps: '1' })).toBeCloseTo(9 / 1e4, 15);
  });

  it(`should cap the nodes at the grid limit (${MAX_NODES}): W = 1 km at dx = 1 cm would be 200 001`, () => {
    expect(cost({ half_width: '1 km', dx: '1 cm', steps: '100' })).toBeCloseTo((MAX_NODES * 100) / 1e4, 9);
    // Exactly at the limit: W = 100 m at 1 cm.
    expect(cost({ half_width: '100 m', dx: '1 cm', steps: '100' })).toBeCloseTo((20001 * 100) / 1e4, 9);
    // Below it the count is exact (not the cap).
    expect(cost({ half_width: '99.99 m', dx: '1 cm', steps: '100' })).toBeCloseTo((19999 * 100) / 1e4, 9);
  });

  it('should use the default grid unless both dx and W are given and dx > 0', () => {
    expect(cost({ dx: '0.5 m', steps: '10' })).toBeCloseTo(0.241, 12);
    expect(cost({ half_width: '30 m', steps: '10' })).toBeCloseTo(0.241, 12);
    expect(cost({ half_width: '30 m', dx: '0 m', steps: '10' })).toBeCloseTo(0.241, 12);
    expect(cost({ half_width: '30 m', dx: '-0.5 m', steps: '10' })).toBeCloseTo(0.241, 12);
    expect(cost({ half_width: '30 m', dx: '', steps: '10' })).toBeCloseTo(0.241, 12);
    expect(cost({ half_width: 'site.W', dx: '0.5 m', steps: '10' })).toBeCloseTo(0.241, 12);
  });

  it('should take a plain number for a length as metres (the estimate does not check dimensions)', () => {
    expect(cost({ half_width: '30', dx: '0.5', steps: '10' })).toBeCloseTo(0.121, 12);
  });
});

describe('profile_evolution cost estimate: a measured profile', () => {
  it('should count about one node per row without dx (the median spacing), and the grid limit with dx', () => {
    const rows = (sha256: string) => (sha256 === SHA ? 500 : undefined);
    expect(cost({ data: DATA, steps: '100' }, rows)).toBeCloseTo((500 * 100) / 1e4, 12);
    expect(cost({ data: DATA, dx: '0.5 m', steps: '100' }, rows)).toBeCloseTo((MAX_NODES * 100) / 1e4, 9);
    // half_width is not read with data (it is refused there).
    expect(cost({ data: DATA, half_width: '30 m', steps: '100' }, rows)).toBeCloseTo((500 * 100) / 1e4, 12);
  });

  it('should give no estimate when the dataset\'s size is unknown, and assume the largest dataset without a resolver', () => {
    expect(cost({ data: DATA }, () => undefined)).toBeUndefined();
    expect(cost({ data: 'dataset("not a hash")' }, () => 500)).toBeUndefined();
    expect(cost({ data: DATA, steps: '10' })).toBeCloseTo((MAX_DATASET_ROWS * 10) / 1e4, 9);
  });

  it('should treat an empty or blank data input as a step', () => {
    expect(cost({ data: '', steps: '10' }, () => 500)).toBeCloseTo(0.241, 12);
    expect(cost({ data: '  ', steps: '10' }, () => 500)).toBeCloseTo(0.241, 12);
  });
});

describe('profile_evolution cost estimate: the nonlinear law', () => {
  it('should count a nonlinear node-step as ten linear ones when critical_slope is written', () => {
    expect(cost({ half_width: '30 m', dx: '0.5 m', steps: '10', critical_slope: '1.25' })).toBeCloseTo(1.21, 12);
    expect(cost({ half_width: '30 m', dx: '0.5 m', steps: '10', critical_slope: 'site.sc' })).toBeCloseTo(1.21, 12);
    expect(cost({ half_width: '30 m', dx: '0.5 m', steps: '10', critical_slope: '' })).toBeCloseTo(0.121, 12);
    expect(cost({ half_width: '30 m', dx: '0.5 m', steps: '10', critical_slope: ' ' })).toBeCloseTo(0.121, 12);
  });

  it('should reach the sheet estimate through the block type (estimateEvaluationCost)', () => {
    const doc: SheetDocument = {
      format: 'denudata-sheet@1',
      title: 'c',
      blocks: [{ id: 'e', name: 'evo', type: 'profile_evolution', inputs: { diffusivity: '1 m^2/kyr', duration: '10 kyr', vertical_offset: '2 m', half_width: '30 m', dx: '0.5 m', steps: '10', critical_slope: '1.25', initial_slope: '0.8' } }],
    };
    expect(estimateEvaluationCost(doc)).toBeCloseTo(1.21, 9);
  });
});
