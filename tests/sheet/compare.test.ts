import { describe, expect, it } from 'vitest';
import { compareSheets, relativeChange, type CompareSide } from '@/lib/sheet/compare';

const out = (value: number, unit: string, si: number, siUnit: string) => ({ value, unit, si, siUnit });

/**
 * One state of the crest sheet: a quantities block (K, C), a hillslope-diffusion block, a note and a
 * last formula block. K in m²/yr with its SI value in m²/s; the lowering rate in mm/yr with its SI value in m/s.
 */
function crestSide(state: {
  site: string;
  K: { text: string; value: number; si: number };
  hillName: string;
  lowering: { value: number; si: number };
  last: { id: string; name: string; expr: string; value: number };
}): CompareSide {
  const { K, lowering, last } = state;
  return {
    document: {
      title: 'Crest A',
      site: { name: state.site },
      blocks: [
        { id: 'p', name: 'params', type: 'quantities', inputs: { K: K.text, C: '-0.02 m^-1' } },
        { id: 'h', name: state.hillName, type: 'hillslope_diffusion', inputs: { diffusivity: 'params.K', curvature: 'params.C' } },
        { id: 'n', name: 'context', type: 'note', inputs: {}, note: 'Old note' },
        { id: last.id, name: last.name, type: 'formula', inputs: { expr: last.expr } },
      ],
    },
    results: {
      blocks: {
        params: { status: 'ok', outputs: { K: out(K.value, 'm^2 / yr', K.si, 'm^2 / s'), C: out(-0.02, 'm^-1', -0.02, 'm^-1') } },
        [state.hillName]: {
          status: 'ok',
          outputs: { dz_dt: out(-lowering.value, 'mm / yr', -lowering.si, 'm / s'), lowering_rate: out(lowering.value, 'mm / yr', lowering.si, 'm / s') },
        },
        [last.name]: { status: 'ok', outputs: { value: out(last.value, 'm', last.value, 'm') } },
      },
    },
  };
}

const before = crestSide({
  site: 'North ridge',
  K: { text: '0.004 m^2/yr', value: 0.004, si: 1.2675e-10 },
  hillName: 'hill',
  lowering: { value: 0.08, si: 2.535e-12 },
  last: { id: 'gone', name: 'old_formula', expr: '2 m', value: 2 },
});

const after = crestSide({
  site: 'South ridge',
  K: { text: '0.006 m^2/yr', value: 0.006, si: 1.90125e-10 },
  hillName: 'hill_lowering',
  lowering: { value: 0.12, si: 3.8025e-12 },
  last: { id: 'new', name: 'scarp', expr: '3 m', value: 3 },
});

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
    const [first, second, third, fourth] = before.document.blocks;
    const b = [first!, second!, third!, fourth!] as const;
    const moved: CompareSide = {
      ...before,
      document: { ...before.document, blocks: [b[1], b[0], { ...b[2], note: 'New note' }, b[3]] },
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
