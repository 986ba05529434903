import { describe, expect, it } from 'vitest';
import { compareSheets, relativeChange, type CompareSide } from '@/lib/sheets/compare';

const out = (value: number, unit: string, si: number, siUnit: string) => ({ value, unit, si, siUnit });

const before: CompareSide = {
  document: {
    title: 'Crest A',
    site: { name: 'North ridge' },
    blocks: [
      { id: 'p', name: 'params', type: 'quantities', inputs: { K: '0.004 m^2/yr', C: '-0.02 m^-1' } },
      { id: 'h', name: 'hill', type: 'hillslope_diffusion', inputs: { diffusivity: 'params.K', curvature: 'params.C' } },
      { id: 'n', name: 'context', type: 'note', inputs: {}, note: 'Old note' },
      { id: 'gone', name: 'old_formula', type: 'formula', inputs: { expr: '2 m' } },
    ],
  },
  results: {
    blocks: {
      params: { status: 'ok', outputs: { K: out(0.004, 'm^2 / yr', 1.2675e-10, 'm^2 / s'), C: out(-0.02, 'm^-1', -0.02, 'm^-1') } },
      hill: { status: 'ok', outputs: { dz_dt: out(-0.08, 'mm / yr', -2.535e-12, 'm / s'), lowering_rate: out(0.08, 'mm / yr', 2.535e-12, 'm / s') } },
      old_formula: { status: 'ok', outputs: { value: out(2, 'm', 2, 'm') } },
    },
  },
};

const after: CompareSide = {
  document: {
    title: 'Crest A',
    site: { name: 'South ridge' },
    blocks: [
      { id: 'p', name: 'params', type: 'quantities', inputs: { K: '0.006 m^2/yr', C: '-0.02 m^-1' } },
      { id: 'h', name: 'hill_lowering', type: 'hillslope_diffusion', inputs: { diffusivity: 'params.K', curvature: 'params.C' } },
      { id: 'n', name: 'context', type: 'note', inputs: {}, note: 'Old note' },
      { id: 'new', name: 'scarp', type: 'formula', inputs: { expr: '3 m' } },
    ],
  },
  results: {
    blocks: {
      params: { status: 'ok', outputs: { K: out(0.006, 'm^2 / yr', 1.90125e-10, 'm^2 / s'), C: out(-0.02, 'm^-1', -0.02, 'm^-1') } },
      hill_lowering: { status: 'ok', outputs: { dz_dt: out(-0.12, 'mm / yr', -3.8025e-12, 'm / s'), lowering_rate: out(0.12, 'mm / yr', 3.8025e-12, 'm / s') } },
      scarp: { status: 'ok', outputs: { value: out(3, 'm', 3, 'm') } },
    },
  },
};

describe('compareSheets', () => {
  it('should list blocks added and removed by id', () => {
    const c = compareSheets(before, after);
    expect(c.added).toEqual([{ id: 'new', name: 'scarp', type: 'formula', status: 'ok' }]);
    expect(c.removed).toEqual([{ id: 'gone', name: 'old_formula', type: 'formula', status: 'ok' }]);
    expect(c.siteBefore).toBe('North ridge');
    expect(c.siteAfter).toBe('South ridge');
  });

  it('should show changed inputs before and after, and only the inputs that changed', () => {
    const params = compareSheets(before, after).changed.find((b) => b.id === 'p')!;
    expect(params.inputs).toEqual([{ input: 'K', before: '0.004 m^2/yr', after: '0.006 m^2/yr' }]);
    expect(params.outputs.find((o) => o.output === 'K')?.relativeChange).toBeCloseTo(0.5, 12);
    expect(params.outputs.find((o) => o.output === 'C')?.changed).toBe(false);
  });

  it('should match a renamed block by id and give each output with its relative change (0.08 → 0.12 mm/yr is +50 %)', () => {
    const hill = compareSheets(before, after).changed.find((b) => b.id === 'h')!;
    expect(hill.nameBefore).toBe('hill');
    expect(hill.nameAfter).toBe('hill_lowering');
    expect(hill.inputs).toEqual([]);
    const dz = hill.outputs.find((o) => o.output === 'dz_dt')!;
    expect(dz.before?.value).toBe(-0.08);
    expect(dz.after?.value).toBe(-0.12);
    // (−0.12 − (−0.08)) / |−0.08| = −0.5: the rate became 50 % more negative.
    expect(dz.relativeChange).toBeCloseTo(-0.5, 12);
  });

  it('should count untouched blocks as unchanged, and two identical states as no change at all', () => {
    expect(compareSheets(before, after).unchanged).toBe(1);
    const same = compareSheets(before, before);
    expect(same).toMatchObject({ added: [], removed: [], changed: [], unchanged: 4 });
  });

  it('should flag a changed note or a block that moved', () => {
    const moved: CompareSide = {
      ...before,
      document: { ...before.document, blocks: [before.document.blocks[1], before.document.blocks[0], { ...before.document.blocks[2], note: 'New note' }, before.document.blocks[3]] },
    };
    const c = compareSheets(before, moved);
    expect(c.changed.find((b) => b.id === 'n')?.noteChanged).toBe(true);
    expect(c.changed.find((b) => b.id === 'h')?.moved).toBe(true);
  });

  it('should compare documents without results (a draft), leaving outputs empty', () => {
    const c = compareSheets({ document: before.document }, { document: after.document });
    expect(c.changed.find((b) => b.id === 'p')?.outputs).toEqual([]);
    expect(c.changed.find((b) => b.id === 'p')?.inputs).toHaveLength(1);
  });
});

describe('relativeChange', () => {
  it('should be null for text, zero or missing values', () => {
    expect(relativeChange(0, 1)).toBeNull();
    expect(relativeChange('erosion', 'deposition')).toBeNull();
    expect(relativeChange(undefined, 2)).toBeNull();
    expect(relativeChange(2, 3)).toBeCloseTo(0.5, 15);
    expect(relativeChange(-2, -1)).toBeCloseTo(0.5, 15);
  });
});
