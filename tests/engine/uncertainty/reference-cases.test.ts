import { describe, expect, it } from 'vitest';
import { perTest } from '../../support/per-test';
import { evaluateSheet, type BlockResult, type NumericSpread, type SheetResults } from '@/lib/engine';
import { isClose } from '../../support/approx';
import { caseSheet, renamed, uncertaintyCase, type CaseExpectation } from './cases';

/**
 * Every expectation of the public cases P48–P52, read generically from the copied case file:
 * `block.output` (nominal value), `block.output.has_spread`, `block.output.spread.<field>`,
 * `block.has_series.<name>`, `block.<series>.x|y`; `reference:` values are what the specified
 * stream gives (to 1e-9), `analytic:` values the exact distribution (within 5 standard errors
 * for N, reference FORMULAS §17.2). Sources: JCGM 101:2008 (Monte Carlo), JCGM 100:2008 §5.1
 * (linear), Hyndman & Fan (1996), Spearman (1904); the exact results of FORMULAS §17.3.
 */
function lookup(results: SheetResults, path: string): unknown {
  const [blockName, ...rest] = path.split('.');
  const block: BlockResult | undefined = results.blocks[renamed(blockName!)];
  if (!block) throw new Error(`no block ${blockName}`);
  expect(block.status, `${blockName}: ${block.error ?? ''}`).toBe('ok');
  const [second, ...tail] = rest;
  if (second === 'has_series') return Boolean(block.series?.[tail[0]!]);
  if (block.series && second! in block.series) {
    const series = block.series[second!]!;
    return tail[0] === 'x' ? series.x : series.y;
  }
  const output = block.outputs[second!];
  if (!output) throw new Error(`no output ${second}`);
  if (tail.length === 0) return output.value;
  if (tail[0] === 'has_spread') return output.spread !== undefined;
  if (tail[0] !== 'spread') throw new Error(`cannot read ${path}`);
  let value: unknown = output.spread;
  const field = tail.slice(1);
  // sensitivity and contributions keys are "<block>.<input>".
  if (field[0] === 'sensitivity' || field[0] === 'contributions') {
    const map = (value as Record<string, Record<string, number>>)[field[0]]!;
    return map[`${renamed(field[1]!)}.${field.slice(2).join('.')}`];
  }
  for (const key of field) value = (value as Record<string, unknown>)[key];
  return value;
}

function check(label: string, got: unknown, e: CaseExpectation): void {
  if (typeof e.value === 'string' || typeof e.value === 'boolean') {
    expect(got, label).toBe(e.value);
    return;
  }
  if (Array.isArray(e.value)) {
    expect(Array.isArray(got), label).toBe(true);
    const values = got as number[];
    expect(values.length, label).toBe(e.value.length);
    e.value.forEach((v, i) => {
      expect(isClose(values[i]!, v, e.rel_tol, e.abs_tol ?? 0), `${label}[${i}]: ${values[i]} vs ${v}`).toBe(true);
    });
    return;
  }
  expect(typeof got, label).toBe('number');
  expect(isClose(got as number, e.value, e.rel_tol, e.abs_tol ?? 0), `${label}: ${String(got)} vs ${e.value} (rel ${e.rel_tol}, abs ${e.abs_tol ?? 0})`).toBe(true);
}

describe.each(['P48', 'P49', 'P50', 'P51', 'P52'])('uncertainty case %s', (id) => {
  const c = uncertaintyCase(id);
  const results = perTest(() => evaluateSheet(caseSheet(id)));

  it(`should meet every expectation of ${id} (${c.source.split(';')[0]})`, () => {
    const keys = Object.keys(c.expected);
    expect(keys.length).toBeGreaterThan(5);
    for (const key of keys) {
      const path = key.replace(/^(reference|analytic):/, '');
      check(`${id} ${key}`, lookup(results(), path), c.expected[key]!);
    }
  });

  it(`should echo the settings and the declared distributions of ${id}`, () => {
    expect(results().uncertainty?.method).toBe(c.sheet!.uncertainty!.method);
    expect(results().uncertainty?.samples).toBe(c.sheet!.uncertainty!.samples);
    expect(results().uncertainty?.seed).toBe(c.sheet!.uncertainty!.seed);
    expect(results().uncertainty?.inputs.length).toBeGreaterThan(0);
  });
});

describe('the linear interval on a skewed output (P51 against P48)', () => {
  it('should carry its label and fall far below the Monte Carlo 2.5 % point, as FORMULAS §17.5 warns', () => {
    const linear = evaluateSheet(caseSheet('P51')).blocks.age!.outputs.age!.spread as NumericSpread;
    const monteCarlo = evaluateSheet(caseSheet('P48')).blocks.age!.outputs.age!.spread as NumericSpread;
    expect(linear.method).toBe('linear');
    expect(monteCarlo.method).toBe('monte_carlo');
    // 1.30 kyr (linear, normal approximation) against 5.74 kyr (the exact lognormal has 5.83).
    expect(linear.p2_5).toBeLessThan(1.4);
    expect(monteCarlo.p2_5).toBeGreaterThan(5.5);
    expect(linear.samples).toBeUndefined();
    expect(linear.sensitivity).toBeUndefined();
    expect(monteCarlo.contributions).toBeUndefined();
  });
});
