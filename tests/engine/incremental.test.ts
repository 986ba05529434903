import { describe, expect, it } from 'vitest';
import { evaluateSheet, evaluateSheetIncremental, type SheetBlock, type SheetDocument } from '@/lib/engine';
import { sheet } from '../support/engine-sheets';

/** A small seeded generator (mulberry32), so the random sheets are reproducible. */
function seeded(seed: number): () => number {
  let a = seed >>> 0;
  return () => {
    a = (a + 0x6d2b79f5) >>> 0;
    let t = a;
    t = Math.imul(t ^ (t >>> 15), t | 1);
    t ^= t + Math.imul(t ^ (t >>> 7), t | 61);
    return ((t ^ (t >>> 14)) >>> 0) / 4294967296;
  };
}

function randomSheet(random: () => number, size: number): SheetDocument {
  const blocks: SheetBlock[] = [{ id: 'q', name: 'q', type: 'quantities', inputs: { K: '0.004 m^2/yr', v: '1 mm/yr', L: '30 km' } }];
  for (let i = 1; i < size; i++) {
    const earlier = Math.floor(random() * i);
    const ref = earlier === 0 ? 'q.v' : `f${earlier}.value`;
    const kind = random();
    const expr = kind < 0.1 ? `${ref} + 1 s` : kind < 0.2 ? `${ref} * ${(random() * 3).toFixed(3)} to km/Myr` : `${ref} * ${(random() * 2).toFixed(4)} + 0.01 mm/yr`;
    blocks.push({ id: `f${i}`, name: `f${i}`, type: 'formula', inputs: { expr } });
  }
  blocks.push({ id: 'pe', name: 'pe', type: 'peclet_number', inputs: { velocity: `f${size - 1}.value`, length: 'q.L', diffusivity: '1e-6 m^2/s' } });
  return sheet(blocks);
}

describe('evaluateSheetIncremental', () => {
  it('should equal a full evaluation after random edits, evaluating only the edited blocks and their dependents', () => {
    const random = seeded(20250101);
    for (let round = 0; round < 25; round++) {
      const doc = randomSheet(random, 30);
      const previous = evaluateSheet(doc);
      const edited = structuredClone(doc);
      const target = 1 + Math.floor(random() * 29);
      edited.blocks[target]!.inputs.expr = `${edited.blocks[target]!.inputs.expr} * 1.5`;
      const { results, evaluatedBlockIds } = evaluateSheetIncremental(edited, previous, [`f${target}`]);
      expect(results).toEqual(evaluateSheet(edited));
      // The evaluated set is exactly the edited block and everything downstream of it.
      const downstream = new Set([`f${target}`]);
      for (const b of edited.blocks) {
        const text = Object.values(b.inputs).join(' ');
        if ([...downstream].some((name) => new RegExp(`\\b${name}\\.`).test(text))) downstream.add(b.id);
      }
      expect(new Set(evaluatedBlockIds)).toEqual(downstream);
    }
  });

  it('should evaluate only the dependents of one edit in a chain', () => {
    const doc = sheet([
      { id: 'a', name: 'aa', type: 'formula', inputs: { expr: '1 m' } },
      { id: 'b', name: 'bb', type: 'formula', inputs: { expr: 'aa.value * 2' } },
      { id: 'c', name: 'cc2', type: 'formula', inputs: { expr: 'bb.value * 2' } },
      { id: 'd', name: 'dd', type: 'formula', inputs: { expr: '5 s' } },
    ]);
    const previous = evaluateSheet(doc);
    const edited = structuredClone(doc);
    edited.blocks[1]!.inputs.expr = 'aa.value * 3';
    const { results, evaluatedBlockIds } = evaluateSheetIncremental(edited, previous, ['b']);
    expect(evaluatedBlockIds).toEqual(['b', 'c']);
    expect(results.blocks.cc2!.outputs.value!.value).toBe(6);
  });

  it('should re-evaluate renamed, new and dependents of removed blocks', () => {
    const doc = sheet([
      { id: 'a', name: 'aa', type: 'formula', inputs: { expr: '1 m' } },
      { id: 'b', name: 'bb', type: 'formula', inputs: { expr: 'aa.value * 2' } },
    ]);
    const previous = evaluateSheet(doc);
    const renamed = sheet([
      { id: 'a', name: 'alpha', type: 'formula', inputs: { expr: '1 m' } },
      { id: 'b', name: 'bb', type: 'formula', inputs: { expr: 'aa.value * 2' } },
      { id: 'n', name: 'n', type: 'formula', inputs: { expr: '2 m' } },
    ]);
    const { results, evaluatedBlockIds } = evaluateSheetIncremental(renamed, previous, []);
    expect(evaluatedBlockIds.sort()).toEqual(['a', 'b', 'n']);
    expect(results).toEqual(evaluateSheet(renamed));
    expect(results.blocks.bb!.status).toBe('error');
  });

  it('should fall back to a full evaluation without previous results', () => {
    const doc = sheet([{ id: 'a', name: 'first', type: 'formula', inputs: { expr: '1 m' } }]);
    expect(evaluateSheetIncremental(doc, null, []).evaluatedBlockIds).toEqual(['a']);
  });
});
