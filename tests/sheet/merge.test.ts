import { describe, expect, it } from 'vitest';
import { mergeSheets, sameJson, type MergeClash } from '@/lib/sheet/merge';
import type { SheetBlock, SheetDocument } from '@/lib/sheet/types';

// The one three-way merge behind both 409 paths (draft and revision). Cases are a table: each names what
// the base was, what I did, what they did, and what the merged document and its clashes must be.
// The expectations are the rules of a three-way merge (common practice for version control: a change
// on one side wins over no change; equal changes agree; different changes clash and mine is kept).

const block = (id: string, name: string, type: string, inputs: Record<string, string>, extra: Partial<SheetBlock> = {}): SheetBlock => ({ id, name, type, inputs, ...extra });

const base = (): SheetDocument => ({
  format: 'denudata-sheet@1',
  title: 'Crest',
  blocks: [
    block('p', 'params', 'quantities', { K: '0.004 m^2/yr', C: '-0.02 m^-1' }),
    block('h', 'hill', 'hillslope_diffusion', { diffusivity: 'params.K', curvature: 'params.C' }),
    block('c', 'calc', 'formula', { expr: 'hill.dz_dt * 2' }),
    block('s', 'stream', 'stream_power', { K: '1e-5 1/yr', area: '1 km^2', slope: '0.1', m: '0.5', n: '1', velocity: '1 mm/yr', length: '2 km' }),
  ],
});

type Edit = (doc: SheetDocument) => void;
const find = (doc: SheetDocument, id: string): SheetBlock => {
  const found = doc.blocks.find((b) => b.id === id);
  if (!found) throw new Error(`no block ${id}`);
  return found;
};
const setInput = (id: string, key: string, value: string): Edit => (doc) => {
  find(doc, id).inputs[key] = value;
};
const removeInput = (id: string, key: string): Edit => (doc) => {
  delete find(doc, id).inputs[key];
};
const removeBlock = (id: string): Edit => (doc) => {
  doc.blocks = doc.blocks.filter((b) => b.id !== id);
};
const addBlock = (after: string | null, added: SheetBlock): Edit => (doc) => {
  const at = after ? doc.blocks.findIndex((b) => b.id === after) + 1 : doc.blocks.length;
  doc.blocks.splice(at, 0, added);
};
const rename = (id: string, name: string): Edit => (doc) => {
  const target = find(doc, id);
  const old = target.name;
  target.name = name;
  for (const b of doc.blocks) for (const [k, v] of Object.entries(b.inputs)) b.inputs[k] = v.replaceAll(`${old}.`, `${name}.`);
};
const moveTo = (id: string, index: number): Edit => (doc) => {
  const target = find(doc, id);
  doc.blocks = doc.blocks.filter((b) => b.id !== id);
  doc.blocks.splice(index, 0, target);
};
const setNote = (id: string, note: string): Edit => (doc) => {
  find(doc, id).note = note;
};
const setTitle = (title: string): Edit => (doc) => {
  doc.title = title;
};
/** The same block written back with its keys in another order, as jsonb may return it. */
const reorderKeys = (id: string): Edit => (doc) => {
  const i = doc.blocks.findIndex((b) => b.id === id);
  const b = doc.blocks[i]!;
  const inputs = Object.fromEntries(Object.entries(b.inputs).reverse());
  doc.blocks[i] = JSON.parse(JSON.stringify({ inputs, type: b.type, name: b.name, id: b.id })) as SheetBlock;
};

const edited = (...edits: Edit[]) => {
  const doc = base();
  for (const edit of edits) edit(doc);
  return doc;
};

interface Case {
  name: string;
  mine: Edit[];
  theirs: Edit[];
  ids?: string[];
  inputs?: Record<string, Record<string, string>>;
  names?: string[];
  title?: string;
  note?: Record<string, string | undefined>;
  clashes?: Partial<MergeClash>[];
  applied?: number;
}

const cases: Case[] = [
  {
    name: 'same block, different inputs: both kept (the draft path used to drop theirs)',
    mine: [setInput('s', 'velocity', '3 mm/yr')],
    theirs: [setInput('s', 'length', '5 km')],
    inputs: { s: { ...base().blocks[3]!.inputs, velocity: '3 mm/yr', length: '5 km' } },
    clashes: [],
    applied: 1,
  },
  {
    name: 'same input changed on both sides to different values: mine kept, one clash',
    mine: [setInput('p', 'K', '0.006 m^2/yr')],
    theirs: [setInput('p', 'K', '0.002 m^2/yr')],
    inputs: { p: { K: '0.006 m^2/yr', C: '-0.02 m^-1' } },
    clashes: [{ blockId: 'p', blockName: 'params', field: 'inputs.K', mine: '0.006 m^2/yr', theirs: '0.002 m^2/yr' }],
  },
  {
    name: 'same input changed to the same value on both sides: no clash',
    mine: [setInput('p', 'K', '0.006 m^2/yr')],
    theirs: [setInput('p', 'K', '0.006 m^2/yr')],
    inputs: { p: { K: '0.006 m^2/yr', C: '-0.02 m^-1' } },
    clashes: [],
  },
  {
    name: 'different blocks changed: both kept',
    mine: [setInput('c', 'expr', '5 m')],
    theirs: [setInput('p', 'K', '0.01 m^2/yr')],
    inputs: { c: { expr: '5 m' }, p: { K: '0.01 m^2/yr', C: '-0.02 m^-1' } },
    clashes: [],
  },
  {
    name: 'an input I removed while they left it alone stays removed',
    mine: [removeInput('p', 'C')],
    theirs: [setInput('p', 'K', '0.01 m^2/yr')],
    inputs: { p: { K: '0.01 m^2/yr' } },
    clashes: [],
  },
  {
    name: 'an input I removed that they changed: mine (removed) kept, clash listed',
    mine: [removeInput('p', 'C')],
    theirs: [setInput('p', 'C', '-0.03 m^-1')],
    inputs: { p: { K: '0.004 m^2/yr' } },
    clashes: [{ blockId: 'p', field: 'inputs.C', mine: null, theirs: '-0.03 m^-1' }],
  },
  {
    name: 'I deleted a block they did not touch: it goes',
    mine: [removeBlock('c')],
    theirs: [setInput('p', 'K', '0.01 m^2/yr')],
    ids: ['p', 'h', 's'],
    clashes: [],
    applied: 1,
  },
  {
    name: 'I deleted a block they edited: their block stays and the clash is listed',
    mine: [removeBlock('h')],
    theirs: [setInput('h', 'curvature', '-0.01 m^-1')],
    ids: ['p', 'h', 'c', 's'],
    inputs: { h: { diffusivity: 'params.K', curvature: '-0.01 m^-1' } },
    clashes: [{ blockId: 'h', field: 'block', mine: 'removed', theirs: 'changed' }],
  },
  {
    name: 'they deleted a block I edited: my block stays, in its place, and the clash is listed',
    mine: [setInput('c', 'expr', 'hill.dz_dt * 3')],
    theirs: [removeBlock('c')],
    ids: ['p', 'h', 'c', 's'],
    inputs: { c: { expr: 'hill.dz_dt * 3' } },
    clashes: [{ blockId: 'c', field: 'block', mine: 'changed', theirs: 'removed' }],
  },
  {
    name: 'they deleted a block I left alone: it goes',
    mine: [setInput('p', 'K', '0.01 m^2/yr')],
    theirs: [removeBlock('c')],
    ids: ['p', 'h', 's'],
    clashes: [],
  },
  {
    name: 'both deleted the same block: it goes without a clash',
    mine: [removeBlock('s')],
    theirs: [removeBlock('s')],
    ids: ['p', 'h', 'c'],
    clashes: [],
  },
  {
    name: 'my new block goes after its local neighbour; their new block is kept',
    mine: [addBlock('p', block('n', 'context', 'note', {}, { note: 'mine' }))],
    theirs: [addBlock(null, block('t', 'extra', 'formula', { expr: '2 m' }))],
    ids: ['p', 'n', 'h', 'c', 's', 't'],
    clashes: [],
  },
  {
    name: 'my addition after a block they deleted goes where that block was',
    mine: [addBlock('c', block('n', 'after_calc', 'formula', { expr: '1 m' }))],
    theirs: [removeBlock('c')],
    ids: ['p', 'h', 'n', 's'],
  },
  {
    name: 'both added a block with one name: theirs keeps it, mine gets a suffix',
    mine: [addBlock(null, block('x', 'same', 'formula', { expr: '1' }))],
    theirs: [addBlock(null, block('y', 'same', 'formula', { expr: '2' }))],
    names: ['params', 'hill', 'calc', 'stream', 'same_2', 'same'],
    ids: ['p', 'h', 'c', 's', 'x', 'y'],
  },
  {
    name: 'I renamed a block; their new reference to the old name follows the rename',
    mine: [rename('p', 'site_params')],
    theirs: [addBlock(null, block('t', 'extra', 'formula', { expr: 'params.K * 2' }))],
    names: ['site_params', 'hill', 'calc', 'stream', 'extra'],
    inputs: { h: { diffusivity: 'site_params.K', curvature: 'site_params.C' }, t: { expr: 'site_params.K * 2' } },
    clashes: [],
  },
  {
    name: 'they renamed a block; my edited reference to the old name follows the rename',
    mine: [setInput('c', 'expr', 'hill.dz_dt * 10')],
    theirs: [rename('h', 'slope_model')],
    names: ['params', 'slope_model', 'calc', 'stream'],
    inputs: { c: { expr: 'slope_model.dz_dt * 10' } },
    clashes: [],
  },
  {
    name: 'both renamed one block differently: mine kept, clash on the name',
    mine: [rename('h', 'mine_hill')],
    theirs: [rename('h', 'their_hill')],
    names: ['params', 'mine_hill', 'calc', 'stream'],
    inputs: { c: { expr: 'mine_hill.dz_dt * 2' } },
    clashes: [{ blockId: 'h', field: 'name', mine: 'mine_hill', theirs: 'their_hill' }],
  },
  {
    name: 'only I reordered: my order',
    mine: [moveTo('s', 0)],
    theirs: [setInput('p', 'K', '0.01 m^2/yr')],
    ids: ['s', 'p', 'h', 'c'],
    clashes: [],
  },
  {
    name: 'only they reordered: their order, with my edit',
    mine: [setInput('p', 'K', '0.01 m^2/yr')],
    theirs: [moveTo('c', 0)],
    ids: ['c', 'p', 'h', 's'],
    inputs: { p: { K: '0.01 m^2/yr', C: '-0.02 m^-1' } },
  },
  {
    name: 'both reordered: their order wins',
    mine: [moveTo('s', 0)],
    theirs: [moveTo('c', 0)],
    ids: ['c', 'p', 'h', 's'],
  },
  {
    name: 'the same block with keys in another order (as jsonb returns it) is not a change',
    mine: [setInput('c', 'expr', '7 m')],
    theirs: [reorderKeys('p'), reorderKeys('c')],
    inputs: { c: { expr: '7 m' }, p: { K: '0.004 m^2/yr', C: '-0.02 m^-1' } },
    clashes: [],
  },
  {
    name: 'notes and the title merge as whole values',
    mine: [setNote('c', 'checked against the field sheet'), setTitle('Crest, revised')],
    theirs: [setNote('h', 'their note')],
    note: { c: 'checked against the field sheet', h: 'their note' },
    title: 'Crest, revised',
    clashes: [],
  },
  {
    name: 'the title changed on both sides: mine kept, clash on the sheet',
    mine: [setTitle('Mine')],
    theirs: [setTitle('Theirs')],
    title: 'Mine',
    clashes: [{ blockId: '', blockName: 'sheet', field: 'title', mine: 'Mine', theirs: 'Theirs' }],
  },
  {
    name: 'nothing changed on my side: theirs exactly',
    mine: [],
    theirs: [setInput('p', 'K', '0.01 m^2/yr'), removeBlock('c')],
    ids: ['p', 'h', 's'],
    clashes: [],
    applied: 0,
  },
];

describe('mergeSheets (both 409 paths)', () => {
  it.each(cases)('should merge: $name', (c) => {
    const { document, clashes, applied } = mergeSheets(base(), edited(...c.mine), edited(...c.theirs));
    if (c.ids) expect(document.blocks.map((b) => b.id)).toEqual(c.ids);
    if (c.names) expect(document.blocks.map((b) => b.name)).toEqual(c.names);
    for (const [id, inputs] of Object.entries(c.inputs ?? {})) expect(find(document, id).inputs).toEqual(inputs);
    for (const [id, note] of Object.entries(c.note ?? {})) expect(find(document, id).note).toBe(note);
    if (c.title) expect(document.title).toBe(c.title);
    if (c.clashes) {
      expect(clashes).toHaveLength(c.clashes.length);
      c.clashes.forEach((expected, i) => expect(clashes[i]).toMatchObject(expected));
    }
    if (c.applied !== undefined) expect(applied).toBe(c.applied);
    expect(document.format).toBe('denudata-sheet@1');
  });

  it('should give theirs unchanged when mine equals base, and mine when theirs equals base', () => {
    const mine = edited(setInput('p', 'K', '1 m^2/yr'), removeBlock('c'), moveTo('s', 0));
    const theirs = edited(setInput('h', 'curvature', '-1 m^-1'), addBlock('p', block('t', 'extra', 'formula', { expr: '1 m' })));
    expect(sameJson(mergeSheets(base(), base(), theirs).document, theirs)).toBe(true);
    expect(sameJson(mergeSheets(base(), mine, base()).document, mine)).toBe(true);
  });

  it('should not mutate its arguments', () => {
    const b = base();
    const m = edited(setInput('s', 'velocity', '3 mm/yr'));
    const t = edited(setInput('s', 'length', '5 km'));
    const before = JSON.stringify([b, m, t]);
    mergeSheets(b, m, t);
    expect(JSON.stringify([b, m, t])).toBe(before);
  });
});

describe('sameJson', () => {
  it('should ignore key order and treat undefined as null, but see every value', () => {
    expect(sameJson({ a: 1, b: { c: [1, 2] } }, { b: { c: [1, 2] }, a: 1 })).toBe(true);
    expect(sameJson(undefined, null)).toBe(true);
    expect(sameJson({ a: 1 }, { a: 2 })).toBe(false);
    expect(sameJson([1, 2], [2, 1])).toBe(false);
  });
});
