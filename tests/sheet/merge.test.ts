import { describe, expect, it } from 'vitest';
import { mergeEdits } from '@/lib/sheet/merge';

type Block = { id: string; name: string; type: string; inputs: Record<string, string>; note?: string };
type Doc = { format: string; title: string; blocks: Block[] };

const base: Doc = {
  format: 'denudata-sheet@1',
  title: 'Crest',
  blocks: [
    { id: 'p', name: 'params', type: 'quantities', inputs: { K: '0.004 m^2/yr', C: '-0.02 m^-1' } },
    { id: 'h', name: 'hill', type: 'hillslope_diffusion', inputs: { diffusivity: 'params.K', curvature: 'params.C' } },
  ],
};

const [params, hill] = base.blocks as [Block, Block];

describe('mergeEdits (re-applying edits after a 409)', () => {
  it('should keep both people’s edits when they touched different inputs', () => {
    const mine: Doc = { ...base, blocks: [{ ...params, inputs: { ...params.inputs, K: '0.006 m^2/yr' } }, hill] };
    const latest: Doc = { ...base, blocks: [{ ...params, inputs: { ...params.inputs, C: '-0.03 m^-1' } }, hill] };
    const merged = mergeEdits(base, mine, latest);
    expect(merged.clashes).toEqual([]);
    expect(merged.document.blocks[0]?.inputs).toEqual({ K: '0.006 m^2/yr', C: '-0.03 m^-1' });
    expect(merged.applied).toBe(1);
  });

  it('should keep mine where both changed the same input, and list the clash', () => {
    const mine: Doc = { ...base, blocks: [{ ...params, inputs: { ...params.inputs, K: '0.006 m^2/yr' } }, hill] };
    const latest: Doc = { ...base, blocks: [{ ...params, inputs: { ...params.inputs, K: '0.002 m^2/yr' } }, hill] };
    const merged = mergeEdits(base, mine, latest);
    expect(merged.document.blocks[0]?.inputs.K).toBe('0.006 m^2/yr');
    expect(merged.clashes).toEqual([{ blockId: 'p', blockName: 'params', field: 'inputs.K', mine: '0.006 m^2/yr', theirs: '0.002 m^2/yr' }]);
  });

  it('should add my new block after its neighbour and keep their new block', () => {
    const added = { id: 'n', name: 'context', type: 'note', inputs: {}, note: 'mine' };
    const theirsAdded = { id: 't', name: 'extra', type: 'formula', inputs: { expr: '2 m' } };
    const mine: Doc = { ...base, blocks: [params, added, hill] };
    const latest: Doc = { ...base, blocks: [...base.blocks, theirsAdded] };
    expect(mergeEdits(base, mine, latest).document.blocks.map((b) => b.id)).toEqual(['p', 'n', 'h', 't']);
  });

  it('should drop a block I removed unless they changed it', () => {
    const mine: Doc = { ...base, blocks: [params] };
    expect(mergeEdits(base, mine, base).document.blocks.map((b) => b.id)).toEqual(['p']);
    const latest: Doc = { ...base, blocks: [params, { ...hill, inputs: { ...hill.inputs, curvature: '-0.01 m^-1' } }] };
    const merged = mergeEdits(base, mine, latest);
    expect(merged.document.blocks.map((b) => b.id)).toEqual(['p', 'h']);
    expect(merged.clashes[0]).toMatchObject({ blockId: 'h', field: 'block' });
  });
});
