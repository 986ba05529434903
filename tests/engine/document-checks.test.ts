import { createHash } from 'node:crypto';
import canonicalize from 'canonicalize';
import { describe, expect, it } from 'vitest';
import { BLOCK_TYPE_IDS } from '@/lib/engine/registry';
import { blockNameCheckCacheSize, checkBlockName, checkSheetDocument, hashSheetDocument, type SheetDocument } from '@/lib/engine/document';

// The document check's words and paths (lib/engine/document.ts; CONTRACT §2: a refused document is 400 with the
// first fault and its path), the bound of the block-name check cache, and the document hash against an
// independent implementation of RFC 8785 (the canonicalize package) and Node's SHA-256.

const doc = (blocks: unknown[]) => ({ format: 'denudata-sheet@1', title: 'checks', blocks });
const fault = (input: unknown) => {
  const checked = checkSheetDocument(input);
  if (checked.ok) throw new Error('expected a refused document');
  return [checked.path, checked.message];
};

describe('the document check: the first fault in words, with its path', () => {
  it('should explain each refused input key of a block', () => {
    expect(fault(doc([{ id: 'a', name: 'n', type: 'note', inputs: { x: '1' } }]))).toEqual(['blocks[0].inputs.x', 'a note block takes no inputs; use {}']);
    expect(fault(doc([{ id: 'a', name: 'q', type: 'quantities', inputs: { '1x': '1' } }]))).toEqual([
      'blocks[0].inputs["1x"]',
      '"1x" is not a valid parameter name: use 1–40 letters, digits and _, starting with a letter',
    ]);
    expect(fault(doc([{ id: 'a', name: 'q', type: 'quantities', inputs: { constructor: '1' } }]))).toEqual([
      'blocks[0].inputs.constructor',
      '"constructor" is reserved; choose another parameter name',
    ]);
    expect(fault(doc([{ id: 'a', name: 'pe', type: 'peclet_number', inputs: { speed: '1' } }]))).toEqual([
      'blocks[0].inputs.speed',
      'unknown input "speed" for a peclet_number block (its inputs: velocity, length, diffusivity)',
    ]);
    // A key that is not an identifier is written as a quoted index in the path.
    expect(fault(doc([{ id: 'a', name: 'pe', type: 'peclet_number', inputs: { 'a-b': '1' } }]))[0]).toBe('blocks[0].inputs["a-b"]');
    expect(fault(doc([{ id: 'a', name: 'pe', type: 'peclet_number', inputs: { a_b: '1' } }]))[0]).toBe('blocks[0].inputs.a_b');
  });

  it('should explain a display unit for an output the block does not have', () => {
    expect(fault(doc([{ id: 'a', name: 'pe', type: 'peclet_number', inputs: {}, display: { x: 'm' } }]))).toEqual(['blocks[0].display.x', 'unknown output "x" (outputs: Pe, regime)']);
    expect(fault(doc([{ id: 'a', name: 'q', type: 'quantities', inputs: {}, display: { x: 'm' } }]))).toEqual(['blocks[0].display.x', 'a quantities block has no outputs to display']);
  });

  it('should name an unknown block type with the known ones, and duplicate ids and names with the first place', () => {
    expect(fault(doc([{ id: 'a', name: 'q', type: 'no_type', inputs: {} }]))).toEqual(['blocks[0].type', `unknown block type "no_type" (known: ${BLOCK_TYPE_IDS.join(', ')})`]);
    expect(BLOCK_TYPE_IDS).toContain('peclet_number');
    const twice = { type: 'quantities', inputs: {} };
    expect(fault(doc([{ id: 'a', name: 'q', ...twice }, { id: 'a', name: 'r', ...twice }]))).toEqual(['blocks[1].id', 'duplicate id "a" (also blocks[0])']);
    expect(fault(doc([{ id: 'a', name: 'q', ...twice }, { id: 'b', name: 'q', ...twice }]))).toEqual(['blocks[1].name', 'duplicate name "q" (also blocks[0])']);
    expect(fault(doc([{ id: 'a', name: 'Bad', ...twice }]))).toEqual([
      'blocks[0].name',
      '"Bad" is not a valid block name: use 1–40 characters, lower-case letters, digits and _, starting with a letter',
    ]);
  });

  it('should refuse a block that is not an object, null included, without throwing', () => {
    expect(fault(doc([null]))).toEqual(['blocks[0]', 'Invalid input: expected object, received null']);
    expect(fault(doc([5]))).toEqual(['blocks[0]', 'Invalid input: expected object, received number']);
    expect(fault(doc([{ id: 'a', name: 'q', type: 'quantities', inputs: {} }, null]))[0]).toBe('blocks[1]');
  });
});

describe('the block-name check cache', () => {
  it('should keep each name’s answer, up to 10,001 names, then start again', () => {
    const run = `c${Date.now().toString(36)}`;
    // New names until the cache is cleared (at most 10,002 of them, whatever other tests left in it).
    let largest = blockNameCheckCacheSize();
    let cleared = false;
    for (let i = 0; i < 10_050 && !cleared; i++) {
      expect(checkBlockName(`${run}_${i}`)).toBeNull();
      const size = blockNameCheckCacheSize();
      if (size < largest) cleared = true;
      else largest = size;
    }
    expect(cleared).toBe(true);
    expect(largest).toBe(10_001);
    expect(blockNameCheckCacheSize()).toBe(1);
    // Two new names and one repeated: two more entries; a refused name's answer is kept as well.
    expect(checkBlockName(`${run}_new_a`)).toBeNull();
    expect(checkBlockName(`${run}_new_b`)).toBeNull();
    expect(checkBlockName(`${run}_new_a`)).toBeNull();
    expect(blockNameCheckCacheSize()).toBe(3);
    expect(checkBlockName('Bad')).toMatch(/not a valid block name/);
    expect(checkBlockName('Bad')).toMatch(/not a valid block name/);
    expect(blockNameCheckCacheSize()).toBe(4);
  });
});

describe('the document hash', () => {
  it('should be the SHA-256 of the RFC 8785 text (canonicalize package, Node crypto)', () => {
    const document = doc([{ id: 'x', name: 'pe', type: 'peclet_number', inputs: { velocity: '1 mm/yr', length: '30 km', diffusivity: '1e-6 m^2/s' }, note: 'é' }]) as unknown as SheetDocument;
    const expected = createHash('sha256').update(canonicalize(document)!, 'utf8').digest('hex');
    expect(hashSheetDocument(document)).toBe(expected);
    expect(hashSheetDocument(document)).toMatch(/^[0-9a-f]{64}$/);
  });
});
