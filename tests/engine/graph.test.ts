import { describe, expect, it } from 'vitest';
import { evaluateSheet } from '@/lib/engine';
import { buildDependencyGraph } from '@/lib/engine/graph';
import { block, sheet } from '../support/engine-sheets';

describe('graph', () => {
  it('should order dependencies first whatever the document order', () => {
    const graph = buildDependencyGraph([
      { name: 'c', dependencies: ['b'] },
      { name: 'b', dependencies: ['a'] },
      { name: 'a', dependencies: [] },
    ]);
    expect(graph.order).toEqual(['a', 'b', 'c']);
    expect(graph.cycles.size).toBe(0);
  });

  it('should name every block of a cycle, and self references', () => {
    const graph = buildDependencyGraph([
      { name: 'a', dependencies: ['b'] },
      { name: 'b', dependencies: ['c'] },
      { name: 'c', dependencies: ['a'] },
      { name: 'd', dependencies: ['d'] },
      { name: 'e', dependencies: [] },
    ]);
    expect(graph.cycles.get('a')).toEqual(['a', 'b', 'c', 'a']);
    expect(graph.cycles.get('c')).toEqual(['c', 'a', 'b', 'c']);
    expect(graph.cycles.get('d')).toEqual(['d', 'd']);
    expect(graph.cycles.has('e')).toBe(false);
  });

  it('should handle a chain of 5000 blocks without overflowing the stack', () => {
    const nodes = Array.from({ length: 5000 }, (_, i) => ({ name: `n${i}`, dependencies: i === 0 ? [] : [`n${i - 1}`] }));
    expect(buildDependencyGraph(nodes.reverse()).order[0]).toBe('n0');
  });

  describe('in a sheet', () => {
    it('should mark each block of a cycle as an error naming the cycle, and block its dependents', () => {
      const results = evaluateSheet(
        sheet([
          block('one', 'formula', { expr: 'two.value + 1 m' }),
          block('two', 'formula', { expr: 'one.value + 1 m' }),
          block('three', 'formula', { expr: 'two.value' }),
          block('free', 'formula', { expr: '2 m' }),
        ]),
      );
      expect(results.blocks.one).toMatchObject({ status: 'error', error: 'part of a dependency cycle: one → two → one' });
      expect(results.blocks.two).toMatchObject({ status: 'error', error: 'part of a dependency cycle: two → one → two' });
      expect(results.blocks.three).toMatchObject({ status: 'blocked' });
      expect(results.blocks.three!.error).toContain('"two"');
      expect(results.blocks.free!.status).toBe('ok');
    });

    it('should block a chain behind an error, each naming the block it waits on', () => {
      const results = evaluateSheet(
        sheet([
          block('bad', 'peclet_number', { velocity: '1 m', length: '30 km', diffusivity: '1e-6 m^2/s' }),
          block('next', 'formula', { expr: 'bad.Pe * 2' }),
          block('last', 'formula', { expr: 'next.value * 2' }),
          block('other', 'formula', { expr: '3' }),
        ]),
      );
      expect(results.blocks.bad!.status).toBe('error');
      expect(results.blocks.bad!.error).toContain('velocity: expected a velocity (length per time) (L/T), got 1 m');
      expect(results.blocks.next).toMatchObject({ status: 'blocked', error: 'waiting on block "bad", which has an error' });
      expect(results.blocks.last).toMatchObject({ status: 'blocked', error: 'waiting on block "next", which is itself blocked' });
      expect(results.blocks.other!.status).toBe('ok');
    });

    it('should name missing blocks and missing outputs', () => {
      const results = evaluateSheet(
        sheet([
          block('p', 'quantities', { K: '1 m^2/kyr' }),
          block('x', 'formula', { expr: 'nothing.value' }),
          block('y', 'formula', { expr: 'p.D' }),
          block('z', 'formula', { expr: 'p * 2' }),
        ]),
      );
      expect(results.blocks.x!.error).toContain('there is no block named "nothing"');
      expect(results.blocks.y!.error).toContain('block "p" has no output "D" (its outputs: K)');
      expect(results.blocks.z!.error).toContain('refer to one of its outputs as p.<output>');
    });

    it('should report an output that was not produced (temperature without depth)', () => {
      const results = evaluateSheet(
        sheet([
          block('geo', 'advective_geotherm', { velocity: '1 mm/yr', thickness: '30 km', diffusivity: '1e-6 m^2/s', surface_temperature: '10 degC', base_temperature: '610 degC' }),
          block('temp', 'formula', { expr: 'geo.temperature_at_depth' }),
        ]),
      );
      expect(results.blocks.temp!.status).toBe('error');
      expect(results.blocks.temp!.error).toContain('has no value');
    });

    it('should make empty required inputs and parse failures block errors', () => {
      const results = evaluateSheet(sheet([block('first', 'peclet_number', { velocity: '1 mm/yr', length: '' }), block('later', 'formula', { expr: '1 +* 2' })]));
      expect(results.blocks.first!.error).toContain('length: this input is required');
      expect(results.blocks.later!.error).toContain('does not parse');
    });
  });
});
