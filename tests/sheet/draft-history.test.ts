import { describe, expect, it } from 'vitest';
import { HISTORY_LIMIT, coalesceHistory, pushHistory, travelHistory, type DraftHistory } from '@/lib/sheet/draft-history';

// The sheet draft's undo/redo history (lib/sheet/draft-history.ts), over plain strings standing for documents.
describe('draft history', () => {
  const empty: DraftHistory<string> = { past: [], future: [] };

  it('should undo and redo edits in order, and a new edit should drop the redo steps', () => {
    let h = pushHistory(empty, 'a'); // a -> b
    h = pushHistory(h, 'b'); // b -> c
    const undo1 = travelHistory(h, 'undo', 'c');
    expect(undo1?.target).toBe('b');
    expect(undo1?.history).toEqual({ past: ['a'], future: ['c'] });
    const undo2 = travelHistory(undo1!.history, 'undo', 'b');
    expect(undo2?.target).toBe('a');
    expect(undo2?.history).toEqual({ past: [], future: ['c', 'b'] });
    expect(travelHistory(undo2!.history, 'undo', 'a')).toBeNull();
    const redo = travelHistory(undo2!.history, 'redo', 'a');
    expect(redo?.target).toBe('b');
    expect(redo?.history).toEqual({ past: ['a'], future: ['c'] });
    expect(pushHistory(redo!.history, 'b')).toEqual({ past: ['a', 'b'], future: [] });
  });

  it('should keep a coalesced edit in the same undo step but still drop redo steps', () => {
    const h: DraftHistory<string> = { past: ['a'], future: ['z'] };
    expect(coalesceHistory(h)).toEqual({ past: ['a'], future: [] });
    expect(travelHistory(empty, 'redo', 'a')).toBeNull();
  });

  it(`should keep at most ${HISTORY_LIMIT} undo steps, dropping the oldest`, () => {
    let h = empty;
    for (let i = 0; i < HISTORY_LIMIT + 5; i++) h = pushHistory(h, `d${i}`);
    expect(h.past).toHaveLength(HISTORY_LIMIT);
    expect(h.past[0]).toBe('d5');
    expect(h.past.at(-1)).toBe(`d${HISTORY_LIMIT + 4}`);
  });
});
