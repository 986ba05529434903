import canonicalize from 'canonicalize';
import { createHash } from 'node:crypto';
import { describe, expect, it } from 'vitest';
import { canonicalJson, canonicalString } from '@/lib/engine/canonical-json';
import { canonicalSheetJson, checkBlockName, checkSheetDocument, hashCanonicalText, hashSheetDocument, parseSheetDocument } from '@/lib/engine/document';
import { canonicalDatasetJson, hashDataset, SHA256_PATTERN, type DatasetCanonical } from '@/lib/engine/dataset';
import { EngineError, InputError, toSafeMessage } from '@/lib/engine/errors';
import { buildDependencyGraph, downstreamOf, type GraphNode } from '@/lib/engine/graph';

// The evaluation's plumbing on its own, small and fast. References: the canonicalize package (RFC 8785,
// JSON Canonicalization Scheme) for canonical JSON; Node's crypto (FIPS 180-4 SHA-256) for hashes; for the
// dependency graph, the definitions themselves, checked by brute force on random graphs (a block is in a
// cycle exactly when it can reach itself; a cycle path is a shortest walk back to the block; every
// dependency outside a block's cycle comes before it; Tarjan 1972 for the algorithm).

describe('engine errors (errors.ts)', () => {
  it('should carry the details it was given, invalid by default', () => {
    const plain = new EngineError('bad');
    expect(plain.message).toBe('bad');
    expect(plain.name).toBe('EngineError');
    expect(plain.code).toBe('invalid');
    expect(plain.position).toBeUndefined();
    const full = new EngineError('over', { code: 'limit_exceeded', block: 'b1', input: 'x', expected: 'a length', given: '3 s', position: 0 });
    expect([full.code, full.block, full.input, full.expected, full.given, full.position]).toEqual(['limit_exceeded', 'b1', 'x', 'a length', '3 s', 0]);
    expect(full).toBeInstanceOf(Error);
  });

  it('should prefix an input error with its input and keep the other details', () => {
    const error = new InputError('diffusivity', 'expected an area per time', { expected: 'L^2/T', code: 'invalid' });
    expect(error.message).toBe('diffusivity: expected an area per time');
    expect(error.name).toBe('InputError');
    expect(error.input).toBe('diffusivity');
    expect(error.expected).toBe('L^2/T');
    expect(error).toBeInstanceOf(EngineError);
    expect(new InputError('k', 'no').code).toBe('invalid');
  });

  it('should turn anything thrown into a short, safe message', () => {
    expect(toSafeMessage(new EngineError('an engine message'))).toBe('an engine message');
    // An engine message is already safe: kept whole, however long, on several lines or padded.
    const long = `  block "b", ${'x'.repeat(400)}\nsecond line`;
    expect(toSafeMessage(new EngineError(long))).toBe(long);
    expect(toSafeMessage(new InputError('k', ''))).toBe('k: ');
    expect(toSafeMessage(new RangeError('Maximum call stack size exceeded'))).toBe('the expression is nested too deeply');
    expect(toSafeMessage(new RangeError('Invalid array length'))).toBe('Invalid array length');
    expect(toSafeMessage(new TypeError('Unexpected type of argument in function to (expected: Unit, actual: number, index: 0)'))).toBe(
      'to converts a value that has a unit, and the value before it is a plain number (atan, asin and acos give radians as plain numbers: write (atan(x) rad) to deg)',
    );
    expect(toSafeMessage(new TypeError('Unexpected type of argument in function sqrt (expected: number or Unit, actual: string, index: 0)'))).toBe(
      'sqrt: input 1 should be number or Unit, not string',
    );
    expect(toSafeMessage(new TypeError('Unexpected type of argument in function add (expected: number, index: 1)'))).toBe('add: input 2 should be number');
    expect(toSafeMessage(new Error('first line\nsecond line'))).toBe('first line');
    expect(toSafeMessage(new Error('  padded  '))).toBe('padded');
    expect(toSafeMessage(new Error('x'.repeat(400)))).toBe('x'.repeat(300));
    expect(toSafeMessage(new Error(''))).toBe('the expression could not be evaluated');
    expect(toSafeMessage(new Error('\nafter an empty line'))).toBe('the expression could not be evaluated');
    expect(toSafeMessage('a string')).toBe('the expression could not be evaluated');
    expect(toSafeMessage(undefined)).toBe('the expression could not be evaluated');
  });

  it('should read mathjs type errors only when the whole pattern matches (the message texts of mathjs 15, from memory)', () => {
    // A function whose name starts with "to" is not the conversion `to`.
    expect(toSafeMessage(new TypeError('Unexpected type of argument in function tooth (expected: number, actual: string, index: 0)'))).toBe(
      'tooth: input 1 should be number, not string',
    );
    // Indexes of two digits, several expected types.
    expect(toSafeMessage(new TypeError('Unexpected type of argument in function max (expected: number or BigNumber or Unit, actual: boolean, index: 12)'))).toBe(
      'max: input 13 should be number or BigNumber or Unit, not boolean',
    );
    // Only at the start of the message.
    expect(toSafeMessage(new TypeError('Note: Unexpected type of argument in function to (expected: Unit, actual: number, index: 0)'))).toBe(
      'Note: Unexpected type of argument in function to (expected: Unit, actual: number, index: 0)',
    );
    expect(toSafeMessage(new TypeError('Unexpected type of argument in function sqrt (expected: number, actual: string, index: x)'))).toBe(
      'Unexpected type of argument in function sqrt (expected: number, actual: string, index: x)',
    );
    // Stack overflows in any capitalisation, and only as RangeErrors.
    expect(toSafeMessage(new RangeError('Maximum CALL STACK size exceeded'))).toBe('the expression is nested too deeply');
    expect(toSafeMessage(new Error('Maximum call stack size exceeded'))).toBe('Maximum call stack size exceeded');
    expect(toSafeMessage(new Error(`${'y'.repeat(299)}\nz`))).toBe('y'.repeat(299));
  });

  it('should keep the position and other details through an input error', () => {
    expect(new InputError('x', 'bad', { position: 4, given: '2 s' })).toMatchObject({ position: 4, given: '2 s', input: 'x', message: 'x: bad' });
  });
});

/** A small deterministic generator (a linear congruential generator, Numerical Recipes constants). */
function generator(seed: number): () => number {
  let state = seed >>> 0;
  return () => {
    state = (Math.imul(state, 1664525) + 1013904223) >>> 0;
    return state / 2 ** 32;
  };
}

function randomGraph(seed: number, size: number): GraphNode[] {
  const random = generator(seed);
  const names = Array.from({ length: size }, (_, i) => `b${i}`);
  return names.map((name) => {
    const dependencies = new Set<string>();
    const count = Math.floor(random() * 3);
    for (let k = 0; k < count; k++) dependencies.add(random() < 0.1 ? `missing${k}` : names[Math.floor(random() * size)]!);
    return { name, dependencies: [...dependencies] };
  });
}

/** Shortest number of steps from `from` to `to` over existing blocks (breadth-first), or Infinity. */
function distance(nodes: GraphNode[], from: string, to: string): number {
  const deps = new Map(nodes.map((n) => [n.name, n.dependencies]));
  let frontier = [from];
  const seen = new Set<string>();
  for (let steps = 1; frontier.length > 0; steps++) {
    const next: string[] = [];
    for (const name of frontier) {
      for (const dep of deps.get(name) ?? []) {
        if (!deps.has(dep)) continue;
        if (dep === to) return steps;
        if (!seen.has(dep)) {
          seen.add(dep);
          next.push(dep);
        }
      }
    }
    frontier = next;
  }
  return Infinity;
}

describe('dependency graph (graph.ts)', () => {
  it('should agree with the definitions on random graphs: cycles, shortest cycle paths, order, dependents', () => {
    let withCycles = 0;
    for (let seed = 1; seed <= 20; seed++) {
      const nodes = randomGraph(seed, 10);
      const graph = buildDependencyGraph(nodes);
      if (graph.cycles.size > 0) withCycles += 1;
      const names = nodes.map((n) => n.name);
      expect([...graph.order].sort(), `seed ${seed}`).toEqual([...names].sort());
      const position = new Map(graph.order.map((name, i) => [name, i]));
      for (const node of nodes) {
        const loop = distance(nodes, node.name, node.name);
        expect(graph.cycles.has(node.name), `seed ${seed} ${node.name}`).toBe(loop !== Infinity);
        const path = graph.cycles.get(node.name);
        if (path) {
          expect(path[0]).toBe(node.name);
          expect(path[path.length - 1]).toBe(node.name);
          expect(path.length - 1, `seed ${seed} ${node.name}: ${path.join(' → ')}`).toBe(loop);
          for (let i = 0; i + 1 < path.length; i++) expect(nodes.find((n) => n.name === path[i])!.dependencies).toContain(path[i + 1]);
        }
        for (const dep of node.dependencies) {
          if (!names.includes(dep)) {
            expect(graph.dependents.has(dep)).toBe(false);
            continue;
          }
          expect(graph.dependents.get(dep), `seed ${seed}`).toContain(node.name);
          const sameCycle = distance(nodes, dep, node.name) !== Infinity;
          if (!sameCycle) expect(position.get(dep)!, `seed ${seed}: ${dep} before ${node.name}`).toBeLessThan(position.get(node.name)!);
        }
        expect(graph.dependencies.get(node.name)).toBe(node.dependencies);
        // Every block downstream is one that reaches this one.
        const downstream = downstreamOf(graph, [node.name]);
        for (const other of names) expect(downstream.has(other), `seed ${seed}: ${other} downstream of ${node.name}`).toBe(distance(nodes, other, node.name) !== Infinity);
      }
    }
    // The sample holds graphs with and without cycles.
    expect(withCycles).toBeGreaterThan(3);
    expect(withCycles).toBeLessThan(20);
  });

  it('should keep document order among independent blocks and put a cycle where it closes', () => {
    const graph = buildDependencyGraph([
      { name: 'x', dependencies: [] },
      { name: 'w', dependencies: ['v'] },
      { name: 'v', dependencies: [] },
      { name: 'p', dependencies: ['q'] },
      { name: 'q', dependencies: ['p', 'x'] },
    ]);
    // The members of a cycle come in the order they were reached, after what the cycle reads.
    expect(graph.order).toEqual(['x', 'v', 'w', 'p', 'q']);
    expect(graph.cycles.get('p')).toEqual(['p', 'q', 'p']);
    expect(graph.cycles.get('q')).toEqual(['q', 'p', 'q']);
    expect(graph.dependents.get('x')).toEqual(['q']);
    expect(graph.dependents.get('p')).toEqual(['q']);
    expect(graph.dependents.get('w')).toEqual([]);
  });

  it('should find the shortest way back in a cycle with a chord, and a self reference inside a larger cycle', () => {
    const graph = buildDependencyGraph([
      { name: 'a', dependencies: ['b'] },
      { name: 'b', dependencies: ['c', 'b'] },
      { name: 'c', dependencies: ['d', 'a'] },
      { name: 'd', dependencies: ['a'] },
    ]);
    expect(graph.cycles.get('a')).toEqual(['a', 'b', 'c', 'a']);
    expect(graph.cycles.get('b')).toEqual(['b', 'b']);
    expect(graph.cycles.get('d')).toEqual(['d', 'a', 'b', 'c', 'd']);
  });

  it('should find what is downstream of several blocks, not the blocks themselves unless reachable', () => {
    const graph = buildDependencyGraph([
      { name: 'a', dependencies: [] },
      { name: 'b', dependencies: ['a'] },
      { name: 'c', dependencies: ['b'] },
      { name: 'd', dependencies: [] },
      { name: 'e', dependencies: ['d', 'c'] },
      { name: 'f', dependencies: ['f'] },
    ]);
    expect([...downstreamOf(graph, ['a'])].sort()).toEqual(['b', 'c', 'e']);
    expect([...downstreamOf(graph, ['d', 'b'])].sort()).toEqual(['c', 'e']);
    expect([...downstreamOf(graph, ['f'])]).toEqual(['f']);
    expect([...downstreamOf(graph, ['unknown'])]).toEqual([]);
  });
});

describe('canonical JSON (canonical-json.ts, RFC 8785; the canonicalize package as reference)', () => {
  it('should write what the package writes for edge cases of arrays, objects and toJSON', () => {
    const shared = { k: [1, 2] };
    const samples: unknown[] = [
      null,
      true,
      false,
      0,
      -0,
      1e21,
      5e-324,
      '',
      'é\u2028\ud83d\ude00',
      [],
      {},
      [undefined, () => 1, Symbol('s'), null],
      { u: undefined, f: () => 1, s: Symbol('s'), n: null, b: false },
      { z: 1, y: { x: [shared, shared] }, '\u00e9': 2, '\ud83d\ude00': 3, '\ufb33': 4, A: 5 },
      { when: new Date(Date.UTC(2026, 0, 2)) },
      { custom: { toJSON: () => ({ b: 2, a: 1 }) } },
      [{ toJSON: () => 'text' }],
    ];
    for (const sample of samples) expect(canonicalJson(sample)).toBe(canonicalize(sample));
  });

  it('should refuse NaN, Infinity, cycles and lone surrogates, naming which', () => {
    expect(() => canonicalJson({ a: NaN })).toThrow('NaN is not allowed');
    expect(() => canonicalJson([Infinity])).toThrow('Infinity is not allowed');
    expect(() => canonicalJson([-Infinity])).toThrow('Infinity is not allowed');
    const cycle: Record<string, unknown> = { a: 1 };
    cycle.self = { back: cycle };
    expect(() => canonicalJson(cycle)).toThrow('Circular reference detected');
    const list: unknown[] = [];
    list.push(list);
    expect(() => canonicalJson(list)).toThrow('Circular reference detected');
    for (const text of ['\ud800', 'a\udc00b', '\ud83d', '\ud83dx']) {
      expect(() => canonicalString(text)).toThrow('Lone surrogate is not allowed');
      expect(() => canonicalJson({ [text]: 1 })).toThrow('Lone surrogate is not allowed');
    }
    expect(canonicalString('\ud83d\ude00')).toBe('"\ud83d\ude00"');
    expect(canonicalString('tab\there')).toBe('"tab\\there"');
  });

  it('should let the same object appear twice when it is not its own ancestor', () => {
    const leaf = { v: 1 };
    expect(canonicalJson({ b: leaf, a: leaf })).toBe('{"a":{"v":1},"b":{"v":1}}');
    const seen = new Set<object>();
    canonicalJson({ x: [leaf] }, seen);
    expect(seen.size).toBe(0);
  });
});

describe('datasets (dataset.ts, CONTRACT §7.4)', () => {
  it('should hash the RFC 8785 text of a canonical dataset with SHA-256 (FIPS 180-4, Node crypto)', () => {
    const dataset: DatasetCanonical = {
      kind: 'slope_profile',
      format: 'denudata-dataset@1',
      rows: [[0, 10.5, 0.2], [5, 9.25, 0.2]],
      columns: [{ name: 'distance', unit: 'm' }, { name: 'elevation', unit: 'm' }, { name: 'elevation_sd', unit: 'm' }],
    };
    const text = canonicalize(dataset)!;
    expect(canonicalDatasetJson(dataset)).toBe(text);
    expect(text.startsWith('{"columns":[{"name":"distance","unit":"m"}')).toBe(true);
    const hash = hashDataset(dataset);
    expect(hash).toBe(createHash('sha256').update(Buffer.from(text, 'utf8')).digest('hex'));
    expect(hash).toMatch(SHA256_PATTERN);
    expect(hashDataset({ ...dataset, rows: [[0, 10.5, 0.2], [5, 9.25, 0.21]] })).not.toBe(hash);
    // UTF-8 bytes, not UTF-16: a unit with a non-ASCII character hashes its UTF-8 encoding.
    const micro = { ...dataset, columns: dataset.columns.map((c) => ({ ...c, unit: 'µm' })) };
    expect(hashDataset(micro)).toBe(createHash('sha256').update(Buffer.from(canonicalize(micro)!, 'utf8')).digest('hex'));
  });

  it('should recognise a lowercase hex SHA-256 and nothing else', () => {
    expect(SHA256_PATTERN.test('a'.repeat(64))).toBe(true);
    expect(SHA256_PATTERN.test('A'.repeat(64))).toBe(false);
    expect(SHA256_PATTERN.test('a'.repeat(63))).toBe(false);
    expect(SHA256_PATTERN.test(`x${'a'.repeat(64)}`)).toBe(false);
  });
});

describe('the sheet document (document.ts)', () => {
  const base = (blocks: unknown[], extra: Record<string, unknown> = {}) => ({ format: 'denudata-sheet@1', title: 'Plumbing', blocks, ...extra });
  const fault = (input: unknown) => {
    const checked = checkSheetDocument(input);
    expect(checked.ok).toBe(false);
    return checked.ok ? { message: '', path: '' } : { message: checked.message, path: checked.path };
  };

  it('should check block names: the pattern, type functions, reserved names', () => {
    expect(checkBlockName('hill_1')).toBeNull();
    expect(checkBlockName('a'.repeat(40))).toBeNull();
    for (const name of ['a'.repeat(41), '1abc', 'Hill', 'hill-1', '', '_x']) {
      expect(checkBlockName(name), name).toBe(`"${name}" is not a valid block name: use 1–40 characters, lower-case letters, digits and _, starting with a letter`);
    }
    expect(checkBlockName('advective_geotherm')).toBe('"advective_geotherm" cannot be a block name: it is a block type\'s function in expressions');
    expect(checkBlockName('channel_march')).toBeNull();
    expect(checkBlockName('km')).toBe('"km" cannot be a block name: "km" is a unit the engine knows, so km.x would be ambiguous');
    expect(checkBlockName('sqrt')).toBe('"sqrt" cannot be a block name: "sqrt" is a function the engine knows');
    // Asked again, the same answer (remembered).
    expect(checkBlockName('km')).toBe('"km" cannot be a block name: "km" is a unit the engine knows, so km.x would be ambiguous');
  });

  it('should refuse input and display keys a block type does not have, naming the first', () => {
    expect(fault(base([{ id: 'n', name: 'n', type: 'note', inputs: { x: '1', y: '2' } }]))).toEqual({ message: 'a note block takes no inputs; use {}', path: 'blocks[0].inputs.x' });
    expect(fault(base([{ id: 'q', name: 'q', type: 'quantities', inputs: { K: '1', '2x': '1' } }]))).toEqual({
      message: '"2x" is not a valid parameter name: use 1–40 letters, digits and _, starting with a letter',
      path: 'blocks[0].inputs["2x"]',
    });
    expect(fault(base([{ id: 'q', name: 'q', type: 'quantities', inputs: { K: '1', constructor: '1' } }]))).toEqual({
      message: '"constructor" is reserved; choose another parameter name',
      path: 'blocks[0].inputs.constructor',
    });
    expect(fault(base([{ id: 'f', name: 'f', type: 'formula', inputs: { expr: '1', other: '2', more: '3' } }]))).toEqual({
      message: 'unknown input "other" for a formula block (its inputs: expr)',
      path: 'blocks[0].inputs.other',
    });
    expect(fault(base([{ id: 'q', name: 'q', type: 'quantities', inputs: { K: '1' }, display: { K: 'm', L: 'm' } }]))).toEqual({
      message: 'unknown output "L" (outputs: K)',
      path: 'blocks[0].display.L',
    });
    expect(fault(base([{ id: 'n', name: 'n', type: 'note', inputs: {}, display: { x: 'm' } }]))).toEqual({
      message: 'a note block has no outputs to display',
      path: 'blocks[0].display.x',
    });
    expect(checkSheetDocument(base([{ id: 'q', name: 'q', type: 'quantities', inputs: { K: '1 m', L: '2 m' }, display: { L: 'km' } }])).ok).toBe(true);
    expect(checkSheetDocument(base([{ id: 'n', name: 'n', type: 'note', inputs: {} }])).ok).toBe(true);
  });

  it('should report the first fault with its path, and name unknown keys', () => {
    expect(fault(base([], { extra: 1 }))).toEqual({ message: 'unknown key: extra', path: '' });
    expect(fault(base([], { extra: 1, more: 2 }))).toEqual({ message: 'unknown keys: extra, more', path: '' });
    expect(fault(base([{ id: 'a', name: 'p1', type: 'formula', inputs: { expr: '1' } }, { id: 'a', name: 'p2', type: 'formula', inputs: { expr: '1' } }]))).toEqual({
      message: 'duplicate id "a" (also blocks[0])',
      path: 'blocks[1].id',
    });
    expect(fault(base([{ id: 'a', name: 'x', type: 'formula', inputs: { expr: '1' } }, { id: 'b', name: 'y', type: 'formula', inputs: { expr: '1' } }, { id: 'c', name: 'x', type: 'formula', inputs: { expr: '1' } }]))).toEqual({
      message: 'duplicate name "x" (also blocks[0])',
      path: 'blocks[2].name',
    });
    expect(fault(base([{ id: 'a', name: 'x', type: 'magic', inputs: {} }])).message).toMatch(/^unknown block type "magic" \(known: .*formula/);
    expect(fault({ ...base([]), title: 'a\u0000b' })).toEqual({ message: 'must not contain control characters (found U+0000)', path: 'title' });
    const proto = JSON.parse('{"format":"denudata-sheet@1","title":"t","blocks":[{"id":"a","name":"a","type":"formula","inputs":{"expr":"1"}},{"id":"b","name":"b","type":"formula","inputs":{"expr":"1"},"display":{"__proto__":"m"}}]}');
    expect(fault(proto)).toEqual({ message: '"__proto__" is not allowed as a key', path: 'blocks[1].display["__proto__"]' });
    const protoInputs = JSON.parse('{"format":"denudata-sheet@1","title":"t","blocks":[7,{"id":"a","name":"a","type":"formula","inputs":{"__proto__":"1"}}]}');
    expect(fault(protoInputs)).toEqual({ message: '"__proto__" is not allowed as a key', path: 'blocks[1].inputs["__proto__"]' });
    expect(fault(base([{ id: 'a', name: 'p1', type: 'formula', inputs: { expr: '\ud800' } }]))).toEqual({
      message: 'the document holds text that is not valid Unicode (an unpaired surrogate)',
      path: '',
    });
  });

  it('should write the same canonical text as the canonicalize package, on and off the known shape', () => {
    const documents: unknown[] = [
      base([]),
      base([{ id: 'a', name: 'a', type: 'formula', inputs: { expr: '1' } }]),
      base([{ id: 'a', name: 'a', type: 'quantities', inputs: { b: '1', a: '2' }, display: { b: 'km', a: 'm' }, note: 'n' }], { site: { name: 's', latitude: 1 }, uncertainty: { seed: 3, method: 'linear' } }),
      base([{ id: 'a', name: 'a', type: 'quantities', inputs: { a: '2' }, note: 'only a note' }]),
      base([{ id: 'a', name: 'a', type: 'quantities', inputs: { a: '2' }, display: {} }]),
      // Off the shape (canonicalSheetJson is also given objects the schema never saw).
      base([{ id: 'a', name: 'a', type: 'formula', inputs: { expr: '1' }, extra: true }]),
      base([{ id: 1, name: 'a', type: 'formula', inputs: {} }]),
      base([{ id: 'a', name: 2, type: 'formula', inputs: {} }]),
      base([{ id: 'a', name: 'a', type: 3, inputs: {} }]),
      base([{ id: 'a', name: 'a', type: 'formula', inputs: [] }]),
      base([{ id: 'a', name: 'a', type: 'formula', inputs: {}, note: 5 }]),
      base([{ id: 'a', name: 'a', type: 'formula', inputs: {}, display: 'm' }]),
      base([{ id: 'a', name: 'a', type: 'formula', inputs: { x: 1, y: { z: [1] }, u: undefined } }]),
      base([null, [1], 'text', { id: 'a', name: 'a', type: 'formula', inputs: {} }]),
      base([], { extra: 1 }),
      { ...base([]), format: 1 },
      { ...base([]), title: null },
      { ...base([]), blocks: {} },
      base([], { site: { name: 's' } }),
      base([], { uncertainty: { samples: 100 } }),
    ];
    for (const document of documents) expect(canonicalSheetJson(document as never), JSON.stringify(document)).toBe(canonicalize(document));
  });

  it('should hash the canonical text with SHA-256 (FIPS 180-4, Node crypto)', () => {
    const document = base([{ id: 'a', name: 'p1', type: 'formula', inputs: { expr: '1 m' } }]) as never;
    const expected = createHash('sha256').update(Buffer.from(canonicalize(document)!, 'utf8')).digest('hex');
    expect(hashSheetDocument(document)).toBe(expected);
    expect(hashCanonicalText(canonicalSheetJson(document))).toBe(expected);
    const parsed = parseSheetDocument(document);
    expect(parsed).toEqual({ ok: true, document });
    expect(parseSheetDocument({})).toMatchObject({ ok: false, path: 'format' });
  });
});
