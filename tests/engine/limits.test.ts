import { describe, expect, it } from 'vitest';
import { EngineError, evaluateQuick, evaluateSheet, MAX_MATRIX_ELEMENTS, MAX_RESULTS_BYTES, MAX_STRING_LENGTH } from '@/lib/engine';
import type { SheetDocument } from '@/lib/engine';

/** The engine's message for an expression it refuses (fails the test when it is accepted). */
function refusal(expr: string): string {
  try {
    evaluateQuick(expr);
  } catch (error) {
    expect(error).toBeInstanceOf(EngineError);
    return (error as Error).message;
  }
  throw new Error(`expected "${expr.slice(0, 60)}" to be refused`);
}

const text = (length: number) => `"${'x'.repeat(length)}"`;

describe('size caps on every value (CONTRACT §3 Limits)', () => {
  it('should state the caps of the contract', () => {
    expect(MAX_MATRIX_ELEMENTS).toBe(100_000);
    expect(MAX_STRING_LENGTH).toBe(1000);
    expect(MAX_RESULTS_BYTES).toBe(16 * 1024 * 1024);
  });

  describe('matrix results of operations, refused before they are built', () => {
    const cases: Array<[string, string, RegExp]> = [
      ['an outer product (multiply)', 'sum(ones(1000, 1) * ones(1, 1000))', /multiply: the result would hold 1000000 elements, over the limit of 100000/],
      ['an outer product in function form', 'sum(multiply(ones(400, 1), ones(1, 400)))', /multiply: the result would hold 160000 elements/],
      ['a broadcast sum', 'sum(ones(400, 1) + ones(1, 400))', /add: the result would hold 160000 elements/],
      ['a broadcast difference', 'sum(ones(400, 1) - ones(1, 400))', /subtract: the result would hold 160000/],
      ['a broadcast element-wise product', 'sum(ones(400, 1) .* ones(1, 400))', /dotMultiply: the result would hold 160000/],
      ['a broadcast element-wise quotient', 'sum(ones(400, 1) ./ ones(1, 400))', /dotDivide: the result would hold 160000/],
      ['a broadcast power', 'sum(ones(400, 1) .^ ones(1, 400))', /dotPow: the result would hold 160000/],
      ['a broadcast comparison', 'sum(ones(400, 1) == ones(1, 400))', /equal: the result would hold 160000/],
      ['a concatenation', 'sum(concat(ones(60000), ones(60000)))', /concat: the result would hold 120000 elements/],
      ['a concatenation along rows', 'sum(concat(ones(300, 200), ones(300, 200), 1))', /concat: the result would hold 120000/],
      ['a nested product of products (issue 8)', 'sum((ones(1000,1)*ones(1,1000))*(ones(1000,1)*ones(1,1000)))', /multiply: the result would hold 1000000/],
      ['a matrix literal of large parts', 'sum([ones(60000), ones(60000)])', /at most 100000 elements \(asked for 120000\)/],
      ['a constructor', 'sum(ones(400, 400))', /ones: a matrix may hold at most 100000 elements \(asked for 160000\)/],
      ['a range', 'sum(1:200000)', /at most 100000 elements/],
    ];
    for (const [label, expr, pattern] of cases) {
      it(`should refuse ${label} with a message naming the cap`, () => {
        expect(refusal(expr)).toMatch(pattern);
      });
    }

    it('should allow the same operations up to the cap (reference values by counting)', () => {
      expect(evaluateQuick('sum(ones(300, 1) * ones(1, 300))').value).toBe(90_000);
      expect(evaluateQuick('sum(ones(300, 1) + ones(1, 300))').value).toBe(180_000);
      expect(evaluateQuick('sum(concat(ones(50000), ones(50000)))').value).toBe(100_000);
      expect(evaluateQuick('sum(transpose(ones(200, 500)))').value).toBe(100_000);
      expect(evaluateQuick('sum(ones(1, 1000) * ones(1000, 1))').value).toBe(1000);
      expect(evaluateQuick('size(ones(100000))[1]').value).toBe(100_000);
    });
  });

  describe('string values', () => {
    it('should refuse a quoted text over 1000 characters', () => {
      expect(refusal(text(1001))).toMatch(/at most 1000 characters long \(this one has 1001\)/);
      expect(evaluateQuick(text(1000)).value).toHaveLength(1000);
    });

    it('should refuse a string built over 1000 characters by concat', () => {
      expect(refusal(`concat(${text(600)}, ${text(600)})`)).toMatch(/concat: the text would be 1200 characters long, over the limit of 1000 characters/);
      expect(evaluateQuick(`concat(${text(500)}, ${text(500)})`).value).toHaveLength(1000);
    });
  });

  describe('in a sheet', () => {
    it('should make the string-doubling sheet end as a block error at the first string over the cap', () => {
      const blocks = [
        { id: 'b0', name: 'b0', type: 'quantities', inputs: { t: text(100) } },
        ...Array.from({ length: 20 }, (_, i) => ({ id: `b${i + 1}`, name: `b${i + 1}`, type: 'quantities', inputs: { t: `concat(b${i}.t, b${i}.t)` } })),
      ];
      const results = evaluateSheet({ format: 'denudata-sheet@1', title: 'Doubling', blocks } as unknown as SheetDocument);
      // 100 · 2^3 = 800 fits; 1600 does not.
      expect(results.blocks.b3!.outputs.t!.value).toHaveLength(800);
      expect(results.blocks.b4!.status).toBe('error');
      expect(results.blocks.b4!.error).toContain('over the limit of 1000 characters');
      expect(results.blocks.b20!.status).toBe('blocked');
      expect(JSON.stringify(results).length).toBeLessThan(20_000);
    });

    it('should make the outer-product sheet end as a block error', () => {
      const blocks = [
        { id: 'n', name: 'n', type: 'quantities', inputs: { size: '1000' } },
        { id: 'o', name: 'outer', type: 'formula', inputs: { expr: 'sum(ones(n.size, 1) * ones(1, n.size))' } },
        { id: 'c', name: 'after', type: 'formula', inputs: { expr: 'outer.value * 2' } },
      ];
      const results = evaluateSheet({ format: 'denudata-sheet@1', title: 'Outer', blocks } as unknown as SheetDocument);
      expect(results.blocks.outer!.status).toBe('error');
      expect(results.blocks.outer!.error).toMatch(/expr: multiply: the result would hold 1000000 elements/);
      expect(results.blocks.after!.status).toBe('blocked');
    });

    it('should make a block whose outputs push the results document over 16 MB an error, and block its dependents', () => {
      // Each block repeats a 1000-character text 200 times: about 400 kB of results per block.
      const inputs = Object.fromEntries(Array.from({ length: 200 }, (_, i) => [`t${i}`, 'base.t']));
      const blocks = [
        { id: 'base', name: 'base', type: 'quantities', inputs: { t: text(1000) } },
        ...Array.from({ length: 50 }, (_, i) => ({ id: `r${i}`, name: `r${i}`, type: 'quantities', inputs })),
        { id: 'tail', name: 'tail', type: 'formula', inputs: { expr: 'r49.t0' } },
      ];
      const results = evaluateSheet({ format: 'denudata-sheet@1', title: 'Big', blocks } as unknown as SheetDocument);
      const bytes = new TextEncoder().encode(JSON.stringify(results)).length;
      expect(bytes).toBeLessThanOrEqual(MAX_RESULTS_BYTES);
      const over = Object.entries(results.blocks).filter(([, block]) => block.status === 'error');
      expect(over.length).toBeGreaterThan(0);
      expect(over[0]![1].error).toContain('over the limit of 16 MB');
      // Blocks are evaluated in document order here: those before the first error are complete.
      const firstOver = Number(over[0]![0].slice(1));
      expect(firstOver).toBeGreaterThan(30);
      expect(results.blocks[`r${firstOver - 1}`]!.status).toBe('ok');
      expect(results.blocks.tail!.status).toBe('blocked');
    });
  });
});
