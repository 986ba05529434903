import { describe, expect, it } from 'vitest';
import {
  changedBlockIds,
  dependentsOf,
  duplicateBlock,
  moveBlock,
  precheckBlockName,
  renameBlock,
  setDisplayUnit,
  suggestBlockName,
} from '@/lib/sheet/document-edits';
import type { SheetDocument } from '@/lib/sheet/types';

const doc = (): SheetDocument => ({
  format: 'denudata-sheet@1',
  title: 'Test',
  blocks: [
    { id: 'a', name: 'params', type: 'quantities', inputs: { K: '0.004 m^2/yr', C: '-0.008 1/m' } },
    { id: 'b', name: 'hill', type: 'hillslope_diffusion', inputs: { diffusivity: 'params.K', curvature: 'params.C' } },
    { id: 'c', name: 'calc_1', type: 'formula', inputs: { expr: 'hill.dz_dt * 2' } },
    { id: 'd', name: 'other', type: 'formula', inputs: { expr: '3 m' } },
  ],
});

describe('renameBlock', () => {
  it('should rename the block and rewrite references to it in other blocks', () => {
    const next = renameBlock(doc(), 'a', 'site_params');
    expect(next.blocks[0]!.name).toBe('site_params');
    expect(next.blocks[1]!.inputs).toEqual({ diffusivity: 'site_params.K', curvature: 'site_params.C' });
    expect(next.blocks[3]).toBe(doc().blocks[3] === undefined ? undefined : next.blocks[3]);
  });
});

describe('precheckBlockName', () => {
  it('should refuse a name against the contract pattern and a duplicate, and accept a fresh one', () => {
    expect(precheckBlockName(doc(), 'Hill')).toMatch(/lower-case/);
    expect(precheckBlockName(doc(), 'hill')).toMatch(/already named/);
    expect(precheckBlockName(doc(), 'hill', 'b')).toBeNull();
    expect(precheckBlockName(doc(), 'crest_2')).toBeNull();
  });
});

describe('suggestBlockName and duplicateBlock', () => {
  it('should number new names past those taken', () => {
    expect(suggestBlockName(doc(), 'formula')).toBe('calc_2');
    expect(suggestBlockName(doc(), 'peclet_number')).toBe('peclet_1');
  });

  it('should place a copy after the original with a fresh id and name', () => {
    const { doc: next, copy } = duplicateBlock(doc(), 'b');
    expect(next.blocks.map((b) => b.name)).toEqual(['params', 'hill', 'hill_copy', 'calc_1', 'other']);
    expect(copy!.id).not.toBe('b');
    expect(copy!.inputs).toEqual(doc().blocks[1]!.inputs);
  });
});

describe('moveBlock and setDisplayUnit', () => {
  it('should move a block and clamp the index', () => {
    expect(moveBlock(doc(), 'a', 2).blocks.map((b) => b.id)).toEqual(['b', 'c', 'a', 'd']);
    expect(moveBlock(doc(), 'd', 99).blocks.map((b) => b.id)).toEqual(['a', 'b', 'c', 'd']);
  });

  it('should set and clear a display unit', () => {
    const set = setDisplayUnit(doc(), 'b', 'dz_dt', 'm/kyr');
    expect(set.blocks[1]!.display).toEqual({ dz_dt: 'm/kyr' });
    expect(setDisplayUnit(set, 'b', 'dz_dt', '').blocks[1]!.display).toBeUndefined();
  });
});

describe('dependentsOf and changedBlockIds', () => {
  it('should find transitive dependents of a changed block', () => {
    expect([...dependentsOf(doc(), ['a'])].sort()).toEqual(['a', 'b', 'c']);
    expect([...dependentsOf(doc(), ['d'])]).toEqual(['d']);
  });

  it('should list added, removed and changed blocks', () => {
    const after = doc();
    after.blocks[3]!.inputs.expr = '4 m';
    after.blocks.splice(0, 1);
    expect(changedBlockIds(doc(), after).sort()).toEqual(['a', 'd']);
  });
});

import { renameParameter } from '@/lib/sheet/document-edits';
describe('renameParameter', () => {
  it('should rename a parameter in place and rewrite references to it', () => {
    const { doc: next, error } = renameParameter(doc(), 'a', 'K', 'D');
    expect(error).toBeNull();
    expect(Object.keys(next.blocks[0]!.inputs)).toEqual(['D', 'C']);
    expect(next.blocks[1]!.inputs.diffusivity).toBe('params.D');
  });

  it('should refuse a taken or malformed parameter name', () => {
    expect(renameParameter(doc(), 'a', 'K', 'C').error).toMatch(/already has/);
    expect(renameParameter(doc(), 'a', 'K', '2x').error).toMatch(/starts with a letter/);
  });
});
