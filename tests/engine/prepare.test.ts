import { describe, expect, it } from 'vitest';
import { EngineError } from '@/lib/engine';
import type { SheetBlock, SheetDocument } from '@/lib/engine/document';
import { prepare } from '@/lib/engine/prepare';

// The first step of an evaluation (lib/engine/prepare.ts): each block's first fault, in the order of its inputs,
// becomes its problem, and its dependencies are the blocks its references name. The messages are the
// engine's own words (CONTRACT §6b: a clear message naming the block and the input); the rule "the first fault
// is reported" is ours, checked here so that a later fault never hides an earlier one.

const block = (name: string, type: string, inputs: Record<string, string>): SheetBlock => ({ id: `id-${name}`, name, type, inputs }) as SheetBlock;
const doc = (...blocks: SheetBlock[]): SheetDocument => ({ format: 'denudata.sheet/1', title: 'prepare', blocks }) as unknown as SheetDocument;
const problemOf = (...blocks: SheetBlock[]) => prepare(doc(...blocks)).blocks.get(blocks[0]!.name)!.problem;

describe('prepare: each block’s first fault and its dependencies', () => {
  it('should refuse an unknown block type by name (the document check refuses it first on every public path)', () => {
    expect(() => prepare(doc(block('a', 'no_such_type', {})))).toThrow(EngineError);
    expect(() => prepare(doc(block('a', 'no_such_type', {})))).toThrow('unknown block type "no_such_type"');
  });

  it('should add the quoting advice to a refused bare word in a text input only', () => {
    expect(problemOf(block('fl', 'plate_flexure', { plate: 'floor' }))).toBe(
      'block "fl", plate: "floor" can only be called as a function, such as floor(x); write the word in double quotes, such as "floor"',
    );
    expect(problemOf(block('fl', 'plate_flexure', { line_load: 'floor' }))).toBe('block "fl", line_load: "floor" can only be called as a function, such as floor(x)');
  });

  it('should keep the first fault when a later input has another (nested distribution, certain input, reference)', () => {
    const unknown = 'block "q", x: unknown name "foo" (not a block, unit, constant or function)';
    expect(problemOf(block('q', 'quantities', { x: 'foo + 1', y: 'normal(normal(1, 1), 1)' }))).toBe(unknown);
    expect(problemOf(block('q', 'quantities', { x: 'foo + 1', y: 'nob.x' }))).toBe(unknown);
    expect(problemOf(block('q', 'quantities', { x: 'nob.x', y: 'foo' }))).toBe('block "q", x: refers to nob.x, but there is no block named "nob"');
    expect(problemOf(block('pe', 'profile_evolution', { steps: 'foo', dx: 'normal(1 m, 0.1 m)' }))).toBe(
      'block "pe", steps: unknown name "foo" (not a block, unit, constant or function)',
    );
    expect(problemOf(block('pe', 'profile_evolution', { dx: 'normal(normal(1 m, 0.1 m), 1 m)', steps: 'normal(1, 0.1)' }))).toMatch(/^block "pe", dx: a distribution must be the whole expression/);
    expect(problemOf(block('pe', 'profile_evolution', { boundary: 'normal(1, 0.1)', steps: 'normal(normal(1, 0.1), 1)' }))).toBe(
      'block "pe", boundary: must be certain; a distribution is not allowed in this input',
    );
    // A parse error first, then an unknown name.
    expect(problemOf(block('q', 'quantities', { x: '2 (', y: 'foo' }))).toMatch(/^block "q", x: the expression does not parse/);
  });

  it('should name as dependencies only existing blocks, each once, in the order first referred to', () => {
    const prepared = prepare(
      doc(
        block('q', 'quantities', { x: '1 m', y: 'q3.w + q2.z + q2.z', w: 'q3.w' }),
        block('q2', 'quantities', { z: '1' }),
        block('q3', 'quantities', { w: '2' }),
        block('r', 'quantities', { v: 'q2.z + missing.x' }),
      ),
    );
    expect(prepared.blocks.get('q')!.dependencies).toEqual(['q3', 'q2']);
    expect(prepared.blocks.get('q')!.problem).toBeUndefined();
    expect(prepared.blocks.get('r')!.dependencies).toEqual(['q2']);
    expect(prepared.blocks.get('r')!.problem).toBe('block "r", v: refers to missing.x, but there is no block named "missing"');
    expect(prepared.graph.order.indexOf('q2')).toBeLessThan(prepared.graph.order.indexOf('q'));
    expect(prepared.graph.order.indexOf('q3')).toBeLessThan(prepared.graph.order.indexOf('q'));
  });
});
