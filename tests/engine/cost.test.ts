import { describe, expect, it } from 'vitest';
import { estimateEvaluationCost, needsLongRun, SYNC_COST_LIMIT, type SheetDocument } from '@/lib/engine';

// Cost estimates of the data-driven types (CONTRACT §6b "Long runs"): an evaluation estimated above the
// synchronous limit runs as a job. The coefficients are measured (DEVELOPERS.md, "Long runs"); these tests
// pin how the estimate follows the dataset's rows and the fit's free parameters.

const SHA = 'ab'.repeat(32);
const OTHER = 'cd'.repeat(32);

function sheet(blocks: { type: string; inputs: Record<string, string> }[]): SheetDocument {
  return {
    format: 'denudata-sheet@1',
    title: 'Cost',
    blocks: blocks.map((b, i) => ({ id: `b${i}`, name: `b${i}`, ...b })),
  } as unknown as SheetDocument;
}

const fit = (x0?: string) => ({ type: 'scarp_fit', inputs: { data: `dataset("${SHA}")`, ...(x0 ? { x0 } : {}) } });
const rows = (n: number) => ({ datasetRows: (sha256: string) => (sha256 === SHA ? n : undefined) });

describe('scarp_fit cost estimate', () => {
  it('should grow with the rows of its dataset, more with x0 fitted than fixed', () => {
    expect(estimateEvaluationCost(sheet([fit('2 m')]), rows(1000))).toBeCloseTo(30 + 0.036 * 1000, 9);
    expect(estimateEvaluationCost(sheet([fit()]), rows(1000))).toBeCloseTo(1400 + 0.16 * 1000, 9);
    expect(estimateEvaluationCost(sheet([fit()]), rows(20000))).toBeCloseTo(1400 + 0.16 * 20000, 9);
    // An empty x0 is fitted, like a missing one.
    expect(estimateEvaluationCost(sheet([fit(' ')]), rows(20000))).toBeCloseTo(4600, 9);
  });

  it('should keep one 20,000-row fit synchronous and send five to a long run', () => {
    expect(needsLongRun(sheet([fit()]), rows(20000))).toBe(false);
    const five = sheet(Array.from({ length: 5 }, () => fit()));
    expect(estimateEvaluationCost(five, rows(20000))).toBeGreaterThan(SYNC_COST_LIMIT);
    expect(needsLongRun(five, rows(20000))).toBe(true);
    // The same five fits of a 2,000-row survey stay within the request.
    expect(needsLongRun(five, rows(2000))).toBe(false);
  });

  it('should assume the largest dataset when the caller cannot tell, and 1 unit for a dataset the team does not hold', () => {
    expect(estimateEvaluationCost(sheet([fit()]))).toBeCloseTo(1400 + 0.16 * 20000, 9);
    const unknown = sheet([{ type: 'scarp_fit', inputs: { data: `dataset("${OTHER}")` } }]);
    expect(estimateEvaluationCost(unknown, rows(20000))).toBe(1);
    // Not a data input at all: the block stops with an error at once.
    expect(estimateEvaluationCost(sheet([{ type: 'scarp_fit', inputs: { data: '3 m' } }]), rows(20000))).toBe(1);
  });

  it('should run a Monte Carlo sheet whose only uncertain input is the diffusivity at a fraction per sample (the fit is done once)', () => {
    const document = {
      ...sheet([{ type: 'scarp_fit', inputs: { data: `dataset("${SHA}")`, x0: '2 m', diffusivity: 'lognormal(1 m^2/kyr, 1.5)' } }]),
      uncertainty: { method: 'monte_carlo', samples: 10_000, seed: 1 },
    } as SheetDocument;
    const fitCost = 30 + 0.036 * 20000;
    // The nominal fit, once more for the sample relation, then 0.03 of it per sample.
    expect(estimateEvaluationCost(document, rows(20000))).toBeCloseTo(2 * fitCost + 10_000 * 0.03 * fitCost, 6);
  });
});

describe('profile_evolution cost estimate from data', () => {
  it('should take about one node per row of its dataset when no dx is given', () => {
    const evolution = { type: 'profile_evolution', inputs: { data: `dataset("${SHA}")`, diffusivity: '1 m^2/kyr', duration: '10 kyr', steps: '500' } };
    expect(estimateEvaluationCost(sheet([evolution]), rows(4000))).toBeCloseTo((4000 * 500) / 1e4, 9);
    // With a dx the data's length is not known before evaluating: the grid limit is assumed.
    const withDx = { ...evolution, inputs: { ...evolution.inputs, dx: '0.1 m' } };
    expect(estimateEvaluationCost(sheet([withDx]), rows(4000))).toBeCloseTo((20001 * 500) / 1e4, 9);
  });
});
