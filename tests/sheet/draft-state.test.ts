import { describe, expect, it } from 'vitest';
import { HISTORY_LIMIT } from '@/lib/sheet/draft-history';
import { COALESCE_MS, draftReducer, initialDraftState, type DraftAction, type DraftState } from '@/lib/sheet/draft-state';
import type { SheetBlock, SheetDocument, SheetResults } from '@/lib/sheet/types';

// The sheet draft's reducer (lib/sheet/draft-state.ts) over a table of cases: each case starts from a state,
// sends actions and checks the state after them. The expected behaviour is the page's (undo/redo stacks as in
// any editor, three-way merge rules as in tests/sheet/merge.test.ts: common practice for version control).

const block = (id: string, name: string, type: string, inputs: Record<string, string>): SheetBlock => ({ id, name, type, inputs });

/** Three blocks: `hill` reads `params`, `stream` reads nothing. */
const base: SheetDocument = {
  format: 'denudata-sheet@1',
  title: 'Crest',
  blocks: [
    block('p', 'params', 'quantities', { K: '0.004 m^2/yr', C: '-0.02 m^-1' }),
    block('h', 'hill', 'hillslope_diffusion', { diffusivity: 'params.K', curvature: 'params.C' }),
    block('s', 'stream', 'stream_power', { K: '1e-5 1/yr', area: '1 km^2', slope: '0.1', velocity: '1 mm/yr', length: '2 km' }),
  ],
};

/** `doc` with one input of one block changed (a new document; `doc` is left alone). */
function withInput(doc: SheetDocument, id: string, key: string, value: string): SheetDocument {
  return { ...doc, blocks: doc.blocks.map((b) => (b.id === id ? { ...b, inputs: { ...b.inputs, [key]: value } } : b)) };
}

const results = (label: string): SheetResults => ({ format: 'denudata-results@1', sheetHash: label, engine: 'test', blocks: {} });

const start = (editable = true): DraftState => initialDraftState({ document: base, version: 3, editable });
/** Loaded and evaluated: nothing stale, the first results shown. */
const evaluated = (): DraftState => run(start(), { type: 'results', results: results('r0'), edit: 0, draftVersion: 3 });
const run = (state: DraftState, ...actions: DraftAction[]) => actions.reduce(draftReducer, state);
const edit = (document: SheetDocument, at = 0, coalesce?: string): DraftAction => ({ type: 'edit', document, at, coalesce });
const inputOf = (state: DraftState, id: string, key: string) => state.doc.blocks.find((b) => b.id === id)?.inputs[key];

const v1 = withInput(base, 's', 'velocity', '2 mm/yr');
const v2 = withInput(v1, 's', 'velocity', '3 mm/yr');
const k1 = withInput(base, 'p', 'K', '0.005 m^2/yr');

describe('draft reducer: edits, undo and redo', () => {
  const cases: { name: string; from: () => DraftState; actions: DraftAction[]; expect: (s: DraftState) => void }[] = [
    {
      name: 'an edit shows the new document, pushes the old one on the undo stack and waits for a save',
      from: evaluated,
      actions: [edit(v1)],
      expect: (s) => {
        expect(s.doc).toBe(v1);
        expect(s.history.past).toEqual([base]);
        expect(s.history.future).toEqual([]);
        expect(s.edit).toBe(1);
        expect(s.saveState).toEqual({ kind: 'pending' });
        expect(s.base).toBe(base);
      },
    },
    {
      name: 'an edit marks the changed block and only what depends on it stale',
      from: evaluated,
      actions: [edit(k1)],
      expect: (s) => expect([...s.stale].sort()).toEqual(['h', 'p']),
    },
    {
      name: 'an edit of a block nothing reads marks only that block stale',
      from: evaluated,
      actions: [edit(v1)],
      expect: (s) => expect([...s.stale]).toEqual(['s']),
    },
    {
      name: 'an edit that changes nothing (same JSON, other key order) is no edit',
      from: evaluated,
      actions: [edit(JSON.parse(JSON.stringify({ title: base.title, format: base.format, blocks: base.blocks })) as SheetDocument)],
      expect: (s) => {
        expect(s.edit).toBe(0);
        expect(s.history.past).toEqual([]);
        expect(s.saveState).toEqual({ kind: 'saved' });
      },
    },
    {
      name: 'a reader cannot edit, undo or redo',
      from: () => start(false),
      actions: [edit(v1), { type: 'undo' }, { type: 'redo' }],
      expect: (s) => {
        expect(s.doc).toBe(base);
        expect(s.edit).toBe(0);
        expect(s.saveState).toEqual({ kind: 'read-only' });
      },
    },
    {
      name: 'undo goes back one step and can be redone',
      from: evaluated,
      actions: [edit(v1), edit(v2), { type: 'undo' }],
      expect: (s) => {
        expect(inputOf(s, 's', 'velocity')).toBe('2 mm/yr');
        expect(s.history.past).toEqual([base]);
        expect(s.history.future).toEqual([v2]);
        expect(s.edit).toBe(3);
      },
    },
    {
      name: 'undo twice and redo once lands on the middle document',
      from: evaluated,
      actions: [edit(v1), edit(v2), { type: 'undo' }, { type: 'undo' }, { type: 'redo' }],
      expect: (s) => {
        expect(s.doc).toBe(v1);
        expect(s.history.past).toEqual([base]);
        expect(s.history.future).toEqual([v2]);
      },
    },
    {
      name: 'a new edit after an undo clears the redo stack',
      from: evaluated,
      actions: [edit(v1), edit(v2), { type: 'undo' }, edit(k1)],
      expect: (s) => {
        expect(s.doc).toBe(k1);
        expect(s.history.past).toEqual([base, v1]);
        expect(s.history.future).toEqual([]);
        const redo = draftReducer(s, { type: 'redo' });
        expect(redo).toBe(s);
      },
    },
    {
      name: 'undo with nothing to undo changes nothing',
      from: evaluated,
      actions: [{ type: 'undo' }],
      expect: (s) => expect(s).toEqual(evaluated()),
    },
    {
      name: `edits with one coalesce key within ${COALESCE_MS} ms form one undo step`,
      from: evaluated,
      actions: [edit(v1, 1000, 's.velocity'), edit(v2, 1000 + COALESCE_MS - 1, 's.velocity'), { type: 'undo' }],
      expect: (s) => {
        expect(s.doc).toBe(base);
        expect(s.history.past).toEqual([]);
        expect(s.history.future).toEqual([v2]);
      },
    },
    {
      name: 'the same key after the pause, or another key, starts a new undo step',
      from: evaluated,
      actions: [edit(v1, 1000, 's.velocity'), edit(v2, 1000 + COALESCE_MS, 's.velocity'), edit(withInput(v2, 'p', 'K', '1 m^2/yr'), 1000 + COALESCE_MS + 1, 'p.K')],
      expect: (s) => expect(s.history.past).toEqual([base, v1, v2]),
    },
    {
      name: `the undo history keeps at most ${HISTORY_LIMIT} steps, dropping the oldest`,
      from: evaluated,
      actions: Array.from({ length: HISTORY_LIMIT + 3 }, (_, i) => edit(withInput(base, 's', 'length', `${i + 1} km`))),
      expect: (s) => {
        expect(s.history.past).toHaveLength(HISTORY_LIMIT);
        expect(s.history.past[0]?.blocks[2]?.inputs.length).toBe('3 km');
        expect(inputOf(s, 's', 'length')).toBe(`${HISTORY_LIMIT + 3} km`);
      },
    },
  ];
  for (const c of cases) it(`should: ${c.name}`, () => c.expect(run(c.from(), ...c.actions)));
});

describe('draft reducer: saving and results', () => {
  const cases: { name: string; from: () => DraftState; actions: DraftAction[]; expect: (s: DraftState) => void }[] = [
    {
      name: 'a save of the current edit makes it the base at the new version and reads saved',
      from: () => run(evaluated(), edit(v1), { type: 'save-started' }),
      actions: [{ type: 'saved', version: 4, document: v1, edit: 1 }],
      expect: (s) => {
        expect(s.version).toBe(4);
        expect(s.base).toBe(v1);
        expect(s.saveState).toEqual({ kind: 'saved' });
      },
    },
    {
      name: 'a save of an older edit moves the base but the later edit still waits',
      from: () => run(evaluated(), edit(v1), { type: 'save-started' }, edit(v2)),
      actions: [{ type: 'saved', version: 4, document: v1, edit: 1 }],
      expect: (s) => {
        expect(s.base).toBe(v1);
        expect(s.doc).toBe(v2);
        expect(s.saveState).toEqual({ kind: 'pending' });
      },
    },
    {
      name: 'refusals and retries are shown with their message',
      from: evaluated,
      actions: [{ type: 'save-retrying', inSeconds: 4, message: 'offline' }],
      expect: (s) => expect(s.saveState).toEqual({ kind: 'retrying', inSeconds: 4, message: 'offline' }),
    },
    {
      name: 'results of the current edit and version clear the stale marks',
      from: () => run(evaluated(), edit(v1), { type: 'saved', version: 4, document: v1, edit: 1 }),
      actions: [{ type: 'results', results: results('r1'), edit: 1, draftVersion: 4 }],
      expect: (s) => {
        expect(s.results?.sheetHash).toBe('r1');
        expect(s.shownEdit).toBe(1);
        expect(s.stale.size).toBe(0);
      },
    },
    {
      name: 'results of an older edit are shown only if nothing newer is, and leave the stale marks',
      from: () => run(evaluated(), edit(v1), edit(v2), { type: 'live-results', results: results('live2'), edit: 2 }),
      actions: [{ type: 'results', results: results('r1'), edit: 1, draftVersion: 4 }],
      expect: (s) => {
        expect(s.results?.sheetHash).toBe('live2');
        expect(s.shownEdit).toBe(2);
      },
    },
    {
      name: 'live results of a superseded edit are dropped',
      from: () => run(evaluated(), edit(v1), edit(v2)),
      actions: [{ type: 'live-results', results: results('live1'), edit: 1 }],
      expect: (s) => {
        expect(s.results?.sheetHash).toBe('r0');
        expect([...s.stale]).toEqual(['s']);
      },
    },
    {
      name: 'results of a long run replace the shown ones; stale marks clear only for the current edit',
      from: () => run(evaluated(), edit(v1)),
      actions: [{ type: 'run-results', results: results('run'), edit: 0, draftVersion: 3 }],
      expect: (s) => {
        expect(s.results?.sheetHash).toBe('run');
        expect([...s.stale]).toEqual(['s']);
      },
    },
  ];
  for (const c of cases) it(`should: ${c.name}`, () => c.expect(run(c.from(), ...c.actions)));
});

describe('draft reducer: a draft saved meanwhile (409), restore, adopt the server version', () => {
  // I change the velocity of `stream`; a colleague saved version 4 with its length changed (and maybe velocity too).
  const theirs = withInput(base, 's', 'length', '5 km');
  const theirsClashing = withInput(withInput(base, 's', 'length', '5 km'), 's', 'velocity', '9 mm/yr');
  const inConflict = (server: SheetDocument) =>
    run(evaluated(), edit(v1), { type: 'save-started' }, { type: 'save-conflict', serverVersion: 4, serverDocument: server });

  const cases: { name: string; from: () => DraftState; actions: DraftAction[]; expect: (s: DraftState) => void }[] = [
    {
      name: 'a 409 shows the conflict and stops saving; further edits keep the conflict state',
      from: () => inConflict(theirs),
      actions: [edit(v2)],
      expect: (s) => {
        expect(s.conflict).toEqual({ serverVersion: 4, serverDocument: theirs, restored: false });
        expect(s.saveState).toEqual({ kind: 'conflict' });
        expect(s.version).toBe(3);
      },
    },
    {
      name: 're-applying without a clash keeps both changes (input by input), on the server version',
      from: () => inConflict(theirs),
      actions: [{ type: 'reapply' }],
      expect: (s) => {
        expect(inputOf(s, 's', 'velocity')).toBe('2 mm/yr');
        expect(inputOf(s, 's', 'length')).toBe('5 km');
        expect(s.base).toBe(theirs);
        expect(s.version).toBe(4);
        expect(s.conflict).toBeNull();
        expect(s.saveState).toEqual({ kind: 'pending' });
        expect(s.notice).toBe('Your edits were re-applied on version 4.');
        expect([...s.stale].sort()).toEqual(['h', 'p', 's']);
        expect(s.history.past.at(-1)).toBe(v1);
        expect(s.edit).toBe(2);
      },
    },
    {
      name: 're-applying with a clash keeps mine and names the clash',
      from: () => inConflict(theirsClashing),
      actions: [{ type: 'reapply' }],
      expect: (s) => {
        expect(inputOf(s, 's', 'velocity')).toBe('2 mm/yr');
        expect(inputOf(s, 's', 'length')).toBe('5 km');
        expect(s.notice).toBe('Your edits were re-applied on version 4. 1 change(s) made on both sides kept your version: stream inputs.velocity.');
      },
    },
    {
      name: 'undo after re-applying brings back my document before the merge',
      from: () => inConflict(theirs),
      actions: [{ type: 'reapply' }, { type: 'undo' }],
      expect: (s) => {
        expect(s.doc).toBe(v1);
        expect(s.base).toBe(theirs);
      },
    },
    {
      name: "keeping theirs adopts the server's version, saved, with my edits one undo away",
      from: () => inConflict(theirsClashing),
      actions: [{ type: 'keep-theirs' }],
      expect: (s) => {
        expect(s.doc).toBe(theirsClashing);
        expect(s.base).toBe(theirsClashing);
        expect(s.version).toBe(4);
        expect(s.conflict).toBeNull();
        expect(s.saveState).toEqual({ kind: 'saved' });
        expect(s.history.past.at(-1)).toBe(v1);
        expect([...s.stale].sort()).toEqual(['h', 'p', 's']);
        expect(s.notice).toMatch(/^Showing version 4 from the server; your unsaved edits were dropped/);
      },
    },
    {
      name: 're-apply and keep-theirs without a conflict change nothing',
      from: evaluated,
      actions: [{ type: 'reapply' }, { type: 'keep-theirs' }],
      expect: (s) => expect(s).toEqual(evaluated()),
    },
    {
      name: 'unsaved edits kept on the same version are restored as a new working document',
      from: evaluated,
      actions: [{ type: 'restore', document: v1 }],
      expect: (s) => {
        expect(s.doc).toBe(v1);
        expect(s.base).toBe(base);
        expect(s.edit).toBe(1);
        expect(s.notice).toMatch(/^Unsaved edits from your last visit were restored/);
      },
    },
    {
      name: 'unsaved edits kept on an older version become a conflict with the loaded version, then merge',
      from: () => initialDraftState({ document: theirs, version: 4, editable: true }),
      actions: [{ type: 'restore-conflict', baseDocument: base, document: v1 }, { type: 'reapply' }],
      expect: (s) => {
        expect(inputOf(s, 's', 'velocity')).toBe('2 mm/yr');
        expect(inputOf(s, 's', 'length')).toBe('5 km');
        expect(s.version).toBe(4);
        expect(s.base).toBe(theirs);
      },
    },
  ];
  for (const c of cases) it(`should: ${c.name}`, () => c.expect(run(c.from(), ...c.actions)));

  it('should leave the state it was given untouched (pure)', () => {
    const before = inConflict(theirs);
    const copy = JSON.parse(JSON.stringify({ ...before, stale: [...before.stale] }));
    run(before, { type: 'reapply' }, edit(v2), { type: 'undo' });
    expect({ ...before, stale: [...before.stale] }).toEqual(copy);
  });
});
